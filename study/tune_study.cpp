#include "study/tune_study.hpp"

#include <nlopt.hpp>

#include <algorithm>
#include <exception>
#include <optional>

#include "core/formatted_text.hpp"
#include "core/number_text.hpp"
#include "post/band_report.hpp"
#include "post/frequency_result.hpp"
#include "post/output_files.hpp"
#include "study/frequency_loop.hpp"
#include "study/model_loading.hpp"
#include "study/model_text.hpp"
#include "study/output_checks.hpp"

namespace lobe {
namespace {


std::vector<std::string> names_of(const std::vector<TunedName>& tuned) {
  std::vector<std::string> names;
  for (const auto& t : tuned) names.push_back(t.name);
  return names;
}

/// The goal's value for one set of overrides: a band figure of the first port.
struct Evaluator {
  const PreparedTuning& tuning;
  const StudyControl& control;
  const std::vector<TunedName>& tuned;
  int evaluations = 0;
  std::exception_ptr failure;
  Real best = 1e300;
  std::vector<std::string> best_values;
  std::vector<Real> best_si;

  std::vector<Real> si_of(const std::vector<double>& x) const {
    std::vector<Real> si;
    for (std::size_t i = 0; i < tuned.size(); ++i) si.push_back(tuned[i].low + x[i] * (tuned[i].high - tuned[i].low));
    return si;
  }
  std::vector<std::string> values_of(const std::vector<double>& x) const {
    std::vector<std::string> texts;
    for (std::size_t i = 0; i < tuned.size(); ++i) texts.push_back(exact_text(si_of(x)[i]) + tuned[i].unit);
    return texts;
  }

  /// The goal at these values, or nothing when cancelled before the last frequency.
  std::optional<Real> goal(const std::vector<std::string>& values) {
    const TuneRequest& r = tuning.request;
    const Model model = load_model(r.model_path, overrides_with(r.set_options, names_of(tuned), values));
    const AntennaProblem problem(model);
    require_solvable(problem);
    ReflectionCurve curve{model.frequencies_hz, std::vector<Complex>(model.frequencies_hz.size())};
    const StudyControl frequencies{control.cancel, {}, {}, {}, {}};
    const bool whole = solve_each_frequency(problem, frequencies, [&](std::size_t index, FrequencySolution&& solution) {
      curve.reflection[index] = port_results(solution, model.reference_ohm)[0].reflection;
    });
    if (!whole) return std::nullopt;
    return band_figure(band_report(curve, tuning.band.low_hz, tuning.band.high_hz), r.goal);
  }
};

double objective(const std::vector<double>& x, std::vector<double>&, void* data) {
  auto& e = *static_cast<Evaluator*>(data);
  const auto values = e.values_of(x);
  std::optional<Real> goal;
  try {
    goal = e.goal(values);
  } catch (...) {
    // NLopt would turn any exception into a bare "nlopt failure": keep it to rethrow.
    e.failure = std::current_exception();
    throw nlopt::forced_stop();
  }
  if (!goal) throw nlopt::forced_stop();  // cancelled mid-evaluation: it does not count
  const Real g = *goal;
  ++e.evaluations;
  if (g < e.best) e.best = g, e.best_values = values, e.best_si = e.si_of(x);
  if (e.control.progress)
    e.control.progress(static_cast<std::size_t>(e.evaluations), static_cast<std::size_t>(e.tuning.request.evaluations),
                       static_cast<std::size_t>(e.evaluations),
                       e.tuning.request.goal + " " + formatted("%.5g", g) + " (best " + formatted("%.5g", e.best) + ")");
  if (e.control.cancelled()) throw nlopt::forced_stop();
  return g;
}

/// The model text with every overridden `let` (tuned or fixed by --set) set to the value
/// `model` was solved with, so the file reproduces the tuned figure on its own.
std::string tuned_text(const Model& model, const std::vector<TunedName>& tuned) {
  return text_with_values(model, [&](const ResolvedValue& v, const std::string& old) {
    const bool was_tuned = std::any_of(tuned.begin(), tuned.end(), [&](const TunedName& t) { return t.name == v.name; });
    return (was_tuned ? "tuned by lobe (was: " : "set by --set when tuned (was: ") + old + ")";
  });
}

}  // namespace

PreparedTuning prepare_tuning(const TuneRequest& request) {
  PreparedTuning tuning{request, {}, {}, {}};
  for (std::size_t i = 0; i < request.vary_options.size(); ++i)
    tuning.tuned.push_back(parse_tune_option(request.vary_options[i], static_cast<int>(i) + 1));
  const std::string stem = std::filesystem::path(request.model_path).stem().string();
  tuning.output = request.output.empty() ? std::filesystem::path(stem + "-tuned.lobe") : std::filesystem::path(request.output);
  check_output_file(tuning.output);
  // Both ends must load, and the band must lie within their frequencies, before the search
  // starts: a bad range fails now, not mid-search.
  for (double end : {0.0, 1.0}) {
    std::vector<std::string> values;
    for (const auto& t : tuning.tuned) values.push_back(exact_text(t.low + end * (t.high - t.low)) + t.unit);
    const Model model = load_model(request.model_path, overrides_with(request.set_options, names_of(tuning.tuned), values));
    tuning.band = judged_band(model, request.band);
  }
  return tuning;
}

TuneOutcome execute_tuning(const PreparedTuning& tuning, const StudyControl& control) {
  const std::vector<TunedName>& tuned = tuning.tuned;
  Evaluator evaluator{tuning, control, tuned, 0, nullptr, 1e300, {}, {}};
  nlopt::opt optimiser(nlopt::LN_BOBYQA, static_cast<unsigned>(tuned.size()));
  optimiser.set_lower_bounds(std::vector<double>(tuned.size(), 0.0));
  optimiser.set_upper_bounds(std::vector<double>(tuned.size(), 1.0));
  optimiser.set_min_objective(objective, &evaluator);
  optimiser.set_maxeval(tuning.request.evaluations);
  optimiser.set_xtol_abs(1e-4);
  std::vector<double> x(tuned.size(), 0.5);
  double best = 0.0;
  try {
    optimiser.optimize(x, best);
  } catch (const nlopt::roundoff_limited&) {
    // The goal stopped improving at rounding level: the best point so far stands.
  } catch (const nlopt::forced_stop&) {
    if (evaluator.failure) std::rethrow_exception(evaluator.failure);
    // Cancelled: the best point so far is written, if there is one.
    if (evaluator.best_values.empty()) return {false, 0.0, {}, 0, {}};
  }
  const TuneRequest& r = tuning.request;
  const std::filesystem::path directory =
      tuning.output.has_parent_path() ? tuning.output.parent_path() : std::filesystem::path(".");
  OutputFiles files(directory);
  const Model tuned_model = load_model(r.model_path, overrides_with(r.set_options, names_of(tuned), evaluator.best_values));
  files.stage_text(tuning.output.filename().string(), tuned_text(tuned_model, tuned));
  files.commit();
  return {!control.cancelled(), evaluator.best, evaluator.best_si, evaluator.evaluations, tuning.output};
}

}  // namespace lobe
