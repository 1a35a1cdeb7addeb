"""lobe's solver inside Python (the compiled module lobe_engine, built with pybind11): a
model's text in, labelled arrays out, no files written, for optimisers that try many
variants of a design."""

import numpy as np

from lobe.labelled import Labelled


class Solution:
    """One solve: port arrays on (frequency, port) axes, the beam's figures per frequency,
    and every band figure of every band of the model."""

    def __init__(self, raw):
        self._raw = raw
        self.frequency_hz = raw["frequency_hz"]
        self.ports = list(raw["ports"])
        self.band_figures = raw["band_figures"]

    def __getitem__(self, path):
        """ports/impedance_ohm, ports/reflection, ports/vswr, ports/return_loss_db,
        ports/s_matrix, solver/solved, beam/<figure> (as in the HDF5 file)."""
        group, _, name = path.partition("/")
        coords = {"frequency": self.frequency_hz, "port": np.array(self.ports), "driven_port": np.array(self.ports)}
        if group == "ports" and name in self._raw:
            dims = ("frequency", "port", "driven_port")[: self._raw[name].ndim]
            return Labelled(self._raw[name], dims, {d: coords[d] for d in dims}, "", path)
        if group == "beam" and name in self._raw["beam"]:
            return Labelled(self._raw["beam"][name], ("frequency",), {"frequency": self.frequency_hz}, "", path)
        if path == "solver/solved":
            return Labelled(self._raw["solved"], ("frequency",), {"frequency": self.frequency_hz}, "", path)
        raise KeyError(f"no '{path}' in a solution")

    def figure(self, name, band=None, port=0):
        """A band figure ("worst-vswr", "centre-gain", …) over `band` (default the model's
        first) at `port` (index or name; beam figures have none); None where undefined."""
        bands = self.band_figures
        if not bands:
            raise KeyError("the model has no band")
        values = bands[band if band is not None else next(iter(bands))][name]
        if isinstance(values, list):
            return values[self.ports.index(port) if isinstance(port, str) else port]
        return values


def solve(model, set=None, every_frequency=False, name="model"):
    """Solves a model given as text (`set` overrides its `let` values: {"arm": "510 mm"}).
    Bad input raises ValueError with lobe's FILE:LINE:COL: message."""
    try:
        import lobe_engine
    except ImportError as error:
        raise ImportError("lobe.solve needs the compiled engine lobe_engine (built with pybind11-dev; "
                          "installed with the lobe package)") from error
    return Solution(lobe_engine.solve(model, set or {}, every_frequency, name))
