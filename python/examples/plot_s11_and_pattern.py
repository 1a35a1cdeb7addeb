"""Plots a lobe run's |S11| against frequency and its gain pattern cut at phi = 0.

    python3 plot_s11_and_pattern.py RESULT.h5 PICTURE.png

Needs numpy, h5py and matplotlib (Debian: python3-numpy python3-h5py python3-matplotlib);
set PYTHONPATH to the repository's python/ directory, or install lobe's package.
"""

import sys

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402
import numpy as np  # noqa: E402

import lobe  # noqa: E402


def main(result, picture):
    run = lobe.load(result)
    s11 = run.s11_db()
    frequency_mhz = s11.coords["frequency"] / 1e6
    gain = run["pattern/gain_dbi"]
    centre = gain.coords["frequency"][len(gain.coords["frequency"]) // 2]
    cut = gain.sel(frequency=centre, phi=gain.coords["phi"][0])

    figure = plt.figure(figsize=(10, 4.5))
    left = figure.add_subplot(1, 2, 1)
    left.plot(frequency_mhz, s11.values)
    left.set_xlabel("frequency (MHz)")
    left.set_ylabel("|S11| (dB)")
    left.set_title(f"port {run.ports[0]}")
    left.grid(True)
    right = figure.add_subplot(1, 2, 2, projection="polar")
    right.set_theta_zero_location("N")
    right.set_theta_direction(-1)
    floor = np.max(cut.values) - 40
    right.plot(np.radians(cut.coords["theta"]), np.maximum(cut.values, floor))
    right.set_rlim(floor, np.max(cut.values) + 1)
    right.set_title(f"gain (dBi), phi = {gain.coords['phi'][0]:g} deg, {centre / 1e6:.1f} MHz")
    figure.tight_layout()
    figure.savefig(picture, dpi=100)


if __name__ == "__main__":
    if len(sys.argv) != 3:
        sys.exit(__doc__)
    main(sys.argv[1], sys.argv[2])
