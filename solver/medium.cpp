#include "solver/medium.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "solver/fresnel.hpp"

namespace lobe {

IncidentWave incident_wave(const PlaneWave& wave) {
  const Real st = std::sin(wave.theta), ct = std::cos(wave.theta), sp = std::sin(wave.phi), cp = std::cos(wave.phi);
  const Vec3 polarization = wave.theta_polarized ? Vec3(ct * cp, ct * sp, -st) : Vec3(-sp, cp, 0.0);
  return {Vec3(st * cp, st * sp, ct), polarization.cast<Complex>(), wave.amplitude};
}

Medium Medium::free_space() { return Medium(); }

Medium Medium::over_perfect_ground() {
  Medium medium;
  ImageSource image;
  image.mirror = Eigen::Vector3d(1.0, 1.0, -1.0).asDiagonal();
  image.current_sign = -1.0;
  image.charge_sign = -1.0;
  medium.m_images.push_back(image);
  medium.m_ground = true;
  return medium;
}

Medium Medium::over_grounded_slab(Real thickness, Complex permittivity) {
  Medium medium;
  medium.m_ground = true;
  medium.m_slab_thickness = thickness;
  medium.m_slab_permittivity = permittivity;
  return medium;
}

Medium Medium::over_real_ground(Real permittivity, Real conductivity) {
  Medium medium = over_perfect_ground();
  medium.m_images.front().fresnel = true;
  medium.m_real_ground = true;
  medium.m_ground_permittivity = permittivity;
  medium.m_ground_conductivity = conductivity;
  return medium;
}

Medium Medium::over_ground_system(Real permittivity, Real conductivity) {
  Medium medium = over_real_ground(permittivity, conductivity);
  medium.m_images.front().fresnel = false;
  return medium;
}

Complex Medium::ground_permittivity(Real frequency_hz) const {
  return lobe::ground_permittivity(m_ground_permittivity, m_ground_conductivity, frequency_hz);
}

Medium Medium::of(const Model& model) {
  if (const auto& board = model.substrate)
    return over_grounded_slab(board->thickness, Complex(board->permittivity, -board->permittivity * board->loss_tangent));
  if (const auto& soil = model.real_ground)
    return soil->system_resistance ? over_ground_system(soil->permittivity, soil->conductivity)
                                   : over_real_ground(soil->permittivity, soil->conductivity);
  return model.ground_perfect ? over_perfect_ground() : free_space();
}

Real Medium::wavenumber(Real frequency_hz) const { return 2 * pi * frequency_hz / speed_of_light; }

Complex Medium::vector_factor(Real frequency_hz) const { return j_unit * (2 * pi * frequency_hz) * mu0; }

Complex Medium::scalar_factor(Real frequency_hz) const { return -j_unit / ((2 * pi * frequency_hz) * eps0); }

std::vector<IncidentWave> Medium::waves_reaching(const IncidentWave& wave) const {
  std::vector<IncidentWave> waves{wave};
  // The field an image source sees is the image of the field: a wave from M·from with
  // the imaged polarisation, E_r(r) = s M E(M r).
  for (const ImageSource& image : m_images)
    waves.push_back({image.point(wave.from), image.current(wave.polarization), wave.amplitude});
  return waves;
}

}  // namespace lobe
