// libFuzzer target, structure-aware: a genuine result file is changed through the HDF5 API
// as the input bytes direct (datasets deleted, turned into groups, replaced by numbers of any
// shape and value, NaN among them, by text, by integers, by complex numbers, or by sizes far beyond the bytes
// stored), then every result and sweep reader is run on it (lobe match's among them), and
// the figures that plot and report draw from them. Each must return checked data
// or throw an InputError. (libhdf5's own parsing of raw bytes is outside this project; the
// readers' trust in what a well-formed file claims is what is tested here.)
// Build and run: see fuzz_model_parser.cpp; corpus tests/fuzz/corpus/result_file.
#include <fuzzer/FuzzedDataProvider.h>
#include <hdf5.h>
#include <unistd.h>

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <string>
#include <vector>

#include "core/input_error.hpp"
#include "geometry/model_parser.hpp"
#include "post/frequency_result.hpp"
#include "post/hdf5_writer.hpp"
#include "post/result_figures.hpp"
#include "post/result_reader.hpp"
#include "post/sweep_file.hpp"

namespace {

const char* const datasets[] = {"/frequency",       "/ports/s_matrix",  "/ports/port",
                                "/model/reference_ohm", "/model/band", "/model/band_edges_hz", "/pattern/theta",
                                "/pattern/phi",    "/pattern/gain_dbi",  "/pattern/rhcp_dbi",   "/pattern/lhcp_dbi",
                                "/pattern/axial_ratio_db", "/cases/variable",   "/cases/values",       "/cases/values_si",
                                "/cases/labels",       "/ports/impedance_ohm", "/model/source",
                                "/model/value",  "/model/values",     "/model/value_units",  "/model/value_overridden",
                                "/beam/gain_dbi",      "/beam/axial_ratio_db", "/beam/front_to_back_db",
                                "/beam/front_to_back_db_defined", "/beam/peak_theta_deg", "/beam/peak_phi_deg", "/summary",
                                "/scattering/rcs_m2",  "/scattering/theta", "/scattering/monostatic_m2"};

std::string base_file;

void remove_object(hid_t file, const char* name) {
  if (H5Lexists(file, name, H5P_DEFAULT) > 0) H5Ldelete(file, name, H5P_DEFAULT);
}

void ensure_group(hid_t file, const std::string& name) {
  const auto slash = name.rfind('/');
  if (slash == 0) return;
  const std::string parent = name.substr(0, slash);
  if (H5Lexists(file, parent.c_str(), H5P_DEFAULT) <= 0) H5Gclose(H5Gcreate2(file, parent.c_str(), H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT));
}

void change(hid_t file, FuzzedDataProvider& in) {
  const char* name = datasets[in.ConsumeIntegralInRange<std::size_t>(0, std::size(datasets) - 1)];
  remove_object(file, name);
  ensure_group(file, name);
  const int op = in.ConsumeIntegralInRange(0, 6);
  if (op == 0) return;  // deleted
  if (op == 1) {
    H5Gclose(H5Gcreate2(file, name, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT));
    return;
  }
  const int rank = in.ConsumeIntegralInRange(0, 3);
  std::vector<hsize_t> dims(static_cast<std::size_t>(rank));
  hsize_t count = 1;
  for (auto& d : dims) count *= (d = in.ConsumeIntegralInRange<hsize_t>(0, 6));
  const hid_t space = rank == 0 ? H5Screate(H5S_SCALAR) : H5Screate_simple(rank, dims.data(), nullptr);
  if (op == 2 || op == 3) {  // doubles or integers with values from the input (NaN and infinities included)
    std::vector<double> values(count);
    for (auto& v : values) v = in.ConsumeFloatingPoint<double>();
    const hid_t type = op == 2 ? H5T_IEEE_F64LE : H5T_STD_I32LE;
    const hid_t set = H5Dcreate2(file, name, type, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT);
    if (count > 0) H5Dwrite(set, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, values.data());
    H5Dclose(set);
  } else if (op == 4) {  // variable-length text, empty strings included
    std::vector<std::string> texts(count);
    std::vector<const char*> pointers;
    for (auto& t : texts) pointers.push_back((t = in.ConsumeRandomLengthString(12)).c_str());
    const hid_t type = H5Tcopy(H5T_C_S1);
    H5Tset_size(type, H5T_VARIABLE);
    const hid_t set = H5Dcreate2(file, name, type, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT);
    if (count > 0) H5Dwrite(set, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, pointers.data());
    H5Dclose(set);
    H5Tclose(type);
  } else if (op == 6) {  // complex {r, i} with parts from the input (NaN and infinities included)
    std::vector<double> parts(2 * count);
    for (auto& v : parts) v = in.ConsumeFloatingPoint<double>();
    const hid_t type = H5Tcreate(H5T_COMPOUND, 2 * sizeof(double));
    H5Tinsert(type, "r", 0, H5T_NATIVE_DOUBLE);
    H5Tinsert(type, "i", sizeof(double), H5T_NATIVE_DOUBLE);
    const hid_t set = H5Dcreate2(file, name, type, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT);
    if (count > 0) H5Dwrite(set, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, parts.data());
    H5Dclose(set);
    H5Tclose(type);
  } else {  // sizes claimed far beyond what is stored (never written: late allocation)
    const hsize_t huge = in.ConsumeIntegralInRange<hsize_t>(1, 4000000000ull);
    const hid_t big = H5Screate_simple(1, &huge, nullptr);
    H5Dclose(H5Dcreate2(file, name, H5T_IEEE_F64LE, big, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT));
    H5Sclose(big);
  }
  H5Sclose(space);
}

}  // namespace

extern "C" int LLVMFuzzerInitialize(int*, char***) {
  H5Eset_auto2(H5E_DEFAULT, nullptr, nullptr);
  static const lobe::Model model = lobe::parse_model(
      "wire d from (0,0,-0.24) to (0,0,0.24) radius 1 mm segments 9\nport p on d at middle\n"
      "frequency 280 MHz to 320 MHz count 3\nband b 290 MHz to 310 MHz\n"
      "pattern theta 0 to 180 step 30 deg phi 0 to 90 step 90 deg\n",
      "fuzz");
  static const lobe::AntennaProblem problem(model);
  lobe::RunRecord run{problem, {}, {"fuzz", 1, "fuzz", std::nullopt}};
  for (double f : model.frequencies_hz) run.results.push_back(lobe::evaluate_frequency(problem, lobe::solve_frequency(problem, f)));
  base_file = "/tmp/lobe-fuzz-base-" + std::to_string(::getpid()) + ".h5";
  lobe::write_hdf5(base_file, run);
  return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  FuzzedDataProvider in(data, size);
  const std::string path = "/tmp/lobe-fuzz-" + std::to_string(::getpid()) + ".h5";
  std::filesystem::copy_file(base_file, path, std::filesystem::copy_options::overwrite_existing);
  const hid_t file = H5Fopen(path.c_str(), H5F_ACC_RDWR, H5P_DEFAULT);
  for (int k = in.ConsumeIntegralInRange(1, 4); k > 0 && in.remaining_bytes() > 0; --k) change(file, in);
  H5Fclose(file);
  auto guarded = [](auto read) {
    try {
      read();
    } catch (const lobe::InputError&) {
    }
  };
  guarded([&] {
    for (const auto& s : lobe::read_result_network(path).s)
      if (!s.allFinite()) __builtin_trap();
  });
  guarded([&] { lobe::read_result_port_names(path); });
  guarded([&] { lobe::read_result_pattern(path); });
  guarded([&] { lobe::read_result_bands(path); });
  guarded([&] {
    for (const lobe::Complex z : lobe::read_result_port_impedance(path, "", 0).impedance)
      if (!std::isfinite(std::abs(z))) __builtin_trap();
  });
  guarded([&] { lobe::read_result_model(path); });
  guarded([&] {
    const lobe::BeamCurves beam = lobe::read_result_beam(path);
    for (const auto& [name, values] : beam.values)
      for (const auto& v : values)
        if (v && !std::isfinite(*v)) __builtin_trap();
  });
  guarded([&] { lobe::read_result_summary(path); });
  guarded([&] {
    if (lobe::is_scattering_result(path)) lobe::scattering_figures(path);
  });
  // The figures read all of it together: whatever the readers let through must draw.
  guarded([&] { lobe::antenna_figures(path, {}, std::nullopt); });
  guarded([&] {
    if (lobe::is_sweep_file(path)) lobe::read_sweep_table(path);
  });
  return 0;
}
