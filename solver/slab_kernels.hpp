#pragma once
/// The spatial Green's functions of horizontal sources and observers on a grounded slab's
/// top face, in closed form: the quasi-static direct term, the surface waves, and complex
/// images for what remains (discrete complex image method with the quasi-static and
/// surface-wave terms extracted first; Chow, Yang, Fang & Howard 1991; Aksun 1996).
#include <vector>

#include "solver/complex_images.hpp"
#include "solver/grounded_slab.hpp"

namespace lobe {

/// g(ρ) = q e^{−jk0ρ}/(4πρ) + Σ images + Σ_p −(j kp Res_p/2) H0⁽²⁾(kp ρ).
struct SpatialKernel {
  Complex quasi_static = 0.0;
  std::vector<ComplexImage> images;
  std::vector<Complex> pole_k_rho, pole_residue;

  Complex value(Real k0, Real rho) const;
  /// value less the quasi-static direct term: finite at ρ = 0, smooth enough to tabulate.
  Complex remainder(Real k0, Real rho) const;
};

/// μ0 g_A and g_V/ε0 are the slab's vector and scalar potentials of a unit source.
struct SlabKernels {
  SpatialKernel vector, scalar;
};
SlabKernels slab_kernels(const GroundedSlab& slab);

}  // namespace lobe
