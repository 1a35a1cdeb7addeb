#pragma once
/// The discrete complex image method: a spectral function, written F(k_z)/(2j k_z) with
/// k_z = √(k0² − kρ²), is approximated by exponentials F ≈ Σ a_i e^{−b_i k_z}; by the
/// Sommerfeld identity each is the field of a point source at the complex depth b_i (more
/// exactly at z = −j b_i), a_i e^{−jk0 R_i}/(4π R_i) with R_i = √(ρ² − b_i²). The robust
/// two-level sampling of Aksun (1996) fits the far part of the spectrum first, then what
/// remains near the branch point; the exponents by the pencil-of-function method.
#include <functional>
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// a e^{−jk0 R}/(4πR), R = √(ρ² + depth²) with Re R ≥ 0; depth = −j b, complex.
struct ComplexImage {
  Complex amplitude = 0.0;
  Complex depth = 0.0;
};

/// Where the two levels sample: level 1 on k_z = −j k0 (far_start + t), 0 ≤ t ≤ far_length,
/// level 2 on k_z = k0 (1 − t/far_start − j t), 0 ≤ t ≤ far_start.
struct ImageSampling {
  Real far_start = 5.0;
  Real far_length = 200.0;
  int samples = 120;
  Real tolerance = 1e-8;  ///< relative singular-value cut of the pencil
};

/// The images of F (a function of k_z, decaying along level 1's path).
std::vector<ComplexImage> fit_complex_images(const std::function<Complex(Complex)>& f_of_kz, Real k0,
                                             const ImageSampling& sampling);

/// Σ of the images at radius ρ.
Complex image_sum(const std::vector<ComplexImage>& images, Real k0, Real rho);

}  // namespace lobe
