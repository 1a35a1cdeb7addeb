#include "solver/scattering_problem.hpp"

#include "core/constants.hpp"
#include "solver/dense_symmetric_matrix.hpp"
#include "solver/surface_fill.hpp"

namespace lobe {
namespace {

/// Default mesh: about ten triangle edges per wavelength (common practice for RWG).
constexpr Real default_edges_per_wavelength = 10.0;

std::vector<SurfaceShape> sized_shapes(const Model& model) {
  std::vector<SurfaceShape> shapes = model.surfaces;
  const Real edge = speed_of_light / model.highest_frequency() / default_edges_per_wavelength;
  for (auto& s : shapes)
    if (s.mesh_size == 0.0) s.mesh_size = edge;
  return shapes;
}

}  // namespace

ScatteringProblem::ScatteringProblem(const Model& m)
    : model(m), surfaces(mesh_surfaces(sized_shapes(m))), basis(surfaces.mesh) {
  if (basis.size() == 0)
    throw InputError({m.file, 1, 1}, "the surfaces have no interior mesh edges, so no current can flow");
  require_dense_memory(m, basis.size());
}

ScatteringSolution solve_scattering(const ScatteringProblem& problem, Real frequency_hz) {
  DenseSymmetricMatrix matrix(problem.basis.size());
  add_surface_impedance(problem.surfaces.mesh, problem.basis, frequency_hz, matrix.entries());
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
