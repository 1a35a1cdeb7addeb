#include "study/tune_study.hpp"

#include <nlopt.hpp>

#include <algorithm>
#include <exception>
#include <optional>

#include "core/formatted_text.hpp"
#include "core/number_text.hpp"
#include "post/band_report.hpp"
#include "post/beam_band_report.hpp"
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

/// Goal and limits for one set of overrides: the band figures of the first port and, when
/// the goal or a limit needs them, of the beam.
struct Evaluator {
  const PreparedTuning& tuning;
  const StudyControl& control;
  const std::vector<TunedName>& tuned;
  int evaluations = 0;
  std::exception_ptr failure;
  std::optional<Judgement> best;
  std::vector<double> best_x;
  std::vector<std::string> best_values;
  /// The last point evaluated: NLopt asks for the objective and then each constraint there.
  std::vector<double> last_x;
  BandFigures last;

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
  bool needs_beam() const {
    return tuning.goal.needs_beam() ||
           std::any_of(tuning.limits.begin(), tuning.limits.end(), [](const DesignLimit& l) { return l.needs_beam(); });
  }

  /// The band figures at these values, or nothing when cancelled before the last frequency.
  std::optional<BandFigures> figures(const std::vector<std::string>& values) {
    const TuneRequest& r = tuning.request;
    const Model model = load_model(r.model_path, overrides_with(r.set_options, names_of(tuned), values));
    const AntennaProblem problem(model);
    require_solvable(problem);
    const std::size_t n = model.frequencies_hz.size();
    ReflectionCurve curve{model.frequencies_hz, std::vector<Complex>(n)};
    const bool beam = needs_beam();
    std::vector<FrequencyResult> results(beam ? n : 0);
    const StudyControl frequencies{control.cancel, {}, {}, {}, {}};
    const bool whole = solve_each_frequency(problem, frequencies, [&](std::size_t index, FrequencySolution&& solution) {
      if (beam) {
        results[index] = evaluate_frequency(problem, solution, tuning.figures);
        curve.reflection[index] = results[index].ports[0].reflection;
      } else {
        curve.reflection[index] = port_results(solution, model.reference_ohm)[0].reflection;
      }
    });
    if (!whole) return std::nullopt;
    const BeamCurves beam_values = beam ? beam_curves(results) : BeamCurves{model.frequencies_hz, {}, {}, {}};
    return band_figures(curve, beam_values, tuning.band.low_hz, tuning.band.high_hz);
  }

  /// Evaluates x unless it was the last point; false when cancelled mid-evaluation.
  bool evaluate(const std::vector<double>& x) {
    if (x == last_x) return true;
    const auto values = values_of(x);
    const auto found = figures(values);
    if (!found) return false;
    last_x = x;
    last = *found;
    ++evaluations;
    const Judgement j = judge(tuning.goal, tuning.limits, last);
    if (!best || judged_better(j, *best, tuning.limits)) best = j, best_x = x, best_values = values;
    if (control.progress) {
      auto text = [&](const Judgement& k) {
        std::string t = k.value ? formatted("%.5g", *k.value) : std::string("n/a");
        if (!tuning.limits.empty()) t += k.meets() ? " meeting the limits" : " (" + misses_text(k, tuning.limits) + ")";
        return t;
      };
      control.progress(static_cast<std::size_t>(evaluations), static_cast<std::size_t>(tuning.request.evaluations),
                       static_cast<std::size_t>(evaluations),
                       tuning.goal.text + " " + text(j) + "; best " + text(*best));
    }
    return true;
  }
};

/// A goal or limit the optimiser cannot read (a figure undefined there) counts as far off.
constexpr double undefined_penalty = 1e6;

/// Runs `step` for NLopt: an exception would become a bare "nlopt failure", so it is kept to
/// rethrow, and a cancelled evaluation (which does not count) stops the search.
template <class Step>
double guarded(Evaluator& e, const std::vector<double>& x, Step step) {
  try {
    if (!e.evaluate(x)) throw nlopt::forced_stop();
  } catch (const nlopt::forced_stop&) {
    throw;
  } catch (...) {
    e.failure = std::current_exception();
    throw nlopt::forced_stop();
  }
  if (e.control.cancelled()) throw nlopt::forced_stop();
  return step();
}

double objective(const std::vector<double>& x, std::vector<double>&, void* data) {
  auto& e = *static_cast<Evaluator*>(data);
  return guarded(e, x, [&] { return e.tuning.goal.cost(e.last).value_or(undefined_penalty); });
}

struct LimitConstraint {
  Evaluator* evaluator;
  std::size_t limit;
};

double limit_constraint(const std::vector<double>& x, std::vector<double>&, void* data) {
  const auto& c = *static_cast<LimitConstraint*>(data);
  Evaluator& e = *c.evaluator;
  return guarded(e, x, [&] { return e.tuning.limits[c.limit].excess(e.last).value_or(undefined_penalty); });
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
  PreparedTuning tuning{request, {}, {}, {}, parse_design_goal(request.goal, "--goal"), {}, figure_options(request.toward)};
  for (std::size_t i = 0; i < request.limits.size(); ++i)
    tuning.limits.push_back(parse_design_limit(request.limits[i], static_cast<int>(i) + 1));
  for (std::size_t i = 0; i < request.vary_options.size(); ++i)
    tuning.tuned.push_back(parse_tune_option(request.vary_options[i], static_cast<int>(i) + 1));
  const std::string stem = std::filesystem::path(request.model_path).stem().string();
  tuning.output = request.output.empty() ? std::filesystem::path(stem + "-tuned.lobe") : std::filesystem::path(request.output);
  if (request.output != "-") check_output_file(tuning.output);
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
  Evaluator evaluator{tuning, control, tuned, 0, {}, {}, {}, {}, {}, {}};
  const bool limited = !tuning.limits.empty();
  nlopt::opt optimiser(limited ? nlopt::LN_COBYLA : nlopt::LN_BOBYQA, static_cast<unsigned>(tuned.size()));
  optimiser.set_lower_bounds(std::vector<double>(tuned.size(), 0.0));
  optimiser.set_upper_bounds(std::vector<double>(tuned.size(), 1.0));
  optimiser.set_min_objective(objective, &evaluator);
  std::vector<LimitConstraint> constraints;
  for (std::size_t i = 0; i < tuning.limits.size(); ++i) constraints.push_back({&evaluator, i});
  for (auto& c : constraints) optimiser.add_inequality_constraint(limit_constraint, &c, 0.0);
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
    if (!evaluator.best) return {false, {}, {}, {}, 0, {}, {}};
  }
  const TuneRequest& r = tuning.request;
  const Model tuned_model = load_model(r.model_path, overrides_with(r.set_options, names_of(tuned), evaluator.best_values));
  TuneOutcome outcome{!control.cancelled(), *evaluator.best, evaluator.si_of(evaluator.best_x), {}, evaluator.evaluations,
                      tuning.output, tuned_text(tuned_model, tuned)};
  if (r.output != "-") {
    const std::filesystem::path directory =
        tuning.output.has_parent_path() ? tuning.output.parent_path() : std::filesystem::path(".");
    OutputFiles files(directory);
    files.stage_text(tuning.output.filename().string(), outcome.text);
    files.commit();
  }
  // The search box's edge: the best may lie beyond it (1e-3 of the range, ten times xtol).
  for (std::size_t i = 0; i < tuned.size(); ++i)
    if (evaluator.best_x[i] < 1e-3 || evaluator.best_x[i] > 1 - 1e-3)
      outcome.at_bounds.push_back(tuned[i].name + (evaluator.best_x[i] < 0.5 ? " (at its minimum)" : " (at its maximum)"));
  return outcome;
}

}  // namespace lobe
