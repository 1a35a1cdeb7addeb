"""Runs and sweeps of lobe's HDF5 layout (docs/hdf5_layout.md), read with h5py."""

import h5py
import numpy as np

from lobe.labelled import Labelled

#: The layout major this reader understands; a newer minor only adds datasets.
FORMAT_MAJOR = 1


class FormatError(ValueError):
    """The file is not one of lobe's, or is in a layout this reader does not know."""


def _text(value):
    return value.decode("utf-8") if isinstance(value, bytes) else str(value)


def _check_format(file):
    version = file.attrs.get("format_version")
    if version is None:
        raise FormatError(f"{file.filename}: no format_version; not a lobe result, or one from "
                          "before the versioned layout (run the model again)")
    try:
        major = int(_text(version).split(".")[0])
    except ValueError:
        raise FormatError(f"{file.filename}: format_version '{_text(version)}' is not MAJOR.MINOR") from None
    if major > FORMAT_MAJOR:
        raise FormatError(f"{file.filename}: lobe result format {_text(version)} is newer than this "
                          f"reader ({FORMAT_MAJOR}.x); use a newer lobe package")
    return _text(file.attrs.get("format", ""))


def _positions(scale):
    data = scale.asstr()[()] if h5py.check_string_dtype(scale.dtype) else scale[()]
    return np.asarray(data)


def _labelled(dataset):
    """A dataset with the axes attached to it (HDF5 dimension scales)."""
    dims, coords = [], {}
    for d, dim in enumerate(dataset.dims):
        name = dim.label or f"dim_{d}"
        dims.append(name)
        if len(dim) > 0:
            coords[name] = _positions(dim[0])
    if h5py.check_string_dtype(dataset.dtype):
        values = np.asarray(dataset.asstr()[()])
    else:
        values = dataset[()]
    units = dataset.attrs.get("units", dataset.attrs.get("meaning", ""))
    return Labelled(np.asarray(values), tuple(dims), coords, _text(units), dataset.name)


class _Group:
    """Arrays of one group of a file: a run's root, a sweep's case or its stacked arrays."""

    def __init__(self, file, root):
        self._file = file
        self._root = root.rstrip("/")

    def __getitem__(self, path):
        full = f"{self._root}/{path.strip('/')}"
        if full not in self._file:
            raise KeyError(f"{self._file.filename} has no '{full}'")
        return _labelled(self._file[full])

    def close(self):
        """Closes the file (also on leaving a `with` block)."""
        self._file.close()

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.close()

    def __contains__(self, path):
        return f"{self._root}/{path.strip('/')}" in self._file

    def paths(self):
        """Every array's path, as __getitem__ takes it."""
        found = []
        start = self._file[self._root] if self._root else self._file

        def visit(name, item):
            if isinstance(item, h5py.Dataset):
                found.append(name)

        start.visititems(visit)
        return sorted(found)


class Run(_Group):
    """One run (lobe run): the arrays of its file, labelled."""

    def __init__(self, file, root="", kind="lobe-antenna-result"):
        super().__init__(file, root)
        self.kind = kind

    @property
    def frequency_hz(self):
        return self["frequency"].values

    @property
    def ports(self):
        return list(self["ports/port"].values) if "ports/port" in self else []

    @property
    def summary(self):
        """The summary the run printed."""
        return self._file[f"{self._root}/summary"].asstr()[()]

    def s11_db(self, port=None):
        """|S11| in dB against frequency at `port` (the first when None)."""
        s = self["ports/s_matrix"]
        name = port if port is not None else s.coords["port"][0]
        return s.sel(port=name, driven_port=name).map(lambda v: 20 * np.log10(np.abs(v)), "dB")


class Sweep(_Group):
    """A sweep (lobe sweep): its case table, its stacked arrays and each case's run."""

    def __init__(self, file):
        super().__init__(file, "/stacked")
        self._cases = list(_positions(file["cases/case"]))
        self.variables = list(_positions(file["cases/variable"]))
        self.left_out = _text(file["stacked"].attrs.get("left_out", "nothing")) if "stacked" in file else "nothing"

    @property
    def case_names(self):
        return list(self._cases)

    def values(self):
        """Each case's values of the varied names (SI) as a Labelled [case, variable]."""
        return _labelled(self._file["cases/values_si"])

    def case_table(self):
        """The case table: a pandas DataFrame where pandas is installed, else a dict of columns."""
        return self.values().to_pandas()

    def case(self, which):
        """One case's whole run: by index from 0 or by name ("case-000003"). It reads
        through the sweep's open file: close the sweep, not the case."""
        name = self._cases[which] if isinstance(which, (int, np.integer)) else which
        if name not in self._cases:
            raise KeyError(f"no case '{name}'; the sweep has {len(self._cases)}")
        return Run(self._file, "/" + name)


def load(path):
    """Opens a lobe result (a run, a scattering run or a sweep) for reading."""
    file = h5py.File(path, "r")
    try:
        kind = _check_format(file)
    except Exception:
        file.close()
        raise
    if kind == "lobe-sweep":
        return Sweep(file)
    if kind in ("lobe-antenna-result", "lobe-scattering-result"):
        return Run(file, "", kind)
    file.close()
    raise FormatError(f"{path}: unknown lobe format '{kind}'")
