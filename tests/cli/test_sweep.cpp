// Sweeps through the real command line: cases equal single runs, and a sweep killed at
// random moments and resumed ends with the same file as one that ran straight through.
#include <gtest/gtest.h>

#include <fcntl.h>
#include <signal.h>
#include <sys/file.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <fstream>
#include <random>
#include <regex>
#include <thread>

#include "cli/run_process.hpp"
#include "post/band_report.hpp"
#include "cli/result_datasets.hpp"
#include "post/result_reader.hpp"
#include "post/sweep_file.hpp"
#include "post/touchstone.hpp"
#include "support/xml_check.hpp"

namespace lobe::testing {
namespace {

const std::string models = std::string(LOBE_SOURCE_DIR) + "/models/";

// One thread makes every solve bit-for-bit repeatable, so "the same" can mean equal.
TEST(Sweep, OneVariedNameReproducesTheSingleRuns) {
  const auto dir = fresh_directory("sweep-single");
  const ProcessResult r =
      run_lobe("sweep '" + models + "half_wave_dipole_ism.lobe' --vary rod=0.5,2 -o '" + (dir / "s.h5").string() + "' --threads 1", dir);
  ASSERT_EQ(r.exit_code, 0) << r.err;
  int index = 1;
  for (const char* rod : {"0.5", "2"}) {
    const auto out = dir / ("single-" + std::string(rod));
    ASSERT_EQ(run_lobe("run '" + models + "half_wave_dipole_ism.lobe' --set rod=" + rod + " -o '" + out.string() + "' --threads 1", dir)
                  .exit_code,
              0);
    const NetworkData single = read_result_network(out / "half_wave_dipole_ism.h5");
    const NetworkData swept = read_result_network(dir / "s.h5", "/case-00000" + std::to_string(index++));
    ASSERT_EQ(single.frequency_hz.size(), swept.frequency_hz.size());
    for (std::size_t k = 0; k < single.s.size(); ++k) EXPECT_EQ(single.s[k](0, 0), swept.s[k](0, 0)) << rod;
  }
}

/// Starts `lobe ARGS` and returns its process id.
pid_t start_lobe(const std::vector<std::string>& args) {
  const pid_t pid = fork();
  if (pid == 0) {
    std::vector<char*> argv{const_cast<char*>(LOBE_EXECUTABLE)};
    for (const auto& a : args) argv.push_back(const_cast<char*>(a.c_str()));
    argv.push_back(nullptr);
    freopen("/dev/null", "w", stdout);
    freopen("/dev/null", "w", stderr);
    execv(LOBE_EXECUTABLE, argv.data());
    _exit(127);
  }
  return pid;
}

// Kill -9 at random moments several times, then run the same command to the end: the
// file equals an uninterrupted sweep's, case by case, and no partial file is left.
TEST(Sweep, KilledAndResumedEqualsUninterrupted) {
  const auto dir = fresh_directory("sweep-kill");
  const std::string model = models + "ground_plane_433.lobe";
  auto args = [&](const std::string& output) {
    return std::vector<std::string>{"sweep", model, "--vary", "droop=20deg:65deg:5deg", "--vary", "radial=150,160",
                                    "-o", (dir / output).string(), "--threads", "1"};
  };
  std::mt19937 generator(20261202);
  std::uniform_int_distribution<int> delay_ms(150, 900);
  for (int attempt = 0; attempt < 4; ++attempt) {
    const pid_t pid = start_lobe(args("killed.h5"));
    std::this_thread::sleep_for(std::chrono::milliseconds(delay_ms(generator)));
    kill(pid, SIGKILL);
    int status = 0;
    waitpid(pid, &status, 0);
  }
  std::vector<std::string> resume = args("killed.h5");
  resume.push_back("--resume");
  int status = 0;
  waitpid(start_lobe(resume), &status, 0);
  ASSERT_TRUE(WIFEXITED(status) && WEXITSTATUS(status) == 0);
  waitpid(start_lobe(args("straight.h5")), &status, 0);
  ASSERT_TRUE(WIFEXITED(status) && WEXITSTATUS(status) == 0);
  for (int c = 1; c <= 20; ++c) {
    char group[32];
    std::snprintf(group, sizeof group, "/case-%06d", c);
    const NetworkData a = read_result_network(dir / "killed.h5", group), b = read_result_network(dir / "straight.h5", group);
    ASSERT_EQ(a.s.size(), b.s.size()) << group;
    for (std::size_t k = 0; k < a.s.size(); ++k) EXPECT_EQ(a.s[k](0, 0), b.s[k](0, 0)) << group;
  }
  for (const auto& entry : std::filesystem::directory_iterator(dir / "killed.h5.cases"))
    EXPECT_EQ(entry.path().filename().string().find(".partial-"), std::string::npos) << entry.path();
}

/// The number after `label` in `text`.
double number_after(const std::string& text, const std::string& label) {
  const auto at = text.find(label);
  if (at == std::string::npos) return -1.0;
  return std::stod(text.substr(at + label.size()));
}

// tune must do at least as well as a 1 mm grid of the same range (what a sweep finds), and
// the model it writes must give the figure it reports.
TEST(Tune, FindsAtLeastTheBestOfAFineSweep) {
  const auto dir = fresh_directory("tune");
  const std::string model = models + "half_wave_dipole_ism.lobe";
  const ProcessResult swept = run_lobe("sweep '" + model + "' --vary length=150mm:175mm:1mm --rank worst-vswr -o '" +
                                           (dir / "s.h5").string() + "' --threads 1", dir);
  ASSERT_EQ(swept.exit_code, 0) << swept.err;
  const auto first = swept.out.find(" 1. case-");
  ASSERT_NE(first, std::string::npos) << swept.out;
  const double sweep_value = std::stod(swept.out.substr(first + 16));
  const ProcessResult tuned = run_lobe("tune '" + model + "' --vary length=150mm:175mm -o '" + (dir / "t.lobe").string() +
                                           "' --threads 1", dir);
  ASSERT_EQ(tuned.exit_code, 0) << tuned.err;
  const double tuned_value = number_after(tuned.out, "best worst-vswr ");
  EXPECT_LE(tuned_value, sweep_value + 1e-3) << tuned.out << swept.out;
  const ProcessResult rerun = run_lobe("run '" + (dir / "t.lobe").string() + "' -o '" + (dir / "r").string() + "'", dir);
  ASSERT_EQ(rerun.exit_code, 0) << rerun.err;
  EXPECT_NEAR(number_after(rerun.out, ", worst "), tuned_value, 0.006) << rerun.out;  // printed to 3 digits
}

// With --set beside --vary, the written model holds the --set values too, and every value
// in the model's own units (millimetres here, not metres): run on its own it gives the
// figure tune reported (before, it dropped --set and gave another antenna).
TEST(Tune, WrittenModelKeepsSetValuesAndReproducesTheFigure) {
  const auto dir = fresh_directory("tune-set");
  const std::string model = models + "half_wave_dipole_ism.lobe";
  const ProcessResult tuned = run_lobe("tune '" + model + "' --set rod=3 --vary length=150mm:175mm --evaluations 10 -o '" +
                                           (dir / "t.lobe").string() + "' --threads 1", dir);
  ASSERT_EQ(tuned.exit_code, 0) << tuned.err;
  const double tuned_value = number_after(tuned.out, "best worst-vswr ");
  const std::string text = read_text(dir / "t.lobe");
  EXPECT_TRUE(std::regex_search(text, std::regex("let rod += 3 +# set by --set"))) << text;
  EXPECT_TRUE(std::regex_search(text, std::regex("let length = 1[5-7][0-9.]* mm +# tuned"))) << text;
  ASSERT_EQ(run_lobe("run '" + (dir / "t.lobe").string() + "' -o '" + (dir / "r").string() + "' --threads 1", dir).exit_code, 0);
  const NetworkData network = read_result_network(dir / "r" / "t.h5");
  ReflectionCurve curve{network.frequency_hz, {}};
  for (const auto& s : network.s) curve.reflection.push_back(s(0, 0));
  const Real rerun = band_figure(band_report(curve, 863e6, 870e6), "worst-vswr");
  EXPECT_NEAR(rerun, tuned_value, 1e-4 * tuned_value);  // tune prints five digits
}

// Ranking a crossed-dipole sweep by worst VSWR subject to axial ratio <= 3 dB over the band:
// every case listed as meeting the limit does (its worst axial ratio from its own file),
// those come first in ascending worst VSWR, the others say by how much they miss, and a
// best case on the grid's edge is flagged.
TEST(Sweep, RanksByAGoalSubjectToLimits) {
  const auto dir = fresh_directory("sweep-limits");
  const ProcessResult r = run_lobe("sweep '" + models + "crossed_dipole_reflector_137.lobe' --vary arm=480mm,500mm,520mm "
                                   "--vary height=500mm,700mm --rank worst-vswr --limit 'worst-axial-ratio<=3' -o '" +
                                       (dir / "s.h5").string() + "'", dir);
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const std::regex row(R"( *\d+\. case-(\d+)  ([0-9.]+) .*(meets the limits|misses worst-axial-ratio<=3 by ([0-9.e+-]+)))");
  std::istringstream lines(r.out);
  std::string line;
  int rows = 0, meeting = 0;
  bool failing_seen = false;
  double previous_vswr = 0.0;
  while (std::getline(lines, line)) {
    std::smatch m;
    if (!std::regex_match(line, m, row)) continue;
    ++rows;
    const std::size_t c = std::stoul(m[1]) - 1;  // case-000001 is the first
    const BeamCurves beam = read_result_beam(dir / "s.h5", case_group(c));
    const double worst_ar = beam_band_report(beam, 137e6, 138e6).at("axial-ratio").worst;
    const bool meets = m[3] == "meets the limits";
    if (meets) {
      ++meeting;
      EXPECT_FALSE(failing_seen) << r.out;
      EXPECT_LE(worst_ar, 3.0) << line;
      EXPECT_GE(std::stod(m[2]), previous_vswr) << r.out;
      previous_vswr = std::stod(m[2]);
    } else {
      failing_seen = true;
      EXPECT_NEAR(std::stod(m[4]), worst_ar - 3.0, 1e-3 * worst_ar) << line;
    }
  }
  EXPECT_EQ(rows, 6) << r.out;
  EXPECT_GT(meeting, 0) << r.out;
  EXPECT_NE(r.out.find(std::to_string(meeting) + " of 6 cases meet them"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("on the edge of the grid"), std::string::npos) << r.out;
}

// Constrained tuning (COBYLA): the tuned model, run on its own, meets the limit over the
// band (within the optimiser's constraint tolerance, 0.01 dB).
TEST(Tune, ConstrainedTuningMeetsItsLimit) {
  const auto dir = fresh_directory("tune-limits");
  const ProcessResult tuned = run_lobe("tune '" + models + "crossed_dipole_reflector_137.lobe' --vary arm=480mm:560mm "
                                       "--vary height=400mm:700mm --limit 'worst-axial-ratio<=3' --evaluations 25 -o '" +
                                           (dir / "t.lobe").string() + "'", dir);
  ASSERT_EQ(tuned.exit_code, 0) << tuned.err;
  EXPECT_NE(tuned.out.find("subject to worst-axial-ratio<=3"), std::string::npos) << tuned.out;
  EXPECT_EQ(tuned.out.find("no evaluation met every limit"), std::string::npos) << tuned.out;
  ASSERT_EQ(run_lobe("run '" + (dir / "t.lobe").string() + "' -o '" + (dir / "r").string() + "'", dir).exit_code, 0);
  const BeamCurves beam = read_result_beam(dir / "r" / "t.h5");
  EXPECT_LE(beam_band_report(beam, 137e6, 138e6).at("axial-ratio").worst, 3.01);
}

// Giving one name twice would silently use the first value: refused, naming the option.
TEST(Sweep, ANameGivenTwiceIsRefused) {
  const auto dir = fresh_directory("sweep-twice");
  const std::string model = models + "half_wave_dipole_ism.lobe";
  const std::string out = " -o '" + (dir / "s.h5").string() + "'";
  for (const auto& [args, where] : std::vector<std::pair<std::string, std::string>>{
           {"sweep '" + model + "' --set length=150mm --vary length=100mm,170mm" + out, "--vary:1:"},
           {"sweep '" + model + "' --vary length=100mm,170mm --vary length=1mm,2mm" + out, "--vary:2:"},
           {"tune '" + model + "' --set length=150mm --vary length=150mm:170mm -o '" + (dir / "t.lobe").string() + "'", "--vary:1:"},
           {"run '" + model + "' --set rod=1 --set rod=2 -o '" + (dir / "r").string() + "'", "--set:2:"}}) {
    const ProcessResult r = run_lobe(args, dir);
    EXPECT_EQ(r.exit_code, 2) << args;
    EXPECT_EQ(r.err.rfind(where, 0), 0u) << r.err;
    EXPECT_NE(r.err.find("is given twice"), std::string::npos) << r.err;
  }
  EXPECT_FALSE(std::filesystem::exists(dir / "s.h5"));
  EXPECT_FALSE(std::filesystem::exists(dir / "t.lobe"));
}

// A sweep shows the mesher's warnings (each distinct one once), as run does.
TEST(Sweep, ShowsTheMeshWarningsOfItsCases) {
  const auto dir = fresh_directory("sweep-warnings");
  const ProcessResult r = run_lobe("sweep '" + models + "half_wave_dipole_ism.lobe' --vary rod=3,3.0 -o '" +
                                       (dir / "s.h5").string() + "'", dir);
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const auto first = r.err.find("radii long");
  ASSERT_NE(first, std::string::npos) << r.err;
  EXPECT_EQ(r.err.find("radii long", first + 1), std::string::npos) << r.err;
}

// A sweep file given to export or compare is named as such, with how to pick a case; with
// --case the case is exported like a single result, and -o may name a directory.
TEST(Sweep, ExportAndCompareTakeACaseOfASweepFile) {
  const auto dir = fresh_directory("sweep-case");
  const auto sweep = dir / "s.h5";
  ASSERT_EQ(run_lobe("sweep '" + models + "half_wave_dipole_ism.lobe' --vary rod=0.5,2 -o '" + sweep.string() + "'", dir).exit_code, 0);
  const std::string measured = " '" + models + "ground_plane_433_measured.csv'";
  for (const std::string& command : {"export '" + sweep.string() + "' --touchstone", "compare '" + sweep.string() + "'" + measured}) {
    const ProcessResult r = run_lobe(command, dir);
    EXPECT_EQ(r.exit_code, 2) << command;
    EXPECT_NE(r.err.find("this is a sweep file of 2 cases; pick one with --case case-000001"), std::string::npos) << r.err;
  }
  std::filesystem::create_directories(dir / "out");
  const ProcessResult exported =
      run_lobe("export '" + sweep.string() + "' --touchstone --case case-000002 -o '" + (dir / "out").string() + "'", dir);
  ASSERT_EQ(exported.exit_code, 0) << exported.err;
  const NetworkData written = read_touchstone(dir / "out" / "s_case-000002.s1p");
  const NetworkData second = read_result_network(sweep, "/case-000002");
  ASSERT_EQ(written.s.size(), second.s.size());
  EXPECT_EQ(written.s.back()(0, 0), second.s.back()(0, 0));  // written to full precision
  EXPECT_EQ(run_lobe("export '" + sweep.string() + "' --touchstone --case case-000009", dir).exit_code, 2);
}

// Two sweeps on one output: the second is refused while the first holds the case folder's
// lock (it once deleted the first's case in flight). Temporaries of processes that are gone
// are removed at start, those of a running process are left alone; run cleans its own.
TEST(Sweep, OneSweepPerOutputAndOnlyDeadTemporariesRemoved) {
  const auto dir = fresh_directory("sweep-lock");
  const std::string model = "'" + models + "half_wave_dipole_ism.lobe'";
  const auto cases = dir / "s.h5.cases";
  std::filesystem::create_directories(cases);
  {
    const int fd = ::open((cases / ".lock").c_str(), O_RDWR | O_CREAT, 0644);
    ASSERT_GE(fd, 0);
    ASSERT_EQ(::flock(fd, LOCK_EX), 0);  // as a running sweep holds it
    const ProcessResult r = run_lobe("sweep " + model + " --vary rod=1,2 -o '" + (dir / "s.h5").string() + "'", dir);
    EXPECT_EQ(r.exit_code, 2) << r.err;
    EXPECT_NE(r.err.find("another sweep is writing into"), std::string::npos) << r.err;
    ::close(fd);
  }
  const pid_t gone = 4194303;  // above any pid_max here: no such process
  const std::string live = std::to_string(::getpid());
  for (const std::string& name : {".case-000001.h5.partial-" + std::to_string(gone), ".case-000009.h5.partial-" + live})
    std::ofstream(cases / name) << "half-written";
  ASSERT_EQ(run_lobe("sweep " + model + " --vary rod=1,2 -o '" + (dir / "s.h5").string() + "'", dir).exit_code, 0);
  EXPECT_FALSE(std::filesystem::exists(cases / (".case-000001.h5.partial-" + std::to_string(gone))));
  EXPECT_TRUE(std::filesystem::exists(cases / (".case-000009.h5.partial-" + live)));
  const auto out = dir / "run";
  std::filesystem::create_directories(out);
  std::ofstream(out / (".half_wave_dipole_ism.h5.partial-" + std::to_string(gone))) << std::string(1000, 'x');
  ASSERT_EQ(run_lobe("run " + model + " -o '" + out.string() + "'", dir).exit_code, 0);
  EXPECT_FALSE(std::filesystem::exists(out / (".half_wave_dipole_ism.h5.partial-" + std::to_string(gone))));
}

// A case file damaged after it was published (truncated here) is named on resume and solved
// again, and the sweep ends as an undamaged one would.
TEST(Sweep, DamagedCaseFileIsSolvedAgainOnResume) {
  const auto dir = fresh_directory("sweep-damaged");
  const std::string command = "sweep '" + models + "half_wave_dipole_ism.lobe' --vary rod=1,2 -o '" + (dir / "s.h5").string() +
                              "' --threads 1";
  ASSERT_EQ(run_lobe(command, dir).exit_code, 0);
  const auto damaged = dir / "s.h5.cases" / "case-000002.h5";
  const NetworkData before = read_result_network(damaged);
  std::filesystem::resize_file(damaged, std::filesystem::file_size(damaged) / 3);
  const ProcessResult r = run_lobe(command, dir);
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_NE(r.err.find("case-000002.h5 is damaged"), std::string::npos) << r.err;
  EXPECT_NE(r.out.find("(1 solved now, 1 from before)"), std::string::npos) << r.out;
  EXPECT_EQ(read_result_network(damaged).s.back()(0, 0), before.s.back()(0, 0));
}

// plot on a sweep file maps the band figure of every case, each recomputed here from the
// case's own S11, and names the best case.
TEST(Sweep, PlotMapsTheBandFigureOfEveryCase) {
  const auto dir = fresh_directory("sweep-map");
  const auto sweep = dir / "s.h5";
  ASSERT_EQ(run_lobe("sweep '" + models + "half_wave_dipole_ism.lobe' --vary length=155mm:165mm:5mm --vary rod=0.5,2 -o '" +
                         sweep.string() + "'", dir).exit_code, 0);
  const ProcessResult r = run_lobe("plot '" + sweep.string() + "' -o '" + (dir / "figures").string() + "'", dir);
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const std::string svg = read_text(dir / "figures" / "s_worst_vswr_map.svg");
  EXPECT_EQ(xml_error(svg), "");
  const char* lengths[] = {"155 mm", "160 mm", "165 mm"};
  const char* rods[] = {"0.5", "2"};
  double best = 1e300;
  std::string best_case;
  for (int c = 0; c < 6; ++c) {
    const std::string group = "/case-00000" + std::to_string(c + 1);
    const NetworkData network = read_result_network(sweep, group);
    ReflectionCurve curve{network.frequency_hz, {}};
    for (const auto& s : network.s) curve.reflection.push_back(s(0, 0));
    const double worst = band_report(curve, 863e6, 870e6).highest_vswr.value;  // the model's band srd
    char tooltip[96];
    std::snprintf(tooltip, sizeof tooltip, "<title>%s, %s: %.4g</title>", lengths[c / 2], rods[c % 2], worst);
    EXPECT_NE(svg.find(tooltip), std::string::npos) << tooltip;
    if (worst < best) best = worst, best_case = group.substr(1);
  }
  EXPECT_NE(r.out.find("best case by worst-vswr: " + best_case), std::string::npos) << r.out;

  // Over one name, the other held at the best case's value: one row of three cells.
  const ProcessResult one = run_lobe("plot '" + sweep.string() + "' --axes length --figure mean-vswr", dir);
  ASSERT_EQ(one.exit_code, 0) << one.err;
  const std::string row = read_text(dir / "s_mean_vswr_map.svg");
  std::size_t cells = 0;
  for (auto at = row.find("<title>"); at != std::string::npos; at = row.find("<title>", at + 1)) ++cells;
  EXPECT_EQ(cells, 3u);
  EXPECT_NE(row.find("other names held at the best case's values: rod = "), std::string::npos);

  EXPECT_EQ(run_lobe("plot '" + sweep.string() + "' --axes nosuch", dir).exit_code, 2);
  EXPECT_EQ(run_lobe("plot '" + sweep.string() + "' --axes rod,rod", dir).exit_code, 2);
  EXPECT_EQ(run_lobe("plot '" + sweep.string() + "' --band 1GHz:2GHz", dir).exit_code, 2);
  EXPECT_EQ(run_lobe("plot '" + sweep.string() + "' --measured '" + models + "ground_plane_433_measured.csv'", dir).exit_code, 2);
  EXPECT_EQ(run_lobe("plot '" + (dir / "s.h5.cases" / "case-000001.h5").string() + "' --figure mean-vswr", dir).exit_code, 2);
}

TEST(Sweep, BadVaryOptionsAreInputErrors) {
  const auto dir = fresh_directory("sweep-bad");
  for (const char* vary : {"rod", "rod=1:0:1", "rod=1mm:2MHz:1mm", "nosuch=1,2", "rod=1,,2"}) {
    const ProcessResult r = run_lobe("sweep '" + models + "half_wave_dipole_ism.lobe' --vary '" + std::string(vary) + "' -o '" +
                                         (dir / "x.h5").string() + "'",
                                     dir);
    EXPECT_EQ(r.exit_code, 2) << vary << ": " << r.err;
    EXPECT_FALSE(std::filesystem::exists(dir / "x.h5.cases")) << vary;
  }
}

// Ctrl-C during a search stops it at the next frequency and writes the best model found so
// far, exit 130, rather than losing every evaluation made.
TEST(Tune, InterruptWritesTheBestSoFar) {
  const auto dir = fresh_directory("tune-interrupt");
  // Many frequencies make each evaluation last about a second here: the search (ten or more
  // evaluations) is still running when the first is reported.
  std::ofstream(dir / "slow.lobe") << "let length = 170 mm\n"
                                      "wire d from (0, 0, -length/2) to (0, 0, length/2) radius 0.1 mm segments 101\n"
                                      "port p on d at middle\nfrequency 800 MHz to 900 MHz count 300\n";
  const auto err = dir / "err.txt";
  const pid_t pid = fork();
  if (pid == 0) {
    freopen("/dev/null", "w", stdout);
    freopen(err.c_str(), "w", stderr);
    execl(LOBE_EXECUTABLE, LOBE_EXECUTABLE, "tune", (dir / "slow.lobe").c_str(), "--vary", "length=150mm:175mm",
          "--evaluations", "1000", "-o", (dir / "t.lobe").c_str(), "--threads", "1", static_cast<char*>(nullptr));
    _exit(127);
  }
  for (int waited = 0; waited < 600 && read_text(err).find("evaluation 1:") == std::string::npos; ++waited)
    std::this_thread::sleep_for(std::chrono::milliseconds(100));
  kill(pid, SIGINT);
  int status = 0;
  waitpid(pid, &status, 0);
  ASSERT_TRUE(WIFEXITED(status)) << "ended by a signal";
  EXPECT_EQ(WEXITSTATUS(status), 130) << read_text(err);
  EXPECT_NE(read_text(err).find("interrupted: the best of"), std::string::npos) << read_text(err);
  EXPECT_NE(read_text(dir / "t.lobe").find("tuned by lobe"), std::string::npos);
}

// A value inside the range that the model refuses (here the wire's length vanishes at the
// middle, where the search starts) is reported as the model's error, located, exit 2 — not
// as a bare failure of the optimiser.
TEST(Tune, AModelErrorInsideTheRangeIsReportedAsSuch) {
  const auto dir = fresh_directory("tune-inner-error");
  std::ofstream(dir / "pinched.lobe") << "let L = 0.3 m\n"
                                         "wire d from (0, 0, 0) to (0, 0, (L - 0.5 m) * (L - 0.5 m) / 1 m) radius 0.1 mm "
                                         "segments 3\nport p on d at middle\nfrequency 400 MHz\n";
  const ProcessResult r = run_lobe("tune '" + (dir / "pinched.lobe").string() + "' --vary L=0.4m:0.6m --evaluations 3 -o '" +
                                       (dir / "t.lobe").string() + "'",
                                   dir);
  EXPECT_EQ(r.exit_code, 2) << r.err;
  EXPECT_NE(r.err.find("pinched.lobe:2:1: wire 'd' has a piece of zero length"), std::string::npos) << r.err;
  EXPECT_FALSE(std::filesystem::exists(dir / "t.lobe"));
}

// The study layer refuses, before the first solve (exit 2, no case written): a ranking band
// that one case's frequencies do not reach (the band is judged against every case, not
// only the first), an unwritable output, and a grid of more cases than allowed.
TEST(Sweep, StudyChecksComeBeforeAnySolving) {
  const auto dir = fresh_directory("sweep-checks");
  std::ofstream(dir / "tuned_by_f.lobe") << "let f0 = 400 MHz\nlet r = 1 mm\n"
                                            "wire d from (0, 0, -0.17) to (0, 0, 0.17) radius r segments 11\n"
                                            "port p on d at middle\nfrequency f0 to f0 + 20 MHz count 3\n";
  const std::string model = "'" + (dir / "tuned_by_f.lobe").string() + "'";
  const ProcessResult band = run_lobe("sweep " + model + " --vary f0=400MHz,800MHz --rank worst-vswr --band 400MHz:420MHz -o '" +
                                          (dir / "a.h5").string() + "'",
                                      dir);
  EXPECT_EQ(band.exit_code, 2) << band.err;
  EXPECT_NE(band.err.find("--band"), std::string::npos) << band.err;
  EXPECT_FALSE(std::filesystem::exists(dir / "a.h5.cases"));

  std::ofstream(dir / "plain-file") << "x";
  const ProcessResult unwritable =
      run_lobe("sweep " + model + " --vary f0=400MHz,410MHz -o '" + (dir / "plain-file" / "b.h5").string() + "'", dir);
  EXPECT_EQ(unwritable.exit_code, 2) << unwritable.err;

  const ProcessResult oversize = run_lobe("sweep " + model + " --vary f0=400MHz:500MHz:0.1MHz --vary r=1mm:2mm:0.001mm -o '" +
                                              (dir / "c.h5").string() + "'",
                                          dir);
  EXPECT_EQ(oversize.exit_code, 2) << oversize.err;
  EXPECT_FALSE(std::filesystem::exists(dir / "c.h5.cases"));
}


// `lobe bench --quick` measures, prints its table and writes one CSV line per model and one
// for the sweep, with positive rates; a table file not ending in .csv is refused first.
TEST(Bench, QuickRunPrintsTheTableAndWritesTheCsv) {
  const auto dir = fresh_directory("bench");
  const ProcessResult result = run_lobe("bench --quick -o '" + (dir / "b.csv").string() + "'", dir);
  ASSERT_EQ(result.exit_code, 0) << result.err;
  EXPECT_NE(result.out.find("zgemm"), std::string::npos);
  EXPECT_NE(result.out.find("variants an hour"), std::string::npos);
  std::ifstream csv(dir / "b.csv");
  std::string line;
  std::vector<std::string> lines;
  while (std::getline(csv, line)) lines.push_back(line);
  ASSERT_EQ(lines.size(), 4u);  // header, two models, the sweep
  EXPECT_EQ(lines[0].rfind("model,unknowns,setup_s,fill_s", 0), 0u);
  const auto fields = [](const std::string& l) { return std::count(l.begin(), l.end(), ',') + 1; };
  for (const std::string& l : lines) EXPECT_EQ(fields(l), fields(lines[0])) << l;
  // The wire model's row: unknowns, then a positive fill time.
  EXPECT_GT(std::stod(lines[1].substr(lines[1].find(',') + 1)), 100.0);
  const ProcessResult refused = run_lobe("bench --quick -o '" + (dir / "b.txt").string() + "'", dir);
  EXPECT_EQ(refused.exit_code, 2);
  EXPECT_NE(refused.err.find("must end in .csv"), std::string::npos);
}


// A run of 31 frequencies is adaptive by default: the summary says how many were solved,
// the HDF5 file marks them, and the reflection agrees with --every-frequency's within the
// 0.01 the speed issue sets; --every-frequency solves and marks all 31.
TEST(AdaptiveRun, MarksSolvedFrequenciesAndAgreesWithEveryFrequency) {
  const auto dir = fresh_directory("adaptive-run");
  const std::string model = models + "crossed_dipole_gnss.lobe";
  const ProcessResult adaptive = run_lobe("run '" + model + "' -o '" + (dir / "a").string() + "'", dir);
  const ProcessResult every = run_lobe("run '" + model + "' --every-frequency -o '" + (dir / "e").string() + "'", dir);
  ASSERT_EQ(adaptive.exit_code, 0) << adaptive.err;
  ASSERT_EQ(every.exit_code, 0) << every.err;
  const std::vector<Real> solved = dataset(dir / "a" / "crossed_dipole_gnss.h5", "solver/solved");
  const std::vector<Real> all = dataset(dir / "e" / "crossed_dipole_gnss.h5", "solver/solved");
  ASSERT_EQ(solved.size(), 31u);
  const auto count = static_cast<std::size_t>(std::count(solved.begin(), solved.end(), 1.0));
  EXPECT_LT(count, 31u);
  EXPECT_EQ(solved.front(), 1.0);  // the ends are always solved
  EXPECT_EQ(solved.back(), 1.0);
  EXPECT_EQ(std::count(all.begin(), all.end(), 1.0), 31);
  EXPECT_NE(adaptive.out.find(std::to_string(count) + " of 31 solved in full"), std::string::npos) << adaptive.out;
  EXPECT_EQ(every.out.find("solved in full"), std::string::npos);
  const std::vector<Complex> a = complex_dataset(dir / "a" / "crossed_dipole_gnss.h5", "ports/reflection");
  const std::vector<Complex> e = complex_dataset(dir / "e" / "crossed_dipole_gnss.h5", "ports/reflection");
  ASSERT_EQ(a.size(), e.size());
  ASSERT_FALSE(a.empty());
  for (std::size_t i = 0; i < a.size(); ++i) {
    EXPECT_NEAR(a[i].real(), e[i].real(), 0.01) << "reflection at " << i;
    EXPECT_NEAR(a[i].imag(), e[i].imag(), 0.01) << "reflection at " << i;
  }
}

}  // namespace
}  // namespace lobe::testing
