#pragma once
/// Figures of a pattern's main beam at one frequency: front-to-back and front-to-side
/// ratios, half-power beamwidths in the two principal planes through the beam, and the
/// polarisation at the beam or at a direction the user names.
#include <functional>
#include <optional>

#include "core/types.hpp"
#include "post/polarization.hpp"

namespace lobe {

/// Gains below this are reported as this value (no field, e.g. under a ground plane).
constexpr Real gain_floor_dbi = -150.0;

/// 10 log10(x) with gain_floor_dbi for zero or tiny values.
Real to_dbi(Real ratio);

/// A direction: θ from +z, φ from +x toward +y, radians.
struct Direction {
  Real theta = 0.0;
  Real phi = 0.0;
};

Vec3 unit_vector(const Direction& d);
Direction direction_of(const Vec3& unit);

/// Largest front-to-back, front-to-side and cross-polar ratio reported: a null behind the
/// beam (or a pure circular field) gives an infinite one, and a cap keeps outputs readable.
constexpr Real ratio_ceiling_db = 99.0;
/// A half-power beamwidth of 360° says the pattern never falls to half power in that plane
/// (omnidirectional there, as a vertical dipole in the horizon plane).
constexpr Real no_half_power_deg = 360.0;
/// Over an infinite ground the back and sides are taken at the beam's elevation; within
/// this of the zenith they would lie next to the beam itself, so they are not defined.
constexpr Real zenith_beam_limit_deg = 10.0;

/// Radiation intensity (any consistent unit) in a direction given as a unit vector.
using IntensityAt = std::function<Real(const Vec3&)>;

/// Half-power beamwidth, degrees, in the plane spanned by the beam direction `beam` and the
/// unit vector `along` (orthogonal to it). From `beam`, climbs to the lobe's maximum in that
/// plane, then finds the first angle on each side where the intensity falls to half of it:
/// sampled every 2° and refined by bisection. no_half_power_deg when a side never falls
/// that far.
Real half_power_beamwidth_deg(const IntensityAt& intensity, const Vec3& beam, const Vec3& along);

/// Where the back and the sides of a beam are. In free space the back is opposite the beam
/// (−r̂) and the sides are ±φ̂ at the beam (horizontal, at right angles to it). Over an
/// infinite ground, where nothing radiates below the horizon, the back is the beam's
/// direction turned 180° in azimuth at the same elevation and the sides are turned ±90°;
/// none of them is defined for a beam within zenith_beam_limit_deg of the zenith.
struct BeamOpposites {
  bool defined = false;
  Vec3 back = Vec3::Zero();
  Vec3 sides[2] = {Vec3::Zero(), Vec3::Zero()};
};
BeamOpposites beam_opposites(const Direction& beam, bool over_ground);

/// 10 log10(front / behind), within ±ratio_ceiling_db; 0 dB when there is no field at all.
Real ratio_db(Real front, Real behind);

/// The main beam's figures at one frequency.
struct BeamFigures {
  Direction peak;  ///< the pattern grid's direction of highest gain
  Real gain_dbi = gain_floor_dbi, realized_gain_dbi = gain_floor_dbi;
  /// Gain at the peak over gain at the back, and over the larger of the two sides; none
  /// where beam_opposites is not defined.
  std::optional<Real> front_to_back_db, front_to_side_db;
  /// Half-power beamwidths in the plane through the beam along θ̂ (the vertical plane
  /// through it) and along φ̂ (for a beam at the horizon, the horizon plane).
  Real beamwidth_theta_deg = no_half_power_deg, beamwidth_phi_deg = no_half_power_deg;
};

/// The polarisation in one direction: the main beam's or the one the user names.
struct PolarizationFigures {
  Direction toward;
  Real axial_ratio_db = axial_ratio_ceiling_db;
  Real rhcp_dbi = gain_floor_dbi, lhcp_dbi = gain_floor_dbi;
  /// 20 log10(|E_co| / |E_cross|) of the circular components, the larger taken as co-polar:
  /// related to the axial ratio AR (linear) by (AR + 1)/(AR − 1); 0 dB for a linear field.
  Real cross_polar_discrimination_db = 0.0;
  Hand hand = Hand::linear;
};

/// The beam's figures from the continuous pattern: `intensity` as above, `gain_per_intensity`
/// turns it into gain (4π / accepted power), `realized_per_intensity` into realized gain.
BeamFigures beam_figures(const IntensityAt& intensity, const Direction& peak, Real gain_per_intensity,
                         Real realized_per_intensity, bool over_ground);

/// The polarisation figures from the circular components in that direction;
/// `gain_per_intensity` as above and |E|²/(2η0) the intensity.
PolarizationFigures polarization_figures(const Direction& toward, const CircularComponents& c, Real gain_per_intensity);

}  // namespace lobe
