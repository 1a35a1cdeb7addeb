// Every malformed model gives exit code 2 and one line FILE:LINE:COL: message naming the
// problem; nothing crashes or hangs, and no result file appears or is replaced.
#include <gtest/gtest.h>

#include <sys/stat.h>

#include <regex>

#include "cli/run_process.hpp"

namespace lobe::testing {
namespace {

const std::filesystem::path corpus = std::filesystem::path(LOBE_SOURCE_DIR) / "tests" / "bad_models";

/// The text after "# expect: " on a corpus file's first line.
std::string expected_message(const std::filesystem::path& file) {
  std::ifstream in(file, std::ios::binary);
  std::string first;
  std::getline(in, first);
  const std::string marker = "# expect: ";
  return first.rfind(marker, 0) == 0 ? first.substr(marker.size()) : "";
}

std::string quoted_path(const std::filesystem::path& path) {
  std::string quoted = "'";  // appended rather than "'" + …: GCC 12 warns falsely (-Wrestrict) on that
  return quoted.append(path.string()).append("'");
}

/// Runs check and run on `model`; both must fail cleanly with `expected` in the message.
void expect_clean_rejection(const std::filesystem::path& model, const std::string& expected) {
  const auto scratch = fresh_directory("bad-" + model.stem().string());
  const auto results = scratch / "results";
  std::filesystem::create_directories(results);
  const auto keep = results / "earlier.txt";
  std::ofstream(keep) << "a user's earlier result";
  for (const std::string command : {"check", "run"}) {
    const std::string args = command + " '" + model.string() + "'" + (command == "run" ? " -o '" + results.string() + "'" : "");
    const ProcessResult r = run_lobe(args, scratch);
    SCOPED_TRACE(model.filename().string() + " with " + command);
    EXPECT_EQ(r.exit_code, 2) << r.err;
    std::string pattern(1, '^');
    pattern += std::regex_replace(model.string(), std::regex(R"([.^$|()\[\]{}*+?\\])"), R"(\$&)");
    pattern += R"(:\d+:\d+: [^\n]+\n$)";
    const std::regex one_line(pattern);
    EXPECT_TRUE(std::regex_match(r.err, one_line)) << r.err;
    EXPECT_NE(r.err.find(expected), std::string::npos) << "expected '" << expected << "' in: " << r.err;
  }
  // Nothing written, nothing the user had lost.
  std::size_t entries = 0;
  for ([[maybe_unused]] const auto& e : std::filesystem::directory_iterator(results)) ++entries;
  EXPECT_EQ(entries, 1u);
  EXPECT_EQ(read_text(keep), "a user's earlier result");
}

TEST(BadInput, CorpusHasAtLeastThirtyModels) {
  std::size_t count = 0;
  for (const auto& e : std::filesystem::directory_iterator(corpus)) count += e.path().extension() == ".lobe";
  EXPECT_GE(count, 30u);
}

TEST(BadInput, EveryCorpusModelIsRejectedCleanly) {
  for (const auto& e : std::filesystem::directory_iterator(corpus)) {
    if (e.path().extension() != ".lobe") continue;
    const std::string expected = expected_message(e.path());
    ASSERT_FALSE(expected.empty()) << e.path() << " lacks its '# expect:' line";
    expect_clean_rejection(e.path(), expected);
  }
}

// Inputs too large or too strange to keep in the repository are made here.
TEST(BadInput, TenMegabyteLine) {
  const auto dir = fresh_directory("generated-long");
  const auto model = dir / "long_line.lobe";
  std::ofstream(model) << "let x = " << std::string(10 << 20, '1') << "\n";
  expect_clean_rejection(model, "characters long");
}

TEST(BadInput, BinaryGarbage) {
  const auto dir = fresh_directory("generated-binary");
  const auto model = dir / "garbage.lobe";
  std::ofstream out(model, std::ios::binary);
  for (int i = 0; i < 4096; ++i) out.put(static_cast<char>((i * 7919 + 13) % 256));
  out.close();
  expect_clean_rejection(model, "unexpected byte");
}

TEST(BadInput, EmptyFile) {
  const auto dir = fresh_directory("generated-empty");
  const auto model = dir / "empty.lobe";
  std::ofstream{model};
  expect_clean_rejection(model, "the model is empty");
}

// A model path that is no regular file is named for what it is, and nothing waits on it
// (a FIFO with no writer, /dev/zero) or reads past the size limit (a sparse 70 MB file).
TEST(BadInput, ModelPathThatIsNoModelFile) {
  const auto dir = fresh_directory("generated-not-a-file");
  expect_clean_rejection(dir, "the model file is a directory");
  const auto fifo = dir / "pipe.lobe";
  ASSERT_EQ(::mkfifo(fifo.c_str(), 0600), 0);
  expect_clean_rejection(fifo, "is not a regular file");
  expect_clean_rejection("/dev/zero", "is not a regular file");
  const auto huge = dir / "huge.lobe";
  std::ofstream{huge};
  std::filesystem::resize_file(huge, 70u << 20);
  expect_clean_rejection(huge, "larger than 64 MiB");
}

TEST(BadInput, MissingFile) {
  expect_clean_rejection(std::filesystem::temp_directory_path() / "lobe-no-such-model.lobe", "cannot open");
}

TEST(BadInput, BadSetOption) {
  const auto scratch = fresh_directory("bad-set");
  const std::string model = std::string(LOBE_SOURCE_DIR) + "/models/half_wave_dipole_ism.lobe";
  const ProcessResult r = run_lobe("check '" + model + "' --set nonexistent=3", scratch);
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("--set:1:"), std::string::npos) << r.err;
}

// A --set value outside physical bounds is refused while parsing, not hours into a solve
// (a radius of 1e-200 once sent an integration rule after a vanishing radius forever).
TEST(BadInput, SetValueOutsidePhysicalBounds) {
  const auto scratch = fresh_directory("bad-set-bounds");
  const std::string model = std::string(LOBE_SOURCE_DIR) + "/models/half_wave_dipole_ism.lobe";
  const ProcessResult r = run_lobe("run '" + model + "' --set rod=1e-200 -o '" + (scratch / "out").string() + "'", scratch);
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("a wire radius must be at least 0.1 um"), std::string::npos) << r.err;
  EXPECT_FALSE(std::filesystem::exists(scratch / "out"));
}

TEST(BadInput, BadBandOption) {
  const auto scratch = fresh_directory("bad-band");
  const std::string model = std::string(LOBE_SOURCE_DIR) + "/models/half_wave_dipole_ism.lobe";
  for (const char* band : {"880MHz", "880:890MHz", "890MHz:880MHz", "1GHz:2m"}) {
    const ProcessResult r = run_lobe("run '" + model + "' -o '" + (scratch / "out").string() + "' --band " + band, scratch);
    EXPECT_EQ(r.exit_code, 2) << band;
    EXPECT_NE(r.err.find("--band:1:"), std::string::npos) << r.err;
    EXPECT_FALSE(std::filesystem::exists(scratch / "out")) << band;
  }
}

// Options are checked before any work, with the option's name in the message: a power that
// is not a finite number of watts, more threads than cores, a band outside the model's
// frequencies for sweep --rank and tune, and a --vary product too large to build.
TEST(BadInput, OptionsAreCheckedBeforeAnyWork) {
  const auto scratch = fresh_directory("bad-options");
  const std::string model = quoted_path(std::filesystem::path(LOBE_SOURCE_DIR) / "models" / "half_wave_dipole_ism.lobe");
  const std::string out = " -o " + quoted_path(scratch / "out");
  for (const auto& [args, expected] : std::vector<std::pair<std::string, std::string>>{
           {"run " + model + out + " --tx-power nan", "--tx-power: "},
           {"run " + model + out + " --tx-power 1e308", "--tx-power: "},
           {"compare x.h5 y.s1p --tx-power inf", "--tx-power: "},
           {"run " + model + out + " --threads 1024", "--threads: "},
           {"run " + model + out + " --toward 200,0", "--toward:1:1: "},
           {"run " + model + out + " --toward 10", "--toward:1:1: "},
           {"run " + model + out + " --toward nan,0", "--toward:1:1: "},
           {"run " + model + out + " --toward 10,0x", "--toward:1:1: "},
           {"sweep " + model + " --vary length=150mm,160mm --rank worst-vswr --band 2GHz:3GHz" + out, "--band:1:1: "},
           {"tune " + model + " --vary length=150mm:160mm --band 2GHz:3GHz" + out, "--band:1:1: "},
           {"sweep " + model + " --vary length=1mm:10000mm:1mm --vary rod=1mm:10000mm:1mm" + out, "--vary:1:1: "}}) {
    const ProcessResult r = run_lobe(args, scratch);
    EXPECT_EQ(r.exit_code, 2) << args;
    EXPECT_EQ(r.err.rfind(expected, 0), 0u) << args << "\n" << r.err;
    EXPECT_FALSE(std::filesystem::exists(scratch / "out")) << args;
  }
}

// A write that fails (here a file-size limit, as on a full disk) gives one line naming the
// file and the system's reason, exit 1, no crash and no HDF5 diagnostics; an earlier result
// set stays as it was. Before, HDF5 printed 140 lines and the process died of SIGSEGV at exit.
TEST(BadInput, FailedWritesAreOneLineAndKeepEarlierResults) {
  const auto scratch = fresh_directory("write-fails");
  const std::string model = quoted_path(std::filesystem::path(LOBE_SOURCE_DIR) / "models" / "half_wave_dipole_ism.lobe");
  const auto out = scratch / "out";
  ASSERT_EQ(run_lobe("run " + model + " -o " + quoted_path(out), scratch).exit_code, 0);
  const std::string earlier = read_text(out / "half_wave_dipole_ism_ports.csv");
  const ProcessResult r = run_lobe("run " + model + " -o " + quoted_path(out) + " --set rod=0.8", scratch, 100);
  EXPECT_EQ(r.exit_code, 1) << r.err;
  EXPECT_NE(r.err.find("lobe: cannot write " + (out / "half_wave_dipole_ism.h5").string() + ": File too large"),
            std::string::npos) << r.err;
  EXPECT_EQ(r.err.find("HDF5"), std::string::npos) << r.err;
  EXPECT_EQ(read_text(out / "half_wave_dipole_ism_ports.csv"), earlier);
  std::size_t leftovers = 0;
  for (const auto& e : std::filesystem::directory_iterator(out)) leftovers += e.path().filename().string()[0] == '.';
  EXPECT_EQ(leftovers, 0u);
  // A sweep whose cases fit but whose assembled file does not keeps its cases and says so.
  const ProcessResult sweep = run_lobe("sweep " + model + " --vary rod=0.8,1.2 -o " + quoted_path(scratch / "s.h5"), scratch, 300);
  EXPECT_EQ(sweep.exit_code, 1) << sweep.err;
  EXPECT_NE(sweep.err.find("all 2 cases are kept in"), std::string::npos) << sweep.err;
  EXPECT_TRUE(std::filesystem::exists(scratch / "s.h5.cases" / "case-000002.h5"));
}

// Output paths are checked before any solving: an existing directory where a file goes, a
// place nothing can be written (/proc), a case folder that is a file.
TEST(BadInput, OutputPathsAreCheckedBeforeSolving) {
  const auto scratch = fresh_directory("bad-output-paths");
  const std::string model = quoted_path(std::filesystem::path(LOBE_SOURCE_DIR) / "models" / "half_wave_dipole_ism.lobe");
  std::filesystem::create_directories(scratch / "a-directory");
  std::ofstream(scratch / "blocked.h5.cases") << "a file where the case folder goes";
  for (const auto& [args, expected] : std::vector<std::pair<std::string, std::string>>{
           {"sweep " + model + " --vary rod=1,2 -o " + quoted_path(scratch / "a-directory"), "is a directory"},
           {"sweep " + model + " --vary rod=1,2 -o /proc/lobe-sweep.h5", "cannot write results under '/proc'"},
           {"sweep " + model + " --vary rod=1,2 -o " + quoted_path(scratch / "blocked.h5"), "exists and is not a directory"},
           {"tune " + model + " --vary length=150mm:160mm -o " + quoted_path(scratch / "a-directory"), "is a directory"},
           {"tune " + model + " --vary length=150mm:160mm -o /proc/lobe-tuned.lobe", "cannot write results under '/proc'"},
           {"run " + model + " -o /proc/lobe-results", "cannot write results under '/proc'"}}) {
    const ProcessResult r = run_lobe(args, scratch);
    EXPECT_EQ(r.exit_code, 2) << args << "\n" << r.err;
    EXPECT_EQ(r.err.rfind("--output:1:1: ", 0), 0u) << r.err;
    EXPECT_NE(r.err.find(expected), std::string::npos) << r.err;
    EXPECT_EQ(r.err.find("case 1/"), std::string::npos) << "solved before refusing: " << r.err;
  }
}

// The memory check counts what the process may really have: under an address-space limit
// (ulimit -v) of 1 GB, a model whose matrices need 1.5 GB is refused before meshing, naming
// the limit (it once counted 80 % of the machine's memory and let the run start).
TEST(BadInput, MemoryCheckHonoursTheProcessLimits) {
  const auto scratch = fresh_directory("memory-limit");
  const auto model = scratch / "large.lobe";
  std::ofstream(model) << "units mm\nplate p rectangle corner (-300,-300,0) size (600, 600)\nmesh p size 12\n"
                          "wire w from (0,0,0) to (0,0,70) radius 0.5\nport f on w at start\nfrequency 1 GHz\n";
  const ProcessResult free_run = run_lobe("check " + quoted_path(model), scratch);
  ASSERT_EQ(free_run.exit_code, 0) << free_run.err;
  const auto out = scratch / "out.txt", err = scratch / "err.txt";
  const std::string command = "ulimit -v 1000000; " + std::string(LOBE_EXECUTABLE) + " check " + quoted_path(model) +
                              " > " + quoted_path(out) + " 2> " + quoted_path(err);
  const int status = std::system(command.c_str());
  EXPECT_EQ(WEXITSTATUS(status), 2) << read_text(err);
  EXPECT_NE(read_text(err).find("the address-space limit (ulimit -v)"), std::string::npos) << read_text(err);
}

TEST(BadInput, OutputDirectoryThatIsAFile) {
  const auto scratch = fresh_directory("bad-output");
  const auto file = scratch / "not-a-directory";
  std::ofstream(file) << "keep me";
  const std::string model = std::string(LOBE_SOURCE_DIR) + "/models/half_wave_dipole_ism.lobe";
  const ProcessResult r = run_lobe("run '" + model + "' -o '" + file.string() + "'", scratch);
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_EQ(r.err.rfind("--output:1:1: ", 0), 0u) << r.err;
  EXPECT_EQ(read_text(file), "keep me");
}

TEST(BadInput, UnknownCommandLineOptionExitsTwo) {
  const auto scratch = fresh_directory("bad-option");
  EXPECT_EQ(run_lobe("run --no-such-option x.lobe", scratch).exit_code, 2);
  EXPECT_EQ(run_lobe("", scratch).exit_code, 2);
  EXPECT_EQ(run_lobe("--help", scratch).exit_code, 0);
}

}  // namespace
}  // namespace lobe::testing
