#include "post/beam_figures.hpp"

#include <algorithm>
#include <cmath>

#include "core/constants.hpp"

namespace lobe {
namespace {

/// Sample spacing of the walk around a principal plane (2°): a main lobe of a small antenna
/// spans tens of degrees, so no half-power crossing hides between two samples. Twenty-four
/// bisections then place a crossing within 1.2e-7°.
constexpr int samples_per_half_turn = 90;
constexpr int bisection_steps = 24;

Vec3 theta_hat(const Direction& d) {
  return {std::cos(d.theta) * std::cos(d.phi), std::cos(d.theta) * std::sin(d.phi), -std::sin(d.theta)};
}
Vec3 phi_hat(const Direction& d) { return {-std::sin(d.phi), std::cos(d.phi), 0.0}; }

}  // namespace

Real to_dbi(Real ratio) {
  if (!(ratio > 0.0)) return gain_floor_dbi;
  return std::max(gain_floor_dbi, 10.0 * std::log10(ratio));
}

Vec3 unit_vector(const Direction& d) {
  return {std::sin(d.theta) * std::cos(d.phi), std::sin(d.theta) * std::sin(d.phi), std::cos(d.theta)};
}

Direction direction_of(const Vec3& unit) {
  const Real phi = std::atan2(unit.y(), unit.x());
  return {std::acos(std::clamp(unit.z(), -1.0, 1.0)), phi < 0 ? phi + 2 * pi : phi};
}

Real ratio_db(Real front, Real behind) {
  if (!(front > 0.0)) return behind > 0.0 ? -ratio_ceiling_db : 0.0;  // no field at all: no ratio
  if (!(behind > 0.0)) return ratio_ceiling_db;
  return std::clamp(10.0 * std::log10(front / behind), -ratio_ceiling_db, ratio_ceiling_db);
}

Real half_power_beamwidth_deg(const IntensityAt& intensity, const Vec3& beam, const Vec3& along) {
  const int n = 2 * samples_per_half_turn;  // samples around the whole circle
  const Real step = pi / samples_per_half_turn;
  auto at_angle = [&](Real a) { return intensity(std::cos(a) * beam + std::sin(a) * along); };
  // Samples are taken as the walk reaches them: a beam's crossings lie within tens of
  // degrees, so most of the circle is never evaluated.
  std::vector<std::optional<Real>> u(n);
  auto sample = [&](int k) {
    auto& value = u[((k % n) + n) % n];
    if (!value) value = at_angle(k * step);
    return *value;
  };
  // The lobe's maximum in this plane: the peak on the pattern grid may sit a little off it.
  int top = 0;
  while (top < n / 2 && sample(top + 1) > sample(top)) ++top;
  if (top == 0)
    while (top > -n / 2 && sample(top - 1) > sample(top)) --top;
  const Real half = 0.5 * sample(top);
  if (!(half > 0.0)) return no_half_power_deg;
  // First sample below half on each side, then bisection between it and its neighbour.
  auto crossing = [&](int direction) -> std::optional<Real> {
    for (int k = top + direction; std::abs(k - top) < n; k += direction)
      if (sample(k) < half) {
        Real inside = (k - direction) * step, outside = k * step;
        for (int i = 0; i < bisection_steps; ++i) {
          const Real middle = 0.5 * (inside + outside);
          (at_angle(middle) < half ? outside : inside) = middle;
        }
        return 0.5 * (inside + outside);
      }
    return std::nullopt;
  };
  const auto right = crossing(+1), left = crossing(-1);
  if (!right || !left) return no_half_power_deg;
  return std::min(no_half_power_deg, (*right - *left) * 180.0 / pi);
}

BeamOpposites beam_opposites(const Direction& beam, bool over_ground) {
  BeamOpposites o;
  if (!over_ground) {
    o.defined = true;
    o.back = -unit_vector(beam);
    o.sides[0] = phi_hat(beam);
    o.sides[1] = -phi_hat(beam);
    return o;
  }
  if (beam.theta < zenith_beam_limit_deg * pi / 180.0) return o;
  o.defined = true;
  o.back = unit_vector({beam.theta, beam.phi + pi});
  o.sides[0] = unit_vector({beam.theta, beam.phi + 0.5 * pi});
  o.sides[1] = unit_vector({beam.theta, beam.phi - 0.5 * pi});
  return o;
}

BeamFigures beam_figures(const IntensityAt& intensity, const Direction& peak, Real gain_per_intensity,
                         Real realized_per_intensity, bool over_ground) {
  BeamFigures f;
  f.peak = peak;
  const Vec3 beam = unit_vector(peak);
  const Real front = intensity(beam);
  f.gain_dbi = to_dbi(gain_per_intensity * front);
  f.realized_gain_dbi = to_dbi(realized_per_intensity * front);
  const BeamOpposites o = beam_opposites(peak, over_ground);
  if (o.defined) {
    f.front_to_back_db = ratio_db(front, intensity(o.back));
    f.front_to_side_db = ratio_db(front, std::max(intensity(o.sides[0]), intensity(o.sides[1])));
  }
  f.beamwidth_theta_deg = half_power_beamwidth_deg(intensity, beam, theta_hat(peak));
  f.beamwidth_phi_deg = half_power_beamwidth_deg(intensity, beam, phi_hat(peak));
  return f;
}

PolarizationFigures polarization_figures(const Direction& toward, const CircularComponents& c, Real gain_per_intensity) {
  PolarizationFigures f;
  f.toward = toward;
  const Real to_intensity = 1.0 / (2 * eta0);
  f.rhcp_dbi = to_dbi(gain_per_intensity * std::norm(c.right) * to_intensity);
  f.lhcp_dbi = to_dbi(gain_per_intensity * std::norm(c.left) * to_intensity);
  f.axial_ratio_db = axial_ratio_db(c);
  f.hand = polarization_hand(c);
  const Real co = std::max(std::abs(c.right), std::abs(c.left)), cross = std::min(std::abs(c.right), std::abs(c.left));
  f.cross_polar_discrimination_db = cross > 0.0 ? std::min(ratio_ceiling_db, 20.0 * std::log10(co / cross))
                                    : co > 0.0  ? ratio_ceiling_db
                                                : 0.0;
  return f;
}

}  // namespace lobe
