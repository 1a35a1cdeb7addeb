#include "solver/slab_kernels.hpp"

#include <algorithm>
#include <cmath>

#include "core/constants.hpp"

namespace lobe {
namespace {

/// The kernel's complex images: F(k_z) = 2u0 (g̃ − q/(2u0) − Σ 2kp Res/(kρ² − kp²)),
/// u0 = j k_z, which tends to zero far along the level-1 path.
std::vector<ComplexImage> images_of(const GroundedSlab& slab, bool vector, Complex quasi_static,
                                    const std::vector<SurfaceWavePole>& poles) {
  const Real k0 = slab.k0;
  const auto f = [&](Complex kz) {
    const Complex u0 = j_unit * kz, k_rho_squared = k0 * k0 - kz * kz;
    const SlabSpectrum s = slab_spectrum(slab, std::sqrt(k_rho_squared));
    Complex g = (vector ? s.vector : s.scalar) - quasi_static / (2.0 * u0);
    for (const SurfaceWavePole& p : poles) {
      const Complex residue = vector ? p.residue.vector : p.residue.scalar;
      g -= 2.0 * p.k_rho * residue / (k_rho_squared - p.k_rho * p.k_rho);
    }
    return 2.0 * u0 * g;
  };
  ImageSampling sampling;
  // Level 2 must reach past every pole and the dielectric's branch of u1; level 1 far
  // enough for the slab's own scale (kρ h of several).
  sampling.far_start = std::sqrt(std::abs(slab.permittivity)) + 1.0;
  sampling.far_length = std::max(50.0, 20.0 / (k0 * slab.thickness));
  return fit_complex_images(f, k0, sampling);
}

}  // namespace

Complex SpatialKernel::remainder(Real k0, Real rho) const {
  Complex sum = image_sum(images, k0, rho);
  for (std::size_t p = 0; p < pole_k_rho.size(); ++p) sum += surface_wave_term(pole_k_rho[p], pole_residue[p], rho);
  return sum;
}

Complex SpatialKernel::value(Real k0, Real rho) const {
  return quasi_static * std::polar(1.0 / (4.0 * pi * rho), -k0 * rho) + remainder(k0, rho);
}

SlabKernels slab_kernels(const GroundedSlab& slab) {
  const std::vector<SurfaceWavePole> poles = surface_wave_poles(slab);
  const SlabSpectrum q = quasi_static_coefficients(slab);
  SlabKernels kernels;
  kernels.vector.quasi_static = q.vector;
  kernels.scalar.quasi_static = q.scalar;
  for (const SurfaceWavePole& p : poles) {
    if (p.residue.vector != 0.0) {
      kernels.vector.pole_k_rho.push_back(p.k_rho);
      kernels.vector.pole_residue.push_back(p.residue.vector);
    }
    kernels.scalar.pole_k_rho.push_back(p.k_rho);
    kernels.scalar.pole_residue.push_back(p.residue.scalar);
  }
  kernels.vector.images = images_of(slab, true, q.vector, poles);
  kernels.scalar.images = images_of(slab, false, q.scalar, poles);
  return kernels;
}

}  // namespace lobe
