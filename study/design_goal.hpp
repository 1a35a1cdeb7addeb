#pragma once
/// What a sweep ranks by and a tuner optimises: a goal (one band figure, or a weighted sum
/// of several) and limits each design must meet ("worst-axial-ratio<=3").
#include <optional>
#include <string>
#include <vector>

#include "post/band_report.hpp"

namespace lobe {

struct DesignGoal {
  struct Term {
    Real weight = 1.0;
    std::string figure;  ///< a band_figure_names() name
  };
  std::vector<Term> terms;
  std::string text;  ///< as given
  /// One figure: it is ranked the way it is better (larger gain, smaller VSWR). A sum is
  /// minimised: give what should be large a minus sign.
  bool single() const { return terms.size() == 1; }
  /// The goal's value (the figure itself, or the sum); none where a figure is undefined.
  std::optional<Real> value(const BandFigures& figures) const;
  /// The value turned so that smaller is better.
  std::optional<Real> cost(const BandFigures& figures) const;
  bool needs_beam() const;
};

/// "worst-vswr", or terms joined by " + " or " - " (spaces around the sign, as names hold
/// hyphens), each "NAME" or "WEIGHT*NAME": "worst-vswr + 0.5*worst-axial-ratio - 0.1*centre-gain".
/// Throws InputError at `option` (its occurrence 1).
DesignGoal parse_design_goal(const std::string& text, const std::string& option);

struct DesignLimit {
  std::string figure;
  bool at_most = true;  ///< NAME<=BOUND; else NAME>=BOUND
  Real bound = 0.0;
  std::string text;
  /// By how much the figure misses the bound, in its unit: 0 when met; none when the figure
  /// is not defined for this design (which then does not meet the limit).
  std::optional<Real> miss(const BandFigures& figures) const;
  /// The same signed: negative by the margin when met (a constraint ≤ 0 for an optimiser).
  std::optional<Real> excess(const BandFigures& figures) const;
  bool needs_beam() const { return is_beam_figure(figure); }
};

/// "worst-axial-ratio<=3", "worst-front-to-back>=15". Throws InputError at --limit:INDEX.
DesignLimit parse_design_limit(const std::string& text, int index);

/// A design judged by a goal and limits.
struct Judgement {
  std::optional<Real> value;                ///< the goal's value
  std::optional<Real> cost;                 ///< smaller is better
  std::vector<std::optional<Real>> misses;  ///< per limit
  bool meets() const;
  /// Σ miss / max(|bound|, 1): how far a failing design is from meeting every limit, so that
  /// near misses rank before far ones. Infinite when a limited figure is undefined.
  Real shortfall(const std::vector<DesignLimit>& limits) const;
};

Judgement judge(const DesignGoal& goal, const std::vector<DesignLimit>& limits, const BandFigures& figures);

/// Designs that meet every limit first, by cost; then the others by shortfall; a design
/// whose goal is undefined last.
bool judged_better(const Judgement& a, const Judgement& b, const std::vector<DesignLimit>& limits);

/// "misses worst-axial-ratio<=3 by 2.4, worst-front-to-back>=15 (not defined)"; "" when met.
std::string misses_text(const Judgement& judgement, const std::vector<DesignLimit>& limits);

}  // namespace lobe
