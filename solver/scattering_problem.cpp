#include "solver/scattering_problem.hpp"

#include "solver/dense_matrix.hpp"
#include "solver/frequency_limits.hpp"
#include "solver/surface_fill.hpp"

namespace lobe {

namespace {

/// Refuses, before meshing, a model whose matrices could never fit in memory.
const Model& checked_before_meshing(const Model& model) {
  require_dense_memory(model, estimated_surface_functions(model), true);
  return model;
}

}  // namespace

ScatteringProblem::ScatteringProblem(const Model& m)
    : model(m), surfaces(mesh_model_surfaces(checked_before_meshing(m))), basis(surfaces.mesh) {
  if (basis.size() == 0)
    throw InputError({m.file, 1, 1}, "the surfaces have no interior mesh edges, so no current can flow");
  require_dense_memory(m, basis.size());
  for (MeshWarning& w : check_frequency_limits(m, WireMesh{}, surfaces.mesh)) surfaces.warnings.push_back(std::move(w));
}

ScatteringSolution solve_scattering(const ScatteringProblem& problem, Real frequency_hz) {
  DenseMatrix matrix(problem.basis.size());
  add_surface_impedance(problem.surfaces.mesh, problem.basis, false, frequency_hz, matrix.entries());
  matrix.factor();
  const PlaneWave& wave = *problem.model.wave;
  const ComplexVector v = wave.amplitude * plane_wave_excitation(problem.surfaces.mesh, problem.basis, frequency_hz,
                                                                 wave.theta, wave.phi, wave.theta_polarized);
  ScatteringSolution solution;
  solution.frequency_hz = frequency_hz;
  solution.currents = matrix.solve(v, solution.report);
  return solution;
}

}  // namespace lobe
