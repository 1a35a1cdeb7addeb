"""lobe's HDF5 layout as the tools of notebook users see it (h5py, xarray, pandas, all from
Debian), the Python reader package in python/lobe, and the 3-D views as VTK reads them.

Environment: LOBE (the executable), LOBE_SOURCE_DIR (the repository); python/ on PYTHONPATH.
"""

import os
import pathlib
import shutil
import subprocess
import tempfile
import unittest

import h5py
import numpy as np
import xarray

import lobe

LOBE = os.environ["LOBE"]
SOURCE = pathlib.Path(os.environ["LOBE_SOURCE_DIR"])
MODELS = sorted((SOURCE / "models").glob("*.lobe"))
SCRATCH = pathlib.Path(tempfile.mkdtemp(prefix="lobe-python-"))

# Arrays lobe writes as complex numbers: the compound {r, i} that h5py reads as complex.
COMPLEX = {"ports/impedance_ohm", "ports/reflection", "ports/voltage_v", "ports/current_a", "ports/z_matrix_ohm",
           "ports/s_matrix", "pattern/e_theta_v", "pattern/e_phi_v", "currents/start_current_a",
           "currents/end_current_a"}


def run_model(model, *options):
    out = SCRATCH / model.stem
    subprocess.run([LOBE, "run", str(model), "-o", str(out), *options], check=True, capture_output=True)
    return out / f"{model.stem}.h5"


def datasets(file):
    found = {}
    file.visititems(lambda name, item: found.__setitem__(name, item) if isinstance(item, h5py.Dataset) else None)
    return found


def groups(file):
    found = ["/"]
    file.visititems(lambda name, item: found.append(name) if isinstance(item, h5py.Group) else None)
    return found


class DemoFiles(unittest.TestCase):
    """Every demo model's result file: versioned, every array on named axes, complex values
    complex, text UTF-8, and each group opened by xarray with those axes."""

    @classmethod
    def setUpClass(cls):
        cls.files = {model.stem: run_model(model) for model in MODELS}

    def test_every_demo_was_run(self):
        self.assertGreaterEqual(len(self.files), 16)

    def test_files_carry_their_format_and_version(self):
        for stem, path in self.files.items():
            with h5py.File(path) as f:
                self.assertEqual(f.attrs["format_version"], "1.0", stem)
                self.assertIn(f.attrs["format"], ("lobe-antenna-result", "lobe-scattering-result"), stem)

    def test_every_array_has_named_axes_of_its_length(self):
        for stem, path in self.files.items():
            with h5py.File(path) as f:
                for name, d in datasets(f).items():
                    for k, dim in enumerate(d.dims):
                        where = f"{stem}: {name} axis {k}"
                        self.assertTrue(dim.label, where)
                        if h5py.h5ds.is_scale(d.id):  # an axis is its own positions, named as itself
                            self.assertEqual(name.rsplit("/", 1)[-1], dim.label, where)
                            continue
                        self.assertEqual(len(dim), 1, where)  # one scale per axis
                        scale = dim[0]
                        self.assertEqual(scale.shape, (d.shape[k],), where)
                        self.assertEqual(scale.name.rsplit("/", 1)[1], dim.label, where)

    def test_axes_are_the_expected_ones(self):
        with h5py.File(self.files["crossed_dipole_gnss"]) as f:
            self.assertEqual([d.label for d in f["pattern/gain_dbi"].dims], ["frequency", "theta", "phi"])
            self.assertEqual([d.label for d in f["ports/s_matrix"].dims], ["frequency", "port", "driven_port"])
            self.assertEqual([d.label for d in f["currents/start_current_a"].dims], ["frequency", "segment"])
            self.assertEqual([d.label for d in f["band_figures/worst_vswr"].dims], ["band", "port"])
            self.assertEqual(list(f["ports/port"].asstr()[()]), ["a", "b"])

    def test_complex_values_are_complex_and_text_is_utf8(self):
        for stem, path in self.files.items():
            with h5py.File(path) as f:
                for name, d in datasets(f).items():
                    if name in COMPLEX:
                        self.assertEqual(d.dtype, np.complex128, f"{stem}: {name}")
                    self.assertFalse(name.endswith(("_re", "_im")), f"{stem}: {name} split into parts")
                    info = h5py.check_string_dtype(d.dtype)
                    if info is not None:
                        self.assertEqual(info.encoding, "utf-8", f"{stem}: {name}")
                        self.assertIsNone(info.length, f"{stem}: {name} is fixed-length")

    def test_xarray_opens_every_group_on_named_axes(self):
        for stem, path in self.files.items():
            with h5py.File(path) as f:
                names = groups(f)
            for group in names:
                with xarray.open_dataset(path, engine="h5netcdf", group=group) as ds:
                    for dim in ds.dims:
                        self.assertFalse(str(dim).startswith("phony"), f"{stem}: {group} {dim}")
        with xarray.open_dataset(self.files["half_wave_dipole_ism"], engine="h5netcdf", group="pattern") as ds:
            self.assertEqual(set(ds["gain_dbi"].dims), {"frequency", "theta", "phi"})
            self.assertEqual(float(ds["theta"][0]), 0.0)

    def test_reader_package_labels_a_run(self):
        run = lobe.load(self.files["crossed_dipole_gnss"])
        vswr = run["ports/vswr"].sel(port="a")
        self.assertEqual(vswr.dims, ("frequency",))
        self.assertEqual(vswr.shape, run.frequency_hz.shape)
        gain = run["pattern/gain_dbi"]
        cut = gain.sel(frequency=gain.coords["frequency"][0], phi=0.0)
        self.assertEqual(cut.dims, ("theta",))
        # |S11| in dB from the stored complex S11 agrees with the stored return loss.
        np.testing.assert_allclose(-run.s11_db("a").values, run["ports/return_loss_db"].sel(port="a").values, rtol=1e-9)
        frame = run["ports/impedance_ohm"].to_pandas()
        self.assertEqual(list(frame.columns), ["a", "b"])
        self.assertEqual(frame.index.name, "frequency")

    def test_three_lines_in_a_notebook(self):
        with lobe.load(self.files["ground_plane_433"]) as run:
            series = run["ports/vswr"].sel(port="feed").to_pandas()
        self.assertEqual(series.index.name, "frequency")
        self.assertEqual(len(series), 31)

    def test_the_example_plots(self):
        picture = SCRATCH / "example.png"
        subprocess.run(["/usr/bin/python3", str(SOURCE / "python/examples/plot_s11_and_pattern.py"),
                        str(self.files["ground_plane_433"]), str(picture)], check=True, env=os.environ)
        self.assertEqual(picture.read_bytes()[:8], b"\x89PNG\r\n\x1a\n")


class SweepFile(unittest.TestCase):
    """A sweep's file: the case table and stacked arrays [case, frequency, port] beside the
    cases' groups, equal to them."""

    @classmethod
    def setUpClass(cls):
        cls.path = SCRATCH / "sweep.h5"
        subprocess.run([LOBE, "sweep", str(SOURCE / "models/ground_plane_433.lobe"), "--vary", "droop=30:50:10",
                        "-o", str(cls.path)], check=True, capture_output=True)

    def test_stacked_arrays_equal_the_cases(self):
        with h5py.File(self.path) as f:
            self.assertEqual(f.attrs["format"], "lobe-sweep")
            stacked = f["stacked/ports/vswr"]
            self.assertEqual([d.label for d in stacked.dims], ["case", "frequency", "port"])
            self.assertEqual(stacked.shape, (3, 31, 1))
            for c in range(3):
                np.testing.assert_array_equal(stacked[c], f[f"case-{c + 1:06d}/ports/vswr"][()])
            np.testing.assert_array_equal(f["stacked/ports/s_matrix"][1], f["case-000002/ports/s_matrix"][()])
            self.assertEqual(f["stacked/pattern/gain_dbi"].shape[0], 3)
            self.assertEqual(f["stacked"].attrs["left_out"], "nothing")

    def test_arrays_whose_axes_differ_are_left_out_and_named(self):
        # Varying the centre frequency gives each case its own frequencies: per-frequency arrays
        # cannot be stacked and are named in left_out; the band figures, on the same bands, are.
        model = SCRATCH / "moving_band.lobe"
        model.write_text("let f0 = 300 MHz\nwire d from (0,0,-0.24) to (0,0,0.24) radius 1 mm segments 11\n"
                         "port p on d at middle\nfrequency f0 - 10 MHz to f0 + 10 MHz count 3\n"
                         "band b 295 MHz to 305 MHz\n")
        path = SCRATCH / "moving.h5"
        subprocess.run([LOBE, "sweep", str(model), "--vary", "f0=300MHz,310MHz", "-o", str(path)], check=True,
                       capture_output=True)
        with h5py.File(path) as f:
            left_out = f["stacked"].attrs["left_out"]
            self.assertIn("/ports/vswr (frequency differs between cases)", left_out)
            self.assertNotIn("ports", f["stacked"])
            self.assertEqual(f["stacked/band_figures/worst_vswr"].shape, (2, 1, 1))

    def test_reader_package_labels_a_sweep(self):
        sweep = lobe.load(self.path)
        vswr = sweep["ports/vswr"]
        self.assertEqual(vswr.dims, ("case", "frequency", "port"))
        self.assertEqual(sweep.variables, ["droop"])
        np.testing.assert_allclose(np.degrees(sweep.values().sel(variable="droop").values), [30, 40, 50])
        np.testing.assert_array_equal(sweep.case(2)["ports/vswr"].values, vswr.isel(case=2).values)
        self.assertEqual(sweep.case_table().shape, (3, 1))
        self.assertEqual(vswr.to_xarray().sel(case="case-000001").shape, (31, 1))


class ViewFiles(unittest.TestCase):
    """The 3-D views (run --views) read by VTK itself (Debian's python3-vtk9): the .pvd
    series names one grid per frequency, and each grid's binary arrays hold the currents of
    the HDF5 file."""

    def test_vtk_reads_the_series_and_its_currents_match_the_result(self):
        import xml.etree.ElementTree as ET

        import vtk
        from vtk.util.numpy_support import vtk_to_numpy

        model = SOURCE / "models/crossed_dipole_reflector_137.lobe"
        result = run_model(model, "--views")
        folder = result.parent
        steps = ET.parse(folder / f"{model.stem}_currents.pvd").getroot().findall("./Collection/DataSet")
        with h5py.File(result) as f:
            frequency = f["frequency"][()]
            start, end = f["currents/start_current_a"][()], f["currents/end_current_a"][()]
            density = f["currents/surface_density_a_per_m"][()]
        self.assertEqual(len(steps), len(frequency))
        for k, step in enumerate(steps):
            self.assertAlmostEqual(float(step.get("timestep")), frequency[k] / 1e6, places=6)
            reader = vtk.vtkXMLUnstructuredGridReader()
            reader.SetFileName(str(folder / step.get("file")))
            reader.Update()
            grid = reader.GetOutput()
            segments, triangles = start.shape[1], density.shape[1]
            self.assertEqual(grid.GetNumberOfCells(), segments + triangles)
            cells = grid.GetCellData()
            line = vtk_to_numpy(cells.GetArray("line_current_a"))
            surface = vtk_to_numpy(cells.GetArray("surface_current_a_per_m"))
            np.testing.assert_allclose(line[:segments], 0.5 * (abs(start[k]) + abs(end[k])), rtol=1e-12)
            np.testing.assert_allclose(surface[segments:], np.linalg.norm(density[k], axis=1), rtol=1e-12)
            self.assertEqual(vtk_to_numpy(cells.GetArray("current_re")).shape, (segments + triangles, 3))
        reader = vtk.vtkXMLUnstructuredGridReader()
        reader.SetFileName(str(folder / f"{model.stem}_pattern_3d_000.vtu"))
        reader.Update()
        gain = vtk_to_numpy(reader.GetOutput().GetPointData().GetArray("gain_dbi"))
        with h5py.File(result) as f:
            self.assertAlmostEqual(gain.max(), f["beam/gain_dbi"][0], delta=0.01)


@unittest.skipUnless(os.environ.get("LOBE_ENGINE") == "ON", "built without the Python engine (LOBE_PYTHON_ENGINE=OFF)")
class Engine(unittest.TestCase):
    """lobe.solve: the solver in this process, for optimisers."""

    def test_solve_gives_the_figures_lobe_run_writes(self):
        model = SOURCE / "models/ground_plane_433.lobe"
        solution = lobe.solve(model.read_text())
        with lobe.load(run_model(model)) as run:
            np.testing.assert_allclose(solution["ports/impedance_ohm"].values, run["ports/impedance_ohm"].values, rtol=1e-9)
            self.assertAlmostEqual(solution.figure("worst-vswr", port="feed"),
                                   run["band_figures/worst_vswr"].sel(band="ism433", port="feed").values, delta=1e-9)
            np.testing.assert_allclose(solution["beam/gain_dbi"].values, run["beam/gain_dbi"].values, rtol=1e-9)
        self.assertEqual(solution["ports/vswr"].dims, ("frequency", "port"))

    def test_an_optimiser_finds_a_thin_dipoles_resonance(self):
        # scipy (Debian's python3-scipy) shortens a thin dipole until its reactance vanishes.
        # A thin half-wave dipole resonates a little short of half a wavelength, at about 0.48
        # wavelengths for a radius of 1e-4 wavelengths (common practice, from memory; at
        # exactly half a wavelength it has +j42.5 ohm, Balanis, Antenna Theory, eq. 4-93).
        from scipy.optimize import brentq

        text = ("let half = 0.24\nwire d from (0,0,-half) to (0,0,half) radius 0.1 mm segments 41\n"
                "port p on d at middle\nfrequency 299.792458 MHz\n")

        def reactance(length):
            solution = lobe.solve(text, set={"half": f"{length / 2!r}"})
            return solution["ports/impedance_ohm"].values[0, 0].imag

        resonant = brentq(reactance, 0.44, 0.50, xtol=1e-5)
        self.assertGreater(resonant, 0.47)
        self.assertLess(resonant, 0.49)

    def test_bad_input_is_a_value_error_with_its_place(self):
        with self.assertRaisesRegex(ValueError, r"^model:3:11: expected a frequency with a unit"):
            lobe.solve("wire w from (0,0,0) to (0,0,1) radius 1 mm\nport p on w at start\nfrequency 3 Gz\n")


class Refusals(unittest.TestCase):
    def test_newer_major_and_missing_version_are_refused(self):
        source = run_model(SOURCE / "models/half_wave_dipole_ism.lobe")
        for version, message in (("2.0", "newer than this reader"), (None, "no format_version"),
                                 ("two", "not MAJOR.MINOR")):
            copy = SCRATCH / f"version-{version}.h5"
            shutil.copy(source, copy)
            with h5py.File(copy, "a") as f:
                if version is None:
                    del f.attrs["format_version"]
                else:
                    f.attrs["format_version"] = version
            with self.assertRaisesRegex(lobe.FormatError, message):
                lobe.load(copy)
            # lobe itself refuses it too, as bad input (exit code 2).
            done = subprocess.run([LOBE, "export", "--touchstone", str(copy), "-o", str(SCRATCH / "x.s1p")], capture_output=True, text=True)
            self.assertEqual(done.returncode, 2, done.stderr)
            self.assertIn(message.replace("this reader", "this lobe").replace("MAJOR.MINOR", "of the form MAJOR.MINOR"),
                          done.stderr)


if __name__ == "__main__":
    unittest.main()
