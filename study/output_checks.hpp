#pragma once
/// Refusals of outputs that could not be written, made before any solving.
#include <filesystem>

namespace lobe {

/// Refuses (InputError at --output) a directory that exists as a file, lies under a file,
/// or cannot be written (a file is created and removed there to find out).
void check_output_directory(const std::filesystem::path& directory);
/// The same for a file to write: not an existing directory, and its directory writable.
void check_output_file(const std::filesystem::path& file);

}  // namespace lobe
