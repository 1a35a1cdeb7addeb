// A sweep spread over two MPI processes on this machine (Open MPI, loopback): the same
// case results as one process, bit for bit (one thread each makes solves repeatable), one
// sweep file, and a resumed run solves only what is missing; a sweep of one case shares
// its frequencies between the processes instead.
#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>

#include "cli/run_process.hpp"
#include "cli/result_datasets.hpp"

namespace lobe::testing {
namespace {

const std::string models = std::string(LOBE_SOURCE_DIR) + "/models/";

/// mpirun for two processes on this machine only: TCP over loopback (shared memory is not
/// always there in containers), root allowed (CI runs as root), slots not counted.
const std::string two_processes =
    std::string(LOBE_MPIRUN) + " -np 2 --oversubscribe --allow-run-as-root --mca btl self,tcp --mca btl_tcp_if_include lo";

TEST(MpiSweep, TwoProcessesGiveOneProcessesCases) {
  const auto dir = fresh_directory("mpi-sweep");
  const std::string sweep = "sweep '" + models + "half_wave_dipole_ism.lobe' --vary rod=1,1.5,2,2.5,3 --threads 1 -o '";
  const ProcessResult one = run_lobe(sweep + (dir / "one.h5").string() + "'", dir / "one");
  ASSERT_EQ(one.exit_code, 0) << one.err;
  const ProcessResult two = run_lobe(sweep + (dir / "two.h5").string() + "'", dir / "two", 0, two_processes);
  ASSERT_EQ(two.exit_code, 0) << two.out << two.err;
  // One report, from the first process.
  EXPECT_NE(two.out.find("5 cases (5 solved now, 0 from before)"), std::string::npos) << two.out;
  EXPECT_TRUE(std::filesystem::exists(dir / "two.h5"));
  for (int c = 1; c <= 5; ++c) {
    const std::string name = "case-00000" + std::to_string(c) + ".h5";
    for (const char* part : {"ports/reflection_re", "ports/reflection_im", "pattern/gain_dbi"})
      EXPECT_EQ(dataset(dir / "one.h5.cases" / name, part), dataset(dir / "two.h5.cases" / name, part)) << name << " " << part;
  }
  // Two cases lost: the same command solves those two and assembles the file again.
  std::filesystem::remove(dir / "two.h5");
  std::filesystem::remove(dir / "two.h5.cases" / "case-000002.h5");
  std::filesystem::remove(dir / "two.h5.cases" / "case-000005.h5");
  const ProcessResult resumed = run_lobe(sweep + (dir / "two.h5").string() + "'", dir / "two", 0, two_processes);
  ASSERT_EQ(resumed.exit_code, 0) << resumed.err;
  EXPECT_NE(resumed.out.find("5 cases (2 solved now, 3 from before)"), std::string::npos) << resumed.out;
  EXPECT_TRUE(std::filesystem::exists(dir / "two.h5"));
}

TEST(MpiSweep, OneCaseSharesItsFrequenciesBetweenTwoProcesses) {
  const auto dir = fresh_directory("mpi-frequencies");
  // 21 frequencies: sampled adaptively, so the processes also share each round's solves.
  const std::string sweep = "sweep '" + models + "half_wave_dipole_ism.lobe' --vary rod=2 --threads 1 -o '";
  const ProcessResult one = run_lobe(sweep + (dir / "one.h5").string() + "'", dir / "one");
  ASSERT_EQ(one.exit_code, 0) << one.err;
  const ProcessResult two = run_lobe(sweep + (dir / "two.h5").string() + "'", dir / "two", 0, two_processes);
  ASSERT_EQ(two.exit_code, 0) << two.out << two.err;
  EXPECT_NE(two.out.find("1 cases (1 solved now, 0 from before)"), std::string::npos) << two.out;
  const auto case_file = [&](const char* run) { return dir / (std::string(run) + ".h5.cases") / "case-000001.h5"; };
  EXPECT_EQ(root_int_attribute(case_file("one"), "processes"), 1);
  EXPECT_EQ(root_int_attribute(case_file("two"), "processes"), 2);
  for (const char* part : {"ports/reflection_re", "ports/reflection_im", "pattern/gain_dbi", "solver/solved"})
    EXPECT_EQ(dataset(case_file("one"), part), dataset(case_file("two"), part)) << part;
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
