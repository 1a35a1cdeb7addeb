#pragma once
/// The space the structure radiates into: it supplies the integrators with the Green's
/// functions they sum, the far field with the medium's reflection, and an incident wave
/// with the waves that actually reach the structure.
#include <string>
#include <vector>

#include "core/types.hpp"
#include "geometry/model.hpp"
#include "solver/grounded_slab.hpp"

namespace lobe {

/// An image source (image theory): each source element also radiates from its mirror
/// point `mirror · r`, carrying the current current_sign · mirror · J and the charge
/// charge_sign · ρ. The integrators evaluate an image term with the free-space kernel over
/// the mirrored source element, so `mirror` must be a reflection in a plane through the
/// origin (orthogonal and its own inverse).
struct ImageSource {
  Eigen::Matrix3d mirror = Eigen::Matrix3d::Identity();
  Real current_sign = 1.0;
  Real charge_sign = 1.0;
  /// Over real ground: the perfect ground's image, weighted pair by pair with Fresnel's
  /// coefficients (solver/fresnel.hpp) instead of the signs above. (Over real ground the
  /// far field weights the image by them whether or not the fill does.)
  bool fresnel = false;

  Vec3 point(const Vec3& r) const { return mirror * r; }
  /// The image of a current element (or of a field vector, for a reflected wave).
  Eigen::Vector3cd current(const Eigen::Vector3cd& j) const { return current_sign * (mirror.cast<Complex>() * j); }
};

/// A uniform plane wave E(r) = amplitude · polarization · e^{+jk from·r}: it arrives from
/// the direction `from` (unit vector), its field is `amplitude` V/m at the origin.
struct IncidentWave {
  Vec3 from = Vec3::UnitZ();
  Eigen::Vector3cd polarization = Eigen::Vector3cd::UnitX();
  Complex amplitude = 1.0;
};

/// The model's wave (θ, φ and θ̂ or φ̂ polarisation) as an IncidentWave.
IncidentWave incident_wave(const PlaneWave& wave);

/// Free space, free space over a perfectly conducting ground plane z = 0 (one image), or a
/// dielectric slab on that ground (its kernels from solver/slab_kernel_table, in place of
/// the image). Later media add their terms here, and the integrators, far field and
/// excitations that ask this object follow.
class Medium {
 public:
  static Medium free_space();
  /// Perfect ground in z = 0: images mirrored in z, current −M J (horizontal reversed,
  /// vertical kept), charge −ρ.
  static Medium over_perfect_ground();
  /// A slab 0 < z < thickness of relative permittivity εr (Im ≤ 0 when lossy) on a
  /// perfect ground; sources lie on its top face.
  static Medium over_grounded_slab(Real thickness, Complex permittivity);
  /// Real ground in z < 0 of relative permittivity εr and conductivity σ: the perfect
  /// ground's image weighted by Fresnel's reflection coefficients (the reflection-
  /// coefficient approximation, valid for wires well above the soil).
  static Medium over_real_ground(Real permittivity, Real conductivity);
  /// Real ground with a stated ground system under the antenna: the near interaction over
  /// the system as over a perfect conductor (the exact image), the far field over the soil.
  static Medium over_ground_system(Real permittivity, Real conductivity);
  static Medium of(const Model& model);

  /// Wavenumber of the space the structure is in, rad/m.
  Real wavenumber(Real frequency_hz) const;
  /// The mixed-potential EFIE's factors: jωμ on the vector potential, −j/(ωε) on the scalar.
  Complex vector_factor(Real frequency_hz) const;
  Complex scalar_factor(Real frequency_hz) const;

  /// Image terms to add to every free-space interaction (none in free space or on a slab).
  const std::vector<ImageSource>& images() const { return m_images; }
  /// True when z < 0 is conductor: no source may be there and no field reaches there.
  bool has_ground() const { return m_ground; }
  bool has_real_ground() const { return m_real_ground; }
  /// Over real ground, the wires' near interaction with it by the exact reflected field
  /// (Sommerfeld integrals, solver/ground_kernel_table) instead of the weighted image;
  /// the far field keeps the image (exact there).
  void use_sommerfeld_near_ground(bool use = true) { m_sommerfeld = use && m_real_ground; }
  bool near_ground_by_sommerfeld() const { return m_sommerfeld; }
  /// εg = εr − jσ/(ωε0) of real ground.
  Complex ground_permittivity(Real frequency_hz) const;
  /// True for a grounded slab; then slab() gives it at a frequency.
  bool has_slab() const { return m_slab_thickness > 0.0; }
  GroundedSlab slab(Real frequency_hz) const { return {m_slab_thickness, m_slab_permittivity, wavenumber(frequency_hz)}; }
  Real slab_thickness() const { return m_slab_thickness; }
  Complex slab_permittivity() const { return m_slab_permittivity; }
  /// The waves that reach the structure when `wave` arrives: itself and its reflections.
  std::vector<IncidentWave> waves_reaching(const IncidentWave& wave) const;
  std::string name() const {
    return has_slab() ? "substrate" : m_real_ground ? "real" : has_ground() ? "perfect" : "none";
  }
  /// How real ground's near interaction is computed, for the run's report ("" without it).
  std::string ground_method() const {
    if (!m_real_ground) return "";
    if (m_sommerfeld) return "Sommerfeld integrals";
    return m_images.front().fresnel ? "reflection-coefficient image" : "exact image over the ground system";
  }

 private:
  std::vector<ImageSource> m_images;
  bool m_ground = false;
  Real m_slab_thickness = 0.0;
  Complex m_slab_permittivity = 1.0;
  bool m_real_ground = false, m_sommerfeld = false;
  Real m_ground_permittivity = 1.0, m_ground_conductivity = 0.0;
};

}  // namespace lobe
