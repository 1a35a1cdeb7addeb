#pragma once
/// Plates and bodies lit by a plane wave: the meshed problem and its solution.
#include "geometry/model.hpp"
#include "geometry/surface_mesher.hpp"
#include "solver/rwg_basis.hpp"
#include "solver/system_matrix.hpp"

namespace lobe {

/// Everything that does not change with frequency. Mesh sizes the model leaves open are a
/// tenth of the wavelength at its highest frequency.
struct ScatteringProblem {
  explicit ScatteringProblem(const Model& model);
  const Model& model;
  SurfaceMeshReport surfaces;
  RwgBasis basis;
};

struct ScatteringSolution {
  Real frequency_hz = 0.0;
  ComplexVector currents;  ///< RWG coefficients, A/m, for the model's wave
  SolveReport report;
};

/// Fills, factors and solves at one frequency. Throws NumericalError on failure.
ScatteringSolution solve_scattering(const ScatteringProblem& problem, Real frequency_hz);

}  // namespace lobe
