// The result readers are handed files they did not necessarily write: every damaged or
// hostile file is refused with an InputError naming the problem, never a crash, a huge
// allocation or NaN passed on.
#include <gtest/gtest.h>
#include <hdf5.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <functional>

#include "post/hdf5_writer.hpp"
#include "post/result_reader.hpp"
#include "support/scratch_directory.hpp"
#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

std::filesystem::path scratch() { return scratch_directory("reader"); }

/// A genuine one-port result file, written once.
const std::filesystem::path& good_result() {
  static const std::filesystem::path path = [] {
    const Solved s = solve_text(dipole_text(0.5, 1e-4, 20));
    RunRecord run{*s.problem, {s.result}, {"test", 1, "lobe run test", std::nullopt}};
    const auto p = scratch() / "good.h5";
    write_hdf5(p, run);
    return p;
  }();
  return path;
}

/// A copy of the good file with `change` applied through the HDF5 C API.
std::filesystem::path damaged(const std::string& name, const std::function<void(hid_t)>& change) {
  const auto path = scratch() / (name + ".h5");
  std::filesystem::copy_file(good_result(), path, std::filesystem::copy_options::overwrite_existing);
  const hid_t file = H5Fopen(path.c_str(), H5F_ACC_RDWR, H5P_DEFAULT);
  EXPECT_GE(file, 0);
  change(file);
  H5Fclose(file);
  return path;
}

void replace_with_strings(hid_t file, const char* name, const std::vector<const char*>& texts) {
  H5Ldelete(file, name, H5P_DEFAULT);
  const hsize_t n = texts.size();
  const hid_t space = H5Screate_simple(1, &n, nullptr);
  const hid_t type = H5Tcopy(H5T_C_S1);
  H5Tset_size(type, H5T_VARIABLE);
  const hid_t set = H5Dcreate2(file, name, type, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT);
  H5Dwrite(set, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, texts.data());
  H5Dclose(set);
  H5Tclose(type);
  H5Sclose(space);
}

void replace_with_doubles(hid_t file, const char* name, const std::vector<hsize_t>& dims, const std::vector<double>& values) {
  H5Ldelete(file, name, H5P_DEFAULT);
  const hid_t space = H5Screate_simple(static_cast<int>(dims.size()), dims.data(), nullptr);
  const hid_t set = H5Dcreate2(file, name, H5T_NATIVE_DOUBLE, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT);
  if (!values.empty()) H5Dwrite(set, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, values.data());
  H5Dclose(set);
  H5Sclose(space);
}

void replace_with_complex(hid_t file, const char* name, const std::vector<hsize_t>& dims, const std::vector<Complex>& values) {
  H5Ldelete(file, name, H5P_DEFAULT);
  const hid_t type = H5Tcreate(H5T_COMPOUND, sizeof(Complex));
  H5Tinsert(type, "r", 0, H5T_NATIVE_DOUBLE);
  H5Tinsert(type, "i", sizeof(double), H5T_NATIVE_DOUBLE);
  const hid_t space = H5Screate_simple(static_cast<int>(dims.size()), dims.data(), nullptr);
  const hid_t set = H5Dcreate2(file, name, type, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT);
  if (!values.empty()) H5Dwrite(set, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, values.data());
  H5Dclose(set);
  H5Sclose(space);
  H5Tclose(type);
}

/// Replaces the root's format_version attribute with `version` (none when empty).
void set_format_version(hid_t file, const char* version) {
  H5Adelete(file, "format_version");
  if (!*version) return;
  const hid_t type = H5Tcopy(H5T_C_S1);
  H5Tset_size(type, H5T_VARIABLE);
  const hid_t space = H5Screate(H5S_SCALAR);
  const hid_t attribute = H5Acreate2(file, "format_version", type, space, H5P_DEFAULT, H5P_DEFAULT);
  H5Awrite(attribute, type, &version);
  H5Aclose(attribute);
  H5Sclose(space);
  H5Tclose(type);
}

std::string refusal(const std::function<void()>& read) {
  try {
    read();
  } catch (const InputError& e) {
    return e.what();
  }
  return "(accepted)";
}

TEST(ResultReader, TheGoodFileReads) {
  EXPECT_EQ(read_result_network(good_result()).ports(), 1);
  EXPECT_EQ(read_result_port_names(good_result()).size(), 1u);
  EXPECT_FALSE(read_result_pattern(good_result()).gain_dbi.empty());
}

TEST(ResultReader, StructureTypesAndSizesAreChecked) {
  const auto group = damaged("group", [](hid_t f) {
    H5Ldelete(f, "/ports/s_matrix", H5P_DEFAULT);
    H5Gclose(H5Gcreate2(f, "/ports/s_matrix", H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT));
  });
  EXPECT_NE(refusal([&] { read_result_network(group); }).find("is not a dataset"), std::string::npos);
  const auto text = damaged("text", [](hid_t f) { replace_with_strings(f, "/ports/s_matrix", {"0.1"}); });
  EXPECT_NE(refusal([&] { read_result_network(text); }).find("holds text where complex numbers belong"), std::string::npos);
  const auto real = damaged("real", [](hid_t f) { replace_with_doubles(f, "/ports/s_matrix", {1, 1, 1}, {0.1}); });
  EXPECT_NE(refusal([&] { read_result_network(real); }).find("holds numbers where complex numbers belong"), std::string::npos);
  // A billion values claimed in a file of a few hundred kilobytes: refused before allocating 8 GB.
  const auto huge = damaged("huge", [](hid_t f) {
    H5Ldelete(f, "/frequency", H5P_DEFAULT);
    const hsize_t n = 1000000000;
    const hid_t space = H5Screate_simple(1, &n, nullptr);
    H5Dclose(H5Dcreate2(f, "/frequency", H5T_NATIVE_DOUBLE, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT));
    H5Sclose(space);
  });
  EXPECT_NE(refusal([&] { read_result_network(huge); }).find("claims 1000000000 values"), std::string::npos);
  // Truncated to half: refused as damaged.
  const auto truncated = scratch() / "truncated.h5";
  std::filesystem::copy_file(good_result(), truncated, std::filesystem::copy_options::overwrite_existing);
  std::filesystem::resize_file(truncated, std::filesystem::file_size(truncated) / 2);
  EXPECT_NE(refusal([&] { read_result_network(truncated); }), "(accepted)");
}

TEST(ResultReader, NamesPatternsAndValuesAreChecked) {
  const auto nan = damaged("nan", [](hid_t f) { replace_with_complex(f, "/ports/s_matrix", {1, 1, 1}, {{0.1, std::nan("")}}); });
  EXPECT_NE(refusal([&] { read_result_network(nan); }).find("not a finite number"), std::string::npos);
  const auto empty_name = damaged("empty-name", [](hid_t f) { replace_with_strings(f, "/ports/port", {""}); });
  EXPECT_NE(refusal([&] { read_result_port_names(empty_name); }).find("empty name"), std::string::npos);
  const auto two_names = damaged("two-names", [](hid_t f) { replace_with_strings(f, "/ports/port", {"a", "b"}); });
  EXPECT_NE(refusal([&] { read_result_port_names(two_names); }).find("do not match its ports"), std::string::npos);
  const auto no_pattern = damaged("no-pattern", [](hid_t f) { replace_with_doubles(f, "/pattern/theta", {0}, {}); });
  EXPECT_NE(refusal([&] { read_result_pattern(no_pattern); }).find("empty or do not fit"), std::string::npos);
}

// The layout's version (format_version, MAJOR.MINOR): a newer minor only adds datasets and
// is read; a newer major, a file without a version (not lobe's, or from before the
// versioned layout) and a malformed version are refused by name.
TEST(ResultReader, FormatVersionIsChecked) {
  const auto minor = damaged("minor", [](hid_t f) { set_format_version(f, "1.7"); });
  EXPECT_EQ(read_result_port_names(minor).size(), 1u);
  const auto major = damaged("major", [](hid_t f) { set_format_version(f, "2.0"); });
  EXPECT_NE(refusal([&] { read_result_network(major); }).find("result format 2.0, newer than this lobe reads (1.x)"),
            std::string::npos);
  const auto none = damaged("none", [](hid_t f) { set_format_version(f, ""); });
  EXPECT_NE(refusal([&] { read_result_network(none); }).find("has no format_version"), std::string::npos);
  const auto garbled = damaged("garbled", [](hid_t f) { set_format_version(f, "one"); });
  EXPECT_NE(refusal([&] { read_result_network(garbled); }).find("not of the form MAJOR.MINOR"), std::string::npos);
}

}  // namespace
}  // namespace lobe::testing
