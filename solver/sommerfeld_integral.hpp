#pragma once
/// Direct numerical evaluation of a Sommerfeld integral
///   S(ρ) = (1/2π) ∫₀^∞ f(kρ) J0(kρ ρ) kρ dkρ,
/// the spatial kernel of a spectrum f: along a half-sine detour above the real axis (which
/// passes above the surface-wave poles and the branch point k0, where exp(+jωt) and a
/// little loss put them) up to kρ = a, then along the real axis in half-periods π/ρ summed
/// by Wynn's ε algorithm (Michalski & Mosig 1997, section on numerical evaluation).
#include <functional>

#include "core/types.hpp"

namespace lobe {

struct SommerfeldPath {
  Real detour_end = 0.0;  ///< a, beyond every pole and branch point, rad/m
  Real k0 = 0.0;          ///< free-space wavenumber: the detour's height is min(k0, 1/ρ)
};

/// S(ρ) for ρ > 0, to a relative accuracy of about `relative`. f must decay along the real
/// axis beyond a (subtract its quasi-static part first).
Complex sommerfeld_integral(const std::function<Complex(Complex)>& spectrum, Real rho, const SommerfeldPath& path,
                            Real relative = 1e-9);
/// The same for two spectra at once, sharing the Bessel function and the points.
Eigen::Vector2cd sommerfeld_integral(const std::function<Eigen::Vector2cd(Complex)>& spectra, Real rho,
                                     const SommerfeldPath& path, Real relative = 1e-9);

/// ∫₀^∞ f(kρ) dkρ along the same path for four integrands that carry their own Bessel
/// functions of kρ ρ (and any factor kρ). ρ = 0 is allowed when they decay along the real
/// axis by themselves (a source and observer above a half-space: e^{−|kz| (z + z')}).
Eigen::Vector4cd sommerfeld_path_integral(const std::function<Eigen::Vector4cd(Complex)>& integrand, Real rho,
                                          const SommerfeldPath& path, Real relative = 1e-9);

}  // namespace lobe
