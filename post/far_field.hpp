#pragma once
/// Far field radiated by the solved wire currents.
#include <array>
#include <optional>
#include <vector>

#include "solver/antenna_problem.hpp"

namespace lobe {

/// Far-zone field components at r = 1 m with the e^{−jkr} factor removed, V:
/// E = −jωμ0/(4π) (I − r̂ r̂·) ∫ J(r') e^{jk r̂·r'} dV'.
struct FarFieldSample {
  Complex e_theta;
  Complex e_phi;
};

/// Radiation from the current on every segment, triangle and junction star at the points of
/// solver/basis_samples, and from their images in the problem's medium (over a perfect
/// ground the field below z = 0 is zero; over real ground the image's field is weighted by
/// Fresnel's coefficients, the space wave only; on a substrate the free-space field of the printed
/// currents times the slab's factors, solver/grounded_slab). Antennas and scatterers alike. Precomputes the
/// points once; then each direction costs O(S + T).
class FarField {
 public:
  FarField(const AntennaProblem& problem, const FrequencySolution& solution);
  /// θ from +z, φ from +x toward +y, radians.
  FarFieldSample at(Real theta, Real phi) const;
  /// The point the far-field phase is referred to, m: at(θ, φ) is e^{−jk r̂·centre} times
  /// the field referred to the origin.
  const Vec3& phase_centre() const { return m_centre; }
  /// Radiation intensity U = r²|E|²/(2η0), W/sr.
  Real intensity(Real theta, Real phi) const;
  /// ∮ U dΩ by Gauss–Legendre in cos θ and the trapezoidal rule in φ, with orders chosen
  /// from the structure's electrical size so that the error is far below 1e-6. W.
  Real radiated_power() const;

 private:
  Real m_k = 0.0;
  Real m_omega = 0.0;
  std::vector<ImageSource> m_images;
  bool m_ground = false;
  std::optional<GroundedSlab> m_slab;  ///< on a substrate: the currents lie on its top face
  /// On a substrate, each probe's foot (relative to the phase centre) and current.
  struct ProbeCurrent {
    Real x, y;
    Complex current;
  };
  std::vector<ProbeCurrent> m_probes;
  Vec3 m_centre = Vec3::Zero();
  Real m_extent = 0.0;
  /// Quadrature points relative to m_centre (m), and current × direction × weight (A·m),
  /// as separate real arrays so that the sum over points vectorises.
  struct PointSources {
    std::vector<Real> x, y, z;
    std::array<std::vector<Real>, 3> moment_re, moment_im;
    /// Σ moment e^{j (rx x + ry y + rz z)}.
    Eigen::Vector3cd sum(Real rx, Real ry, Real rz) const;
  };
  /// The currents and the images with fixed signs; over real ground the perfect ground's
  /// images apart, weighted per direction by Fresnel's coefficients.
  PointSources m_points, m_reflected;
  std::optional<Complex> m_ground_permittivity;

  /// A current moment (A·m) at x, relative to m_centre.
  void add_point(PointSources& set, const Vec3& x, const Eigen::Vector3cd& moment);
  /// A current moment at r (absolute) and its images in the medium.
  void add_source(const Vec3& r, const Eigen::Vector3cd& moment);
};

}  // namespace lobe
