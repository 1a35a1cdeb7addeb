#include "study/design_goal.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/formatted_text.hpp"
#include "core/input_error.hpp"

namespace lobe {
namespace {

std::string trimmed(const std::string& text) {
  const auto first = text.find_first_not_of(" \t");
  if (first == std::string::npos) return "";
  return text.substr(first, text.find_last_not_of(" \t") - first + 1);
}

/// A finite number filling all of `text`, or none.
std::optional<Real> number_of(const std::string& text) {
  try {
    std::size_t used = 0;
    const Real v = std::stod(text, &used);
    if (used == text.size() && std::isfinite(v)) return v;
  } catch (const std::exception&) {
  }
  return std::nullopt;
}

void require_figure(const std::string& name, const SourceLocation& where) {
  const auto& names = band_figure_names();
  if (std::find(names.begin(), names.end(), name) != names.end()) return;
  std::string known;
  for (const auto& n : names) known += (known.empty() ? "" : ", ") + n;
  throw InputError(where, "'" + name + "' is not a band figure; the figures are " + known);
}

}  // namespace

DesignGoal parse_design_goal(const std::string& text, const std::string& option) {
  const SourceLocation where{option, 1, 1};
  DesignGoal goal;
  goal.text = text;
  // Split at " + " and " - ", keeping each term's sign.
  std::string rest = " + " + trimmed(text);
  while (!rest.empty()) {
    const bool minus = rest.compare(0, 3, " - ") == 0;
    if (!minus && rest.compare(0, 3, " + ") != 0) throw InputError(where, "'" + text + "' is not a goal");
    rest.erase(0, 3);
    const std::size_t next = std::min(rest.find(" + "), rest.find(" - "));
    std::string term = trimmed(rest.substr(0, next));
    rest = next == std::string::npos ? "" : rest.substr(next);
    Real weight = 1.0;
    if (const auto star = term.find('*'); star != std::string::npos) {
      const auto w = number_of(trimmed(term.substr(0, star)));
      if (!w) throw InputError(where, "the weight in '" + term + "' is not a number");
      weight = *w;
      term = trimmed(term.substr(star + 1));
    }
    require_figure(term, where);
    goal.terms.push_back({minus ? -weight : weight, term});
  }
  if (goal.terms.size() == 1 && goal.terms.front().weight != 1.0)
    throw InputError(where, "a goal of one figure takes no weight or sign: it is ranked the way the figure is better");
  return goal;
}

std::optional<Real> DesignGoal::value(const BandFigures& figures) const {
  Real sum = 0.0;
  for (const auto& t : terms) {
    const auto f = band_figure(figures, t.figure);
    if (!f) return std::nullopt;
    sum += t.weight * *f;
  }
  return sum;
}

std::optional<Real> DesignGoal::cost(const BandFigures& figures) const {
  const auto v = value(figures);
  if (v && single() && larger_is_better(terms.front().figure)) return -*v;
  return v;
}

bool DesignGoal::needs_beam() const {
  return std::any_of(terms.begin(), terms.end(), [](const Term& t) { return is_beam_figure(t.figure); });
}

DesignLimit parse_design_limit(const std::string& text, int index) {
  const SourceLocation where{"--limit", index, 1};
  DesignLimit limit;
  limit.text = text;
  std::size_t at = text.find("<=");
  limit.at_most = at != std::string::npos;
  if (!limit.at_most) at = text.find(">=");
  if (at == std::string::npos)
    throw InputError(where, "'" + text + "' is not a limit: write FIGURE<=BOUND or FIGURE>=BOUND, e.g. worst-axial-ratio<=3");
  limit.figure = trimmed(text.substr(0, at));
  require_figure(limit.figure, where);
  const auto bound = number_of(trimmed(text.substr(at + 2)));
  if (!bound) throw InputError(where, "the bound in '" + text + "' is not a number");
  limit.bound = *bound;
  return limit;
}

std::optional<Real> DesignLimit::excess(const BandFigures& figures) const {
  const auto f = band_figure(figures, figure);
  if (!f) return std::nullopt;
  return at_most ? *f - bound : bound - *f;
}

std::optional<Real> DesignLimit::miss(const BandFigures& figures) const {
  const auto e = excess(figures);
  if (!e) return std::nullopt;
  return std::max(0.0, *e);
}

bool Judgement::meets() const {
  return std::all_of(misses.begin(), misses.end(), [](const std::optional<Real>& m) { return m && *m == 0.0; });
}

Real Judgement::shortfall(const std::vector<DesignLimit>& limits) const {
  Real sum = 0.0;
  for (std::size_t i = 0; i < misses.size(); ++i) {
    if (!misses[i]) return std::numeric_limits<Real>::infinity();
    sum += *misses[i] / std::max(std::abs(limits[i].bound), 1.0);
  }
  return sum;
}

Judgement judge(const DesignGoal& goal, const std::vector<DesignLimit>& limits, const BandFigures& figures) {
  Judgement j{goal.value(figures), goal.cost(figures), {}};
  for (const auto& limit : limits) j.misses.push_back(limit.miss(figures));
  return j;
}

bool judged_better(const Judgement& a, const Judgement& b, const std::vector<DesignLimit>& limits) {
  if (a.cost.has_value() != b.cost.has_value()) return a.cost.has_value();
  if (a.meets() != b.meets()) return a.meets();
  if (!a.meets()) {
    const Real sa = a.shortfall(limits), sb = b.shortfall(limits);
    if (sa != sb) return sa < sb;
  }
  return a.cost && *a.cost < *b.cost;
}

std::string misses_text(const Judgement& judgement, const std::vector<DesignLimit>& limits) {
  std::string text;
  for (std::size_t i = 0; i < limits.size(); ++i) {
    const auto& m = judgement.misses[i];
    if (m && *m == 0.0) continue;
    text += (text.empty() ? "misses " : ", ") + limits[i].text +
            (m ? " by " + formatted("%.3g", *m) : std::string(" (not defined)"));
  }
  return text;
}

}  // namespace lobe
