#include "study/adaptive_frequencies.hpp"

#include <algorithm>
#include <exception>
#include <mutex>
#include <optional>
#include <limits>
#include <set>

#include "post/run_summary.hpp"
#include "solver/threads.hpp"
#include "study/frequency_loop.hpp"
#include "study/rational_interpolant.hpp"

namespace lobe {
namespace {

/// Evenly spread frequencies solved first, besides the ends and the bands.
constexpr int first_spread = 7;
/// The fit's own tolerance: far below any difference the sweep acts on.
constexpr Real fit_tolerance = 1e-11;

/// S = (1 − z0 Y)(1 + z0 Y)⁻¹ for the ports' admittance matrix.
ComplexMatrix scattering(const ComplexMatrix& y, Real z0) {
  const ComplexMatrix identity = ComplexMatrix::Identity(y.rows(), y.cols());
  return (identity - z0 * y) * (identity + z0 * y).inverse();
}

/// Largest difference between two S matrices' entries.
Real largest_difference(const ComplexMatrix& a, const ComplexMatrix& b) { return (a - b).cwiseAbs().maxCoeff(); }

class AdaptiveSweep {
 public:
  AdaptiveSweep(const AntennaProblem& problem) : m_problem(problem), m_solved(problem.model.frequencies_hz.size()) {
    const auto [low, high] = std::minmax_element(problem.model.frequencies_hz.begin(), problem.model.frequencies_hz.end());
    m_centre = 0.5 * (*low + *high);
    m_half_span = std::max(0.5 * (*high - *low), 1e-300);
  }

  bool run(const StudyControl& control, const std::function<void(std::size_t, FrequencySolution&&)>& use);

 private:
  Real axis(std::size_t i) const { return (m_problem.model.frequencies_hz[i] - m_centre) / m_half_span; }
  std::size_t nearest_index(Real hz) const;
  std::set<std::size_t> first_indices() const;
  bool solve(const std::vector<std::size_t>& indices, const StudyControl& control);
  RationalInterpolant fit() const;
  ComplexMatrix predicted_scattering(const RationalInterpolant& r, std::size_t i) const;
  FrequencySolution interpolated(const RationalInterpolant& r, std::size_t i) const;
  std::vector<std::size_t> solved_indices() const;

  const AntennaProblem& m_problem;
  std::vector<std::optional<FrequencySolution>> m_solved;
  std::mutex m_guard;
  Real m_centre = 0.0, m_half_span = 1.0;
  std::size_t m_solves = 0;
};

std::size_t AdaptiveSweep::nearest_index(Real hz) const {
  const std::vector<Real>& f = m_problem.model.frequencies_hz;
  std::size_t best = 0;
  for (std::size_t i = 1; i < f.size(); ++i)
    if (std::abs(f[i] - hz) < std::abs(f[best] - hz)) best = i;
  return best;
}

std::set<std::size_t> AdaptiveSweep::first_indices() const {
  const std::size_t last = m_solved.size() - 1;
  std::set<std::size_t> first{0, last};
  for (int k = 1; k < first_spread - 1; ++k) first.insert((last * static_cast<std::size_t>(k) + (first_spread - 1) / 2) / (first_spread - 1));
  for (const Band& band : m_problem.model.bands)
    for (Real hz : {band.low_hz, band.high_hz, 0.5 * (band.low_hz + band.high_hz)}) first.insert(nearest_index(hz));
  return first;
}

bool AdaptiveSweep::solve(const std::vector<std::size_t>& indices, const StudyControl& control) {
  const std::size_t total = m_solved.size(), before = m_solves;
  StudyControl counted = control;
  // Progress counts every solve of the sweep against the range's length.
  if (control.progress)
    counted.progress = [&](std::size_t done, std::size_t, std::size_t timed, const std::string& detail) {
      control.progress(before + done, total, before + timed, detail);
    };
  const bool whole = solve_frequencies(m_problem, indices, counted, [&](std::size_t i, FrequencySolution&& s) {
    const std::lock_guard<std::mutex> lock(m_guard);
    m_solved[i] = std::move(s);
  });
  m_solves += indices.size();
  return whole;
}

std::vector<std::size_t> AdaptiveSweep::solved_indices() const {
  std::vector<std::size_t> indices;
  for (std::size_t i = 0; i < m_solved.size(); ++i)
    if (m_solved[i]) indices.push_back(i);
  return indices;
}

RationalInterpolant AdaptiveSweep::fit() const {
  // The fit's samples: the ports' admittances times z0 (dimensionless), then the basis
  // currents of the drive scaled to the same size, so that one denominator serves both.
  const std::vector<std::size_t> indices = solved_indices();
  const FrequencySolution& any = *m_solved[indices.front()];
  const Eigen::Index ports = any.port_admittance.size(), basis = any.coefficients.size();
  const Real z0 = m_problem.model.reference_ohm;
  ComplexMatrix values(ports + basis, static_cast<Eigen::Index>(indices.size()));
  std::vector<Real> points;
  Real admittance_size = 0.0, current_size = 0.0;
  for (std::size_t n = 0; n < indices.size(); ++n) {
    const FrequencySolution& s = *m_solved[indices[n]];
    values.col(static_cast<Eigen::Index>(n)).head(ports) = z0 * s.port_admittance.reshaped();
    values.col(static_cast<Eigen::Index>(n)).tail(basis) = s.coefficients;
    admittance_size = std::max(admittance_size, (z0 * s.port_admittance).cwiseAbs().maxCoeff());
    current_size = std::max(current_size, s.coefficients.cwiseAbs().maxCoeff());
    points.push_back(axis(indices[n]));
  }
  if (current_size > 0.0) values.bottomRows(basis) *= admittance_size / current_size;
  return RationalInterpolant(points, values, fit_tolerance);
}

ComplexMatrix AdaptiveSweep::predicted_scattering(const RationalInterpolant& r, std::size_t i) const {
  const FrequencySolution& any = *m_solved[solved_indices().front()];
  const Eigen::Index p = any.port_admittance.rows();
  // The fit's first p² values are z0·Y; the basis currents after them are not needed here.
  const ComplexVector values = r(axis(i), p * p);
  const Real z0 = m_problem.model.reference_ohm;
  return scattering(values.reshaped(p, p) / z0, z0);
}

FrequencySolution AdaptiveSweep::interpolated(const RationalInterpolant& r, std::size_t i) const {
  const std::vector<Complex> c = r.combination(axis(i));
  const std::vector<std::size_t> indices = solved_indices();
  // The fit's samples are the solved frequencies in order: c[n] belongs to indices[n].
  FrequencySolution s;
  s.frequency_hz = m_problem.model.frequencies_hz[i];
  s.interpolated = true;
  std::size_t nearest = indices.front();
  for (std::size_t n = 0; n < indices.size(); ++n) {
    const FrequencySolution& sample = *m_solved[indices[n]];
    if (std::abs(static_cast<double>(indices[n]) - static_cast<double>(i)) <
        std::abs(static_cast<double>(nearest) - static_cast<double>(i)))
      nearest = indices[n];
    if (n == 0) {
      s.port_voltages = sample.port_voltages;
      s.port_admittance = ComplexMatrix::Zero(sample.port_admittance.rows(), sample.port_admittance.cols());
      s.port_currents = ComplexVector::Zero(sample.port_currents.size());
      s.received_currents = ComplexVector::Zero(sample.received_currents.size());
      s.coefficients = ComplexVector::Zero(sample.coefficients.size());
      s.network_voltages = ComplexVector::Zero(sample.network_voltages.size());
      s.network_currents = ComplexVector::Zero(sample.network_currents.size());
      s.segment_currents.assign(sample.segment_currents.size(), {Complex(0.0), Complex(0.0)});
    }
    if (c[n] == 0.0) continue;
    s.port_admittance += c[n] * sample.port_admittance;
    s.port_currents += c[n] * sample.port_currents;
    s.received_currents += c[n] * sample.received_currents;
    s.coefficients += c[n] * sample.coefficients;
    s.network_voltages += c[n] * sample.network_voltages;
    s.network_currents += c[n] * sample.network_currents;
    for (std::size_t k = 0; k < s.segment_currents.size(); ++k)
      for (int e = 0; e < 2; ++e) s.segment_currents[k][e] += c[n] * sample.segment_currents[k][e];
  }
  // The matrix figures of the nearest solve: an interpolated frequency factors nothing.
  s.report = m_solved[nearest]->report;
  return s;
}

bool AdaptiveSweep::run(const StudyControl& control, const std::function<void(std::size_t, FrequencySolution&&)>& use) {
  const std::size_t count = m_solved.size();
  const std::set<std::size_t> first = first_indices();
  if (!solve({first.begin(), first.end()}, control)) return false;
  const std::size_t lanes =
      m_problem.unknowns() <= largest_problem_side_by_side ? static_cast<std::size_t>(std::max(1, thread_count())) : 1;
  std::optional<RationalInterpolant> previous;
  Real last_miss = std::numeric_limits<Real>::infinity();
  for (;;) {
    RationalInterpolant current = fit();
    std::vector<std::pair<Real, std::size_t>> doubt;  // (estimated error, index) of the unsolved
    for (std::size_t i = 0; i < count; ++i) {
      if (m_solved[i]) continue;
      // Without a previous interpolant, the distance to the nearest solve ranks them.
      Real estimate = 0.0;
      if (previous) {
        estimate = largest_difference(predicted_scattering(current, i), predicted_scattering(*previous, i));
      } else {
        std::size_t gap = count;
        for (std::size_t j = 0; j < count; ++j)
          if (m_solved[j]) gap = std::min(gap, j > i ? j - i : i - j);
        estimate = static_cast<Real>(gap);
      }
      doubt.emplace_back(estimate, i);
    }
    if (doubt.empty()) break;
    std::sort(doubt.rbegin(), doubt.rend());
    if (previous && doubt.front().first < adaptive_s_tolerance && last_miss < adaptive_s_tolerance) {
      previous = std::move(current);
      break;
    }
    // This round's solves: the most doubtful, spread apart when several run side by side.
    std::vector<std::size_t> round;
    const std::size_t spacing = std::max<std::size_t>(1, count / (8 * lanes));
    for (const auto& entry : doubt) {
      const std::size_t i = entry.second;  // (a structured binding cannot be captured by clang 14)
      if (round.size() == lanes || (!round.empty() && previous && entry.first < adaptive_s_tolerance)) break;
      if (std::all_of(round.begin(), round.end(), [&](std::size_t j) { return (j > i ? j - i : i - j) >= spacing; }))
        round.push_back(i);
    }
    std::vector<ComplexMatrix> predictions;
    for (std::size_t i : round) predictions.push_back(predicted_scattering(current, i));
    if (!solve(round, control)) return false;
    last_miss = 0.0;
    const Real z0 = m_problem.model.reference_ohm;
    for (std::size_t n = 0; n < round.size(); ++n)
      last_miss = std::max(last_miss, largest_difference(scattering(m_solved[round[n]]->port_admittance, z0), predictions[n]));
    previous = std::move(current);
  }
  // Hand over every frequency: the solved ones as they are, the rest from the final fit
  // (made first, as they read the solved ones).
  const RationalInterpolant final_fit = fit();
  std::vector<std::optional<FrequencySolution>> filled(count);
  std::exception_ptr failure;
#pragma omp parallel for schedule(dynamic)
  for (std::size_t i = 0; i < count; ++i) {
    if (!m_solved[i]) filled[i] = interpolated(final_fit, i);
  }
  // A pole of the fit on a frequency left unsolved would give no number: solve it instead.
  std::vector<std::size_t> unfit;
  for (std::size_t i = 0; i < count; ++i)
    if (filled[i] && !(filled[i]->port_admittance.allFinite() && filled[i]->coefficients.allFinite())) unfit.push_back(i);
  if (!unfit.empty()) {
    if (!solve(unfit, control)) return false;
    for (std::size_t i : unfit) filled[i].reset();
  }
#pragma omp parallel for schedule(dynamic)
  for (std::size_t i = 0; i < count; ++i) {
    try {
      use(i, std::move(m_solved[i] ? *m_solved[i] : *filled[i]));
    } catch (...) {
#pragma omp critical(lobe_adaptive_failure)
      failure = std::current_exception();
    }
  }
  if (failure) std::rethrow_exception(failure);
  // Every frequency was worked here (none was found done), solved or interpolated.
  if (control.progress) control.progress(count, count, count, "the rest interpolated");
  return true;
}

}  // namespace

bool solve_adaptively(const AntennaProblem& problem, const StudyControl& control,
                      const std::function<void(std::size_t, FrequencySolution&&)>& use) {
  AdaptiveSweep sweep(problem);
  return sweep.run(control, use);
}

}  // namespace lobe
