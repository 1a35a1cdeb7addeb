#include "solver/wire_problem.hpp"

#include "solver/dense_symmetric_matrix.hpp"
#include "solver/impedance_fill.hpp"
#include "solver/lumped_load.hpp"

namespace lobe {

WireProblem::WireProblem(const Model& m) : model(m), mesh(mesh_wires(m)), basis(mesh) {
  if (basis.size() == 0) throw InputError({m.file, 1, 1}, "the model has no place for current to flow (no unknowns)");
  require_dense_memory(m, basis.size());
  port_vectors.resize(basis.size(), static_cast<Eigen::Index>(mesh.port_gaps.size()));
  for (std::size_t p = 0; p < mesh.port_gaps.size(); ++p) port_vectors.col(p) = basis.gap_vector(mesh.port_gaps[p]);
  // Ports whose gap vectors are dependent (two at one place, or one on every wire of a
  // junction) have no port impedance matrix: refuse them here rather than divide by zero.
  const Eigen::FullPivLU<Eigen::MatrixXd> ports_lu(port_vectors);
  if (ports_lu.rank() < port_vectors.cols()) {
    for (Eigen::Index p = 1; p < port_vectors.cols(); ++p)
      if (Eigen::FullPivLU<Eigen::MatrixXd>(port_vectors.leftCols(p + 1)).rank() < p + 1)
        throw InputError(m.ports[p].where, "port '" + m.ports[p].name +
                                               "' is not independent of the ports before it (two ports at one "
                                               "place, or a port on every wire of one junction)");
  }
  load_vectors.resize(basis.size(), static_cast<Eigen::Index>(mesh.load_gaps.size()));
  for (std::size_t l = 0; l < mesh.load_gaps.size(); ++l) load_vectors.col(l) = basis.gap_vector(mesh.load_gaps[l]);
}

FrequencySolution solve_frequency(const WireProblem& problem, Real frequency_hz) {
  const Eigen::Index n = problem.basis.size();
  DenseSymmetricMatrix matrix(n);
  ComplexMatrix& z = matrix.entries();
  add_wire_impedance(problem.mesh, problem.basis, problem.model.ground_perfect, frequency_hz, z);
  add_conductor_impedance(problem.mesh, problem.basis, frequency_hz, z);
  for (std::size_t l = 0; l < problem.model.loads.size(); ++l) {
    // Z += z_load p pᵀ over the few non-zero couplings of the load's gap.
    const auto p = problem.load_vectors.col(static_cast<Eigen::Index>(l));
    const Complex z_load = load_impedance(problem.model.loads[l], frequency_hz);
    for (Eigen::Index i = 0; i < n; ++i)
      if (p[i] != 0.0)
        for (Eigen::Index j = 0; j < n; ++j)
          if (p[j] != 0.0) z(i, j) += z_load * p[i] * p[j];
  }
  matrix.factor();

  FrequencySolution solution;
  solution.frequency_hz = frequency_hz;
  const ComplexMatrix drives = problem.port_vectors.cast<Complex>();
  const ComplexMatrix unit_responses = matrix.solve(drives, solution.report);
  solution.port_admittance = drives.transpose() * unit_responses;
  const auto ports = problem.model.ports.size();
  solution.port_voltages.resize(static_cast<Eigen::Index>(ports));
  for (std::size_t p = 0; p < ports; ++p) solution.port_voltages[p] = problem.model.ports[p].voltage;
  solution.coefficients = unit_responses * solution.port_voltages;
  solution.port_currents = solution.port_admittance * solution.port_voltages;

  solution.segment_currents.assign(problem.mesh.segments.size(), {Complex(0.0), Complex(0.0)});
  for (std::size_t s = 0; s < problem.mesh.segments.size(); ++s)
    for (const BasisPiece& piece : problem.basis.pieces_on(static_cast<int>(s)))
      solution.segment_currents[s][piece.peak_end] += piece.sign * solution.coefficients[piece.basis];
  return solution;
}

}  // namespace lobe
