// A sweep spread over two MPI processes on this machine (Open MPI, loopback): the same
// case results as one process, bit for bit (one thread each makes solves repeatable), one
// sweep file, and a resumed run solves only what is missing; a sweep of one case shares
// its frequencies between the processes instead.
#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>
#include <string>
#include <vector>

#include "cli/run_process.hpp"
#include "cli/result_datasets.hpp"

namespace lobe::testing {
namespace {

const std::string models = std::string(LOBE_SOURCE_DIR) + "/models/";

/// mpirun for two processes on this machine only: TCP over loopback (shared memory is not
/// always there in containers), root allowed (CI runs as root), slots not counted.
const std::string two_processes =
    std::string(LOBE_MPIRUN) + " -np 2 --oversubscribe --allow-run-as-root --mca btl self,tcp --mca btl_tcp_if_include lo";

/// The demo dipole swept over `vary`, one thread a process, into `output`.
std::string sweep_command(const std::string& vary, const std::filesystem::path& output) {
  return "sweep '" + models + "half_wave_dipole_ism.lobe' --vary " + vary + " --threads 1 -o '" + output.string() + "'";
}

/// Runs the sweep in one process into one.h5 and in two into two.h5, both to success; the
/// two processes' output.
ProcessResult sweep_in_one_and_two(const std::filesystem::path& dir, const std::string& vary) {
  const ProcessResult one = run_lobe(sweep_command(vary, dir / "one.h5"), dir / "one");
  EXPECT_EQ(one.exit_code, 0) << one.err;
  const ProcessResult two = run_lobe(sweep_command(vary, dir / "two.h5"), dir / "two", 0, two_processes);
  EXPECT_EQ(two.exit_code, 0) << two.out << two.err;
  return two;
}

/// The case file `name` holds the same `parts` and port reflections in both sweeps, bit for bit.
void expect_same_case(const std::filesystem::path& dir, const std::string& name, const std::vector<std::string>& parts) {
  for (const std::string& part : parts)
    EXPECT_EQ(dataset(dir / "one.h5.cases" / name, part), dataset(dir / "two.h5.cases" / name, part)) << name << " " << part;
  EXPECT_EQ(complex_dataset(dir / "one.h5.cases" / name, "ports/reflection"),
            complex_dataset(dir / "two.h5.cases" / name, "ports/reflection"))
      << name;
}

TEST(MpiSweep, TwoProcessesGiveOneProcessesCases) {
  const auto dir = fresh_directory("mpi-sweep");
  const ProcessResult two = sweep_in_one_and_two(dir, "rod=1,1.5,2,2.5,3");
  // One report, from the first process.
  EXPECT_NE(two.out.find("5 cases (5 solved now, 0 from before)"), std::string::npos) << two.out;
  EXPECT_TRUE(std::filesystem::exists(dir / "two.h5"));
  for (int c = 1; c <= 5; ++c)
    expect_same_case(dir, "case-00000" + std::to_string(c) + ".h5",
                     {"pattern/gain_dbi"});
  // Two cases lost: the same command solves those two and assembles the file again.
  std::filesystem::remove(dir / "two.h5");
  std::filesystem::remove(dir / "two.h5.cases" / "case-000002.h5");
  std::filesystem::remove(dir / "two.h5.cases" / "case-000005.h5");
  const ProcessResult resumed =
      run_lobe(sweep_command("rod=1,1.5,2,2.5,3", dir / "two.h5"), dir / "two", 0, two_processes);
  ASSERT_EQ(resumed.exit_code, 0) << resumed.err;
  EXPECT_NE(resumed.out.find("5 cases (2 solved now, 3 from before)"), std::string::npos) << resumed.out;
  EXPECT_TRUE(std::filesystem::exists(dir / "two.h5"));
}

TEST(MpiSweep, OneCaseSharesItsFrequenciesBetweenTwoProcesses) {
  const auto dir = fresh_directory("mpi-frequencies");
  // 21 frequencies: sampled adaptively, so the processes also share each round's solves.
  const ProcessResult two = sweep_in_one_and_two(dir, "rod=2");
  EXPECT_NE(two.out.find("1 cases (1 solved now, 0 from before)"), std::string::npos) << two.out;
  const auto case_file = [&](const char* run) { return dir / (std::string(run) + ".h5.cases") / "case-000001.h5"; };
  EXPECT_EQ(root_int_attribute(case_file("one"), "processes"), 1);
  EXPECT_EQ(root_int_attribute(case_file("two"), "processes"), 2);
  expect_same_case(dir, "case-000001.h5", {"pattern/gain_dbi", "solver/solved"});
}

TEST(MpiSweep, OtherCommandsRefuseToRunUnderMpirun) {
  const auto dir = fresh_directory("mpi-run");
  const ProcessResult r =
      run_lobe("run '" + models + "half_wave_dipole_ism.lobe' -o '" + (dir / "r").string() + "'", dir, 0, two_processes);
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("only 'lobe sweep' runs under mpirun"), std::string::npos) << r.err;
  EXPECT_FALSE(std::filesystem::exists(dir / "r"));
}

}  // namespace
}  // namespace lobe::testing
