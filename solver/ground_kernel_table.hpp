#pragma once
/// The real ground's reflected-field integrals (solver/half_space_field) tabulated over the
/// distances one structure needs at one frequency, for the fill of wires near the soil.
#include <vector>

#include "solver/half_space_field.hpp"

namespace lobe {

/// Tabulates the four integrals over R' = √(ρ² + h²) (h = z + z') and the elevation
/// ψ = atan2(h, ρ) of the ray from the source's mirror point, each times
/// e^{jkR'} R'³/(1 + (kR')²), smooth from the quasi-static 1/R'³ to the space wave's 1/R'.
/// The grid in R' is logarithmic (ratio e^{0.05}) up to 1/k and then every λ/48; in ψ, 33
/// points even in √ψ (crowding toward grazing, where the reflection turns fastest); reads
/// by four-point Lagrange interpolation in both (tested against direct integration at 1e-4
/// of the integrals' size).
class GroundKernelTable {
 public:
  /// For all R' in [shortest, longest] and ψ ≥ lowest_elevation (radians), at wavenumber k.
  GroundKernelTable(Complex ground_permittivity, Real k, Real shortest, Real longest, Real lowest_elevation);
  ReflectedIntegrals at(Real rho, Real height_sum) const;
  std::size_t size() const { return m_values.size(); }

 private:
  Real m_k;
  Real m_shortest, m_switch, m_log_step, m_step;
  int m_log_points = 0, m_points = 0;
  Real m_lowest_elevation, m_elevation_step;  ///< in √ψ
  static constexpr int elevation_points = 33;
  std::vector<ReflectedIntegrals> m_values;  ///< [distance][elevation]

  Real distance_of(int i) const;
  Real index_of(Real distance) const;
};

}  // namespace lobe
