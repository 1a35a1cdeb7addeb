#pragma once
/// The field real ground reflects, exactly: Sommerfeld integrals of the plane-wave
/// reflection coefficients, for sources and observers above the ground (z, z' > 0).
#include "core/types.hpp"

namespace lobe {

/// With kz = √(k² − kρ²), R_TE = (kz − kz1)/(kz + kz1), R_TM = (εg kz − kz1)/(εg kz + kz1),
/// kz1 = √(εg k² − kρ²), w = kρ e^{−jkz h}/(2jkz) and h = z + z', the four integrals (over
/// 4π) from which the reflected field's dyadic is built:
///   t1 = ∫ (R_TE − R_TM kz²/k²) w J0(kρ ρ),   t2 = ∫ (R_TE + R_TM kz²/k²) w J2(kρ ρ),
///   t3 = ∫ R_TM (kz kρ/k²) w J1(kρ ρ),        t4 = ∫ R_TM (kρ²/k²) w J0(kρ ρ),   m⁻¹.
/// Derived from the downward plane waves of a current element, each reflected with R_TE
/// (its E across the plane of incidence) and R_TM (its H), and the angular integrals
/// ∫ e^{−ju cos(α−φ)} {1, cos α, cos² α, sin α cos α} dα (the Jacobi–Anger expansion).
struct ReflectedIntegrals {
  Complex t1, t2, t3, t4;
};
ReflectedIntegrals reflected_integrals(Complex ground_permittivity, Real k, Real rho, Real height_sum,
                                       Real relative = 1e-7);

/// The reflected field at r of a current moment p at r' (both above the ground) is
/// E = (k²/(jωε0)) G p with G (m⁻¹) from the integrals and the horizontal direction
/// (cos φ, sin φ) from r' to r:
///   Gxx = t1 + t2 cos 2φ, Gyy = t1 − t2 cos 2φ, Gxy = Gyx = t2 sin 2φ,
///   Gxz = 2j t3 cos φ, Gyz = 2j t3 sin φ, Gzx = −2j t3 cos φ, Gzy = −2j t3 sin φ, Gzz = 2 t4.
/// So a Galerkin term is jωμ0 ∫∫ f_m · G f_n, and G(r, r') = G(r', r)ᵀ (reciprocity).
Eigen::Matrix3cd reflected_dyadic(const ReflectedIntegrals& t, Real cos_phi, Real sin_phi);

}  // namespace lobe
