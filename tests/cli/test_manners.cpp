// The command line's manners: a mistyped command is named with the nearest real one, `lobe
// help COMMAND` explains one, usage lines say `lobe`, exit codes are listed, `-o -` sends a
// single file to standard output (and is refused where several files are written), and the
// progress line on a terminal is erased, not left among the output.
#include <gtest/gtest.h>

#include "cli/run_process.hpp"

namespace lobe::testing {
namespace {

const std::string models = std::string(LOBE_SOURCE_DIR) + "/models/";

TEST(Manners, AMistypedCommandIsNamedWithTheNearest) {
  const auto dir = fresh_directory("manners-typo");
  const ProcessResult r = run_lobe("rnu '" + models + "yagi_3el_144.lobe'", dir);
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("'rnu' is not a lobe command; did you mean 'run'?"), std::string::npos) << r.err;
  const ProcessResult far = run_lobe("simulate x", dir);
  EXPECT_EQ(far.exit_code, 2);
  EXPECT_NE(far.err.find("'simulate' is not a lobe command"), std::string::npos) << far.err;
  EXPECT_EQ(far.err.find("did you mean"), std::string::npos) << far.err;  // nothing near enough
}

TEST(Manners, HelpNamesTheProgramAndTheExitCodes) {
  const auto dir = fresh_directory("manners-help");
  const ProcessResult run = run_lobe("help run", dir);
  EXPECT_EQ(run.exit_code, 0);
  EXPECT_NE(run.out.find("Usage: lobe run [OPTIONS] MODEL"), std::string::npos) << run.out;
  const ProcessResult all = run_lobe("--help", dir);
  EXPECT_EQ(all.exit_code, 0);
  EXPECT_NE(all.out.find("Usage: lobe [OPTIONS] SUBCOMMAND"), std::string::npos) << all.out;
  EXPECT_NE(all.out.find("Exit codes: 0 done; 1 "), std::string::npos) << all.out;
  EXPECT_NE(all.out.find("plates and bodies"), std::string::npos) << all.out;
  EXPECT_EQ(all.out.find(LOBE_EXECUTABLE), std::string::npos) << "the build path in the usage line";
  EXPECT_EQ(run_lobe("help nosuch", dir).exit_code, 2);
}

// --version names the commit the binary was built from (the build finds it at every build).
TEST(Manners, VersionNamesTheCommit) {
  const auto dir = fresh_directory("manners-version");
  const ProcessResult r = run_lobe("--version", dir);
  EXPECT_EQ(r.exit_code, 0);
  const std::string git = "git -C '" + std::string(LOBE_SOURCE_DIR) + "' rev-parse --short=12 HEAD > '" +
                          (dir / "commit.txt").string() + "' 2>/dev/null";
  ASSERT_EQ(std::system(git.c_str()), 0) << "the tests run from a git checkout";
  std::string commit = read_text(dir / "commit.txt");
  commit.erase(commit.find_last_not_of("\n") + 1);
  EXPECT_EQ(r.out.rfind("lobe " LOBE_VERSION " (commit " + commit, 0), 0u) << r.out;
}

// `-o -` puts the one file on standard output, the same bytes the file would hold, and makes
// no file named "-" (it once did).
TEST(Manners, DashSendsASingleFileToStandardOutput) {
  const auto dir = fresh_directory("manners-dash");
  ASSERT_EQ(run_lobe("run '" + models + "yagi_3el_144.lobe' -o '" + (dir / "out").string() + "'", dir).exit_code, 0);
  const std::string result = (dir / "out" / "yagi_3el_144.h5").string();
  ASSERT_EQ(run_lobe("export '" + result + "' --touchstone -o '" + (dir / "y.s1p").string() + "'", dir).exit_code, 0);
  const ProcessResult dash = run_lobe("export '" + result + "' --touchstone -o -", dir);
  ASSERT_EQ(dash.exit_code, 0) << dash.err;
  EXPECT_EQ(dash.out, read_text(dir / "y.s1p"));
  const ProcessResult mesh = run_lobe("mesh '" + models + "yagi_3el_144.lobe' -o -", dir);
  ASSERT_EQ(mesh.exit_code, 0) << mesh.err;
  EXPECT_EQ(mesh.out.rfind("<?xml", 0), 0u);
  // tune: the tuned model on standard output, its report on standard error.
  const ProcessResult tuned = run_lobe("tune '" + models + "half_wave_dipole_ism.lobe' --vary length=150mm:175mm "
                                       "--evaluations 5 -o -", dir);
  ASSERT_EQ(tuned.exit_code, 0) << tuned.err;
  EXPECT_NE(tuned.out.find("# tuned by lobe"), std::string::npos) << tuned.out;
  EXPECT_NE(tuned.err.find("best worst-vswr"), std::string::npos) << tuned.err;
  EXPECT_EQ(tuned.out.find("best worst-vswr"), std::string::npos);
  // Where a command writes several files, "-" is refused before any work.
  const ProcessResult run = run_lobe("run '" + models + "yagi_3el_144.lobe' -o -", dir);
  EXPECT_EQ(run.exit_code, 2);
  EXPECT_EQ(run.err.rfind("--output:1:1: '-' sends one file to standard output", 0), 0u) << run.err;
  EXPECT_FALSE(std::filesystem::exists("-"));
  EXPECT_FALSE(std::filesystem::exists(dir / "-"));
}

// On a terminal (a pseudo-terminal from util-linux's `script`), the progress line is redrawn
// in place and erased before the summary: no progress text follows the summary's first line.
TEST(Manners, TheProgressLineIsErasedOnATerminal) {
  const auto dir = fresh_directory("manners-progress");
  const auto transcript = dir / "typescript";
  const std::string command = "script -qec \"" + std::string(LOBE_EXECUTABLE) + " run '" + models +
                              "yagi_3el_144.lobe' -o '" + (dir / "out").string() + "'\" '" + transcript.string() +
                              "' > /dev/null 2>&1";
  ASSERT_EQ(std::system(command.c_str()), 0);
  const std::string seen = read_text(transcript);
  const std::size_t erase = seen.rfind("\r\033[K"), summary = seen.find("frequency      port");
  ASSERT_NE(erase, std::string::npos) << seen;
  ASSERT_NE(summary, std::string::npos) << seen;
  EXPECT_LT(erase, summary);
  EXPECT_EQ(seen.find("elapsed", summary), std::string::npos) << "progress after the summary began";
}

}  // namespace
}  // namespace lobe::testing
