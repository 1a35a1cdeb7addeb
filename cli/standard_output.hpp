#pragma once
/// `-o -`: where a command writes one file, "-" sends it to standard output instead (the
/// command's other messages go to standard error then); where it writes several, "-" is
/// refused rather than taken as a file or directory named "-".
#include <filesystem>
#include <functional>
#include <string>

namespace lobe::cli {

inline bool is_standard_output(const std::string& output) { return output == "-"; }

/// Runs `write` on a private temporary file, copies the file to standard output and removes
/// it: writers that take a path serve standard output unchanged. Throws OutputError when
/// standard output cannot take it.
void write_through_standard_output(const std::string& extension, const std::function<void(const std::filesystem::path&)>& write);

/// Throws InputError at `option` when `output` is "-": `what` writes several files.
void refuse_standard_output(const std::string& output, const std::string& option, const std::string& what);

}  // namespace lobe::cli
