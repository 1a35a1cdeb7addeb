#pragma once
/// Reading back lobe's .vtu files in the tests: the XML structure (checked for
/// well-formedness by Expat) and the arrays appended after it as raw binary, decoded as
/// VTK's file-format documentation describes ("appended" data, raw encoding, UInt64
/// headers). tests/python/test_views.py reads the same files with VTK itself.
#include <string>
#include <vector>

namespace lobe::testing {

/// The XML part of a .vtu file (everything before its appended data), closed so that an
/// XML parser can judge it.
std::string vtu_structure(const std::string& vtu);

/// The values of the DataArray named `name` (the <Points> array when `name` is empty),
/// converted to double; empty when there is no such array.
std::vector<double> vtu_array(const std::string& vtu, const std::string& name);

}  // namespace lobe::testing
