"""Read lobe's HDF5 results as labelled arrays.

    import lobe
    run = lobe.load("dipole.h5")
    run["ports/vswr"].sel(port="feed")      # VSWR against frequency, labelled

A run's arrays are addressed by their path in the file ("ports/vswr", "pattern/gain_dbi");
a sweep's by the same paths, with the cases as a first axis ("case"). Each array comes with
its axes (frequency, port, theta, phi, …), their positions and its units. pandas and
xarray are used where they are installed (Labelled.to_pandas, Labelled.to_xarray); only
numpy and h5py are needed.

lobe.solve(model_text, set={...}) solves a model in this process, without files, where the
compiled engine is installed (for optimisers trying many variants).
"""

from lobe.engine import Solution, solve
from lobe.results import FormatError, Labelled, Run, Sweep, load

__all__ = ["FormatError", "Labelled", "Run", "Solution", "Sweep", "load", "solve"]
