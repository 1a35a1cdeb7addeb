"""An array with named axes, their positions and its units."""

import numpy as np


class Labelled:
    """values[i, j, …] with dims ("frequency", "port", …), coords {dim: positions} and units."""

    def __init__(self, values, dims, coords, units="", name=""):
        if values.ndim != len(dims):
            raise ValueError(f"{name}: {values.ndim} dimensions but {len(dims)} axis names")
        self.values = values
        self.dims = tuple(dims)
        self.coords = dict(coords)
        self.units = units
        self.name = name

    def __repr__(self):
        shape = ", ".join(f"{d}: {n}" for d, n in zip(self.dims, self.values.shape))
        return f"<Labelled {self.name} ({shape}) [{self.units}]>"

    @property
    def shape(self):
        return self.values.shape

    def _index(self, dim, label):
        positions = self.coords.get(dim)
        if positions is None:
            raise KeyError(f"{self.name}: axis '{dim}' has no positions; use isel")
        if positions.dtype.kind in "fc":
            matches = np.flatnonzero(np.isclose(positions, label, rtol=1e-9, atol=0))
        else:
            matches = np.flatnonzero(positions == label)
        if matches.size == 0:
            raise KeyError(f"{self.name}: no {dim} {label!r} (there are {list(positions)[:8]}…)")
        return int(matches[0])

    def isel(self, **indices):
        """The array at positions given by index along the named axes (those axes dropped)."""
        for dim in indices:
            if dim not in self.dims:
                raise KeyError(f"{self.name}: no axis '{dim}' (axes: {self.dims})")
        take = tuple(indices.get(d, slice(None)) for d in self.dims)
        dims = tuple(d for d in self.dims if d not in indices)
        coords = {d: p for d, p in self.coords.items() if d in dims}
        return Labelled(self.values[take], dims, coords, self.units, self.name)

    def sel(self, **labels):
        """The array at the named positions ("port"="feed", "phi"=0.0), those axes dropped."""
        for dim in labels:
            if dim not in self.dims:
                raise KeyError(f"{self.name}: no axis '{dim}' (axes: {self.dims})")
        return self.isel(**{d: self._index(d, v) for d, v in labels.items()})

    def map(self, function, units):
        """function applied to the values, axes kept (|S11| in dB from S11)."""
        return Labelled(function(self.values), self.dims, self.coords, units, self.name)

    def to_pandas(self):
        """A pandas Series (one axis) or DataFrame (two), a MultiIndex Series beyond; without
        pandas, a dict of {axis: positions, "values": values}."""
        try:
            import pandas as pd
        except ImportError:
            table = dict(self.coords)
            table["values"] = self.values
            return table
        index = [self.coords.get(d, np.arange(n)) for d, n in zip(self.dims, self.values.shape)]
        if self.values.ndim == 1:
            return pd.Series(self.values, index=pd.Index(index[0], name=self.dims[0]), name=self.name)
        if self.values.ndim == 2:
            return pd.DataFrame(self.values, index=pd.Index(index[0], name=self.dims[0]),
                                columns=pd.Index(index[1], name=self.dims[1]))
        multi = pd.MultiIndex.from_product(index, names=self.dims)
        return pd.Series(self.values.reshape(-1), index=multi, name=self.name)

    def to_xarray(self):
        """An xarray.DataArray (xarray must be installed)."""
        import xarray as xr

        return xr.DataArray(self.values, dims=self.dims, coords=self.coords, name=self.name,
                            attrs={"units": self.units})
