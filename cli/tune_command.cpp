#include <nlopt.hpp>

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <regex>
#include <sstream>

#include "cli/commands.hpp"
#include "cli/model_loading.hpp"
#include "core/number_text.hpp"
#include "geometry/model_parser.hpp"
#include "post/band_report.hpp"
#include "post/frequency_result.hpp"
#include "post/output_files.hpp"
#include "post/run_summary.hpp"
#include "solver/threads.hpp"

namespace lobe::cli {
namespace {

std::vector<std::string> names_of(const std::vector<TunedName>& tuned) {
  std::vector<std::string> names;
  for (const auto& t : tuned) names.push_back(t.name);
  return names;
}

/// The goal's value for one set of overrides: a band figure of the first port.
struct Evaluator {
  const TuneOptions& options;
  const std::vector<TunedName>& tuned;
  std::optional<Band> band;
  int evaluations = 0;
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

  Real goal(const std::vector<std::string>& values) {
    const Model model = load_model(options.model_path, overrides_with(options.set_options, names_of(tuned), values));
    const AntennaProblem problem(model);
    ReflectionCurve curve;
    for (Real f : model.frequencies_hz) {
      curve.frequency_hz.push_back(f);
      curve.reflection.push_back(port_results(solve_frequency(problem, f), model.reference_ohm)[0].reflection);
    }
    return band_figure(band_report(curve, band->low_hz, band->high_hz), options.goal);
  }
};

double objective(const std::vector<double>& x, std::vector<double>&, void* data) {
  auto& e = *static_cast<Evaluator*>(data);
  const auto values = e.values_of(x);
  const Real g = e.goal(values);
  ++e.evaluations;
  if (g < e.best) e.best = g, e.best_values = values, e.best_si = e.si_of(x);
  std::fprintf(stderr, "evaluation %d: %s %.5g (best %.5g)\n", e.evaluations, e.options.goal.c_str(), g, e.best);
  return g;
}

/// The model text with every overridden `let` (tuned or fixed by --set) set to the value
/// `model` was solved with, in the model's own units, the old text kept in a comment, so
/// the file reproduces the tuned figure on its own.
std::string tuned_text(const Model& model, const std::vector<TunedName>& tuned) {
  std::istringstream in(model.text);
  std::ostringstream out;
  for (std::string line; std::getline(in, line);) {
    for (const ResolvedValue& v : model.values) {
      if (!v.overridden) continue;
      const std::regex let("^(\\s*let\\s+" + v.name + "\\s*=).*$");
      if (!std::regex_match(line, let)) continue;
      const bool was_tuned = std::any_of(tuned.begin(), tuned.end(), [&](const TunedName& t) { return t.name == v.name; });
      std::string old = line.substr(line.find('=') + 1);
      old = old.substr(std::min(old.size(), old.find_first_not_of(' ')));
      line = std::regex_replace(line, let, "$1 " + model_value_text(v, model)) +
             (was_tuned ? "   # tuned by lobe (was: " : "   # set by --set when tuned (was: ") + old + ")";
    }
    out << line << '\n';
  }
  return out.str();
}

}  // namespace

int tune_command(const TuneOptions& options) {
  if (options.threads > 0) set_thread_count(options.threads);
  std::vector<TunedName> tuned;
  for (std::size_t i = 0; i < options.vary_options.size(); ++i)
    tuned.push_back(parse_tune_option(options.vary_options[i], static_cast<int>(i) + 1));
  Evaluator evaluator{options, tuned, std::nullopt, 0, 1e300, {}, {}};
  const std::string stem = std::filesystem::path(options.model_path).stem().string();
  const std::filesystem::path output(options.output.empty() ? stem + "-tuned.lobe" : options.output);
  const std::filesystem::path directory = output.has_parent_path() ? output.parent_path() : std::filesystem::path(".");
  check_output_file(output);
  // Both ends must load before the search starts: a bad range fails now, not mid-search.
  for (double end : {0.0, 1.0}) {
    std::vector<std::string> values;
    for (const auto& t : tuned) values.push_back(exact_text(t.low + end * (t.high - t.low)) + t.unit);
    const Model model = load_model(options.model_path, overrides_with(options.set_options, names_of(tuned), values));
    evaluator.band = judged_band(model, options.band);
  }

  // BOBYQA (Powell 2009): bounded, derivative-free, builds quadratic models; on the unit box.
  nlopt::opt optimiser(nlopt::LN_BOBYQA, static_cast<unsigned>(tuned.size()));
  optimiser.set_lower_bounds(std::vector<double>(tuned.size(), 0.0));
  optimiser.set_upper_bounds(std::vector<double>(tuned.size(), 1.0));
  optimiser.set_min_objective(objective, &evaluator);
  optimiser.set_maxeval(options.evaluations);
  optimiser.set_xtol_abs(1e-4);
  std::vector<double> x(tuned.size(), 0.5);
  double best = 0.0;
  try {
    optimiser.optimize(x, best);
  } catch (const nlopt::roundoff_limited&) {
    // The goal stopped improving at rounding level: the best point so far stands.
  }
  OutputFiles files(directory);
  const Model tuned_model =
      load_model(options.model_path, overrides_with(options.set_options, names_of(tuned), evaluator.best_values));
  files.stage_text(output.filename().string(), tuned_text(tuned_model, tuned));
  files.commit();
  std::printf("best %s %.5g over %s (%s to %s) after %d evaluations:\n", options.goal.c_str(), evaluator.best,
              evaluator.band->name.c_str(), frequency_text(evaluator.band->low_hz).c_str(),
              frequency_text(evaluator.band->high_hz).c_str(), evaluator.evaluations);
  for (std::size_t i = 0; i < tuned.size(); ++i)
    std::printf("  %s = %s\n", tuned[i].name.c_str(), shown_text(evaluator.best_si[i], tuned[i].shown).c_str());
  std::printf("written: %s\n", output.string().c_str());
  return 0;
}

}  // namespace lobe::cli
