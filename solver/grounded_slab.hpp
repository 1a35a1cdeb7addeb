#pragma once
/// A grounded dielectric slab: perfect conductor in z = 0, a dielectric of relative
/// permittivity εr = ε′(1 − j tan δ) in 0 < z < h, air above. Its Green's functions for
/// horizontal sources and observers on the top face z = h, in the spectral domain of the
/// radial wavenumber kρ (Mosig & Gardiol 1983; Michalski & Mosig 1997, formulation C, which
/// for horizontal currents on one interface has these two kernels):
///   g̃_A = 1/D_TE,  g̃_V = N/(D_TE D_TM),
///   D_TE = u0 + u1 coth(u1 h),  D_TM = εr u0 + u1 tanh(u1 h),  N = u0 + u1 tanh(u1 h),
/// with u_i = √(kρ² − εr_i k0²), Re u ≥ 0. They are normalised like the free-space kernel:
/// the spatial kernels g(ρ) = (1/2π) ∫₀^∞ g̃ J0(kρ ρ) kρ dkρ are e^{−jk0ρ}/(4πρ) plus the
/// slab's part, and the vector potential is μ0 g_A, the scalar potential g_V/ε0.
#include <vector>

#include "core/types.hpp"

namespace lobe {

struct GroundedSlab {
  Real thickness = 0.0;      ///< h, m
  Complex permittivity = 1.0; ///< εr, with Im εr ≤ 0 for a lossy dielectric
  Real k0 = 0.0;             ///< free-space wavenumber, rad/m
};

/// Whether two slabs are the same board at the same frequency.
inline bool same_slab(const GroundedSlab& a, const GroundedSlab& b) {
  return a.thickness == b.thickness && a.permittivity == b.permittivity && a.k0 == b.k0;
}

/// The normalised spectral kernels at one kρ.
struct SlabSpectrum {
  Complex vector = 0.0;  ///< g̃_A
  Complex scalar = 0.0;  ///< g̃_V
};
SlabSpectrum slab_spectrum(const GroundedSlab& slab, Complex k_rho);

/// The kernels' limits for kρ → ∞ as multiples of the free-space spectrum 1/(2u0): the
/// coefficients of their quasi-static 1/R singularity, 1 and 2/(εr + 1).
SlabSpectrum quasi_static_coefficients(const GroundedSlab& slab);

/// The far field of a horizontal current on the top face, as a multiple of the same
/// current's field in free space: E_θ takes `tm`, E_φ takes `te`, at the angle θ from the
/// zenith (< 90°). With the transmission-line model of the slab seen from z = h (a shorted
/// line of length h below, matched air above), T = 2 Z_in/(Z_in + Z0) per polarisation:
///   te = 2j k_z0 tan(k_z1 h)/(k_z1 + j k_z0 tan(k_z1 h)),
///   tm = 2j k_z1 tan(k_z1 h)/(εr k_z0 + j k_z1 tan(k_z1 h)),
/// k_z0 = k0 cos θ, k_z1 = k0 √(εr − sin²θ); te is also 2u0 g̃_A at kρ = k0 sin θ.
struct SlabFarFieldFactors {
  Complex te = 1.0, tm = 1.0;
};
SlabFarFieldFactors slab_far_field_factors(const GroundedSlab& slab, Real theta);

/// One of the quasi-static images of a source on the top face: as kρ → ∞ with k0 h fixed
/// small, g̃_A → (1 − e^{−2λh})/(2λ) and g̃_V → (2/(εr+1)) (1 − e^{−2λh})/((1 + K e^{−2λh}) 2λ)
/// (λ = kρ, K = (εr − 1)/(εr + 1)), i.e. point sources at the depths 2nh below the source
/// with weights −1 (n = 1 only) and −(2/(εr+1))(1 + K)(−K)^{n−1}. The fill integrates them
/// exactly where they are too close to a triangle for its quadrature points.
struct SlabStaticImage {
  Real depth = 0.0;  ///< 2nh, m
  Complex vector_weight = 0.0, scalar_weight = 0.0;
};
/// The images down to `deepest` (m), and none whose weights are both below 1e-9.
std::vector<SlabStaticImage> slab_static_images(Real thickness, Complex permittivity, Real deepest);

/// The spectra of a probe: a vertical current of 1 A, uniform from the ground to the top
/// face (an electrically short probe or via). Solving the slab's transmission line for the
/// vector potential A_z of that current (∂A_z/∂z = 0 on the ground, A_z and ∂A_z/∂z/εr
/// continuous at z = h) gives, with σ = tanh(u1 h)/u1 · (1 + e^{−2u1h}) and the forms of
/// slab_spectrum (te = σ D_TE, tm = (1 + e^{−2u1h}) D_TM):
///   Ã_z(z = h) = μ0 σ/tm                                   (`top`, m²),
/// the horizontal field on the top face E_t = ∇_t Φ with Φ̃ = (j/(ωε0)) u0 σ/tm, and the
/// voltage −∫₀^h E_z dz along the probe. Less the potential of the charge the current leaves
/// at its top (which a junction basis carries on the plate instead), these are
///   Φ̃_r = jωμ0 (εr − 1) p̃,                  p̃ = σ²/(te tm)            (`coupling`, m³),
///   W̃ = jωμ0 h/u1² − jωμ0 [(εr − 1) p̃ + εr q̃],  q̃ = u0 σ/(u1² tm)    (`self`, m³);
/// the first part of W̃ is a line current in an unbounded dielectric, (ωμ0 h/4) H0⁽²⁾(k1 ρ).
/// For εr = 1 they are the free-space potentials of the probe and its image.
struct ProbeSpectrum {
  Complex top = 0.0;       ///< σ/tm
  Complex coupling = 0.0;  ///< p̃
  Complex self = 0.0;      ///< q̃
};
ProbeSpectrum probe_spectrum(const GroundedSlab& slab, Complex k_rho);

/// The far-zone vector potential of the probe of 1 A at the angle θ < 90° from the zenith,
/// as μ0 e^{−jk0 r}/(4π r) times this length (m), the phase referred to the ground:
/// 2j k_z0 τ e^{jk_z0 h}/(j εr k_z0 − k_z1² τ), τ = tan(k_z1 h)/k_z1 (on an air board,
/// 2 sin(k0 h cos θ)/(k0 cos θ): the probe and its image).
Complex probe_far_field_length(const GroundedSlab& slab, Real theta);

/// A surface-wave pole of the kernels: kρ = k_rho (Re > k0, Im ≤ 0), with the residues of
/// g̃_A and g̃_V there. TM poles are zeros of D_TM (they reach g̃_V only); TE poles are
/// zeros of D_TE. `probe` holds the residues of p̃ and q̃.
struct SurfaceWavePole {
  Complex k_rho = 0.0;
  SlabSpectrum residue;
  ProbeSpectrum probe;
  bool transverse_magnetic = true;
};

/// Every surface-wave pole of the slab, TM0 first. A slab of permittivity 1 has none.
std::vector<SurfaceWavePole> surface_wave_poles(const GroundedSlab& slab);

/// The spatial form of a pole's term 2 kp Res/(kρ² − kp²) of the spectrum: −(j kp Res/2) H0⁽²⁾(kp ρ).
Complex surface_wave_term(Complex k_pole, Complex residue, Real rho);

}  // namespace lobe
