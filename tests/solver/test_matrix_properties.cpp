#include <gtest/gtest.h>

#include "geometry/model_parser.hpp"
#include "solver/dense_symmetric_matrix.hpp"
#include "solver/impedance_fill.hpp"
#include "solver/antenna_problem.hpp"

namespace lobe {
namespace {

// A bent, branched structure with different radii over ground: every kind of element pair.
const char* branched =
    "units mm\nground perfect\n"
    "wire mast from (0,0,0) to (0,0,300) radius 2 segments 6\n"
    "wire arm1 through (0,0,300) (200,0,350) (250,100,400) radius 1 segments 7\n"
    "wire arm2 from (0,0,300) to (-150,50,250) radius 1.5 segments 4\n"
    "port p on mast at start\nfrequency 400 MHz\n";

// Galerkin testing with a symmetric kernel gives Z_mn = Z_nm (reciprocity); 1e-6 relative.
TEST(MatrixProperties, GalerkinFillIsSymmetric) {
  const Model model = parse_model(branched, "m");
  const AntennaProblem problem(model);
  ComplexMatrix z = ComplexMatrix::Zero(problem.basis.size(), problem.basis.size());
  add_wire_impedance(problem.mesh, problem.basis, true, 400e6, z);
  EXPECT_LE((z - z.transpose()).norm(), 1e-6 * z.norm());
  EXPECT_TRUE(z.allFinite());
}

// Kirchhoff's law at a three-wire junction: currents at the node sum to zero, by the
// construction of the junction basis.
TEST(MatrixProperties, JunctionCurrentsSumToZero) {
  const Model model = parse_model(branched, "m");
  const AntennaProblem problem(model);
  const FrequencySolution s = solve_frequency(problem, 400e6);
  for (const auto& node : problem.mesh.nodes) {
    if (node.on_ground || node.ends.size() < 3) continue;
    Complex sum = 0.0;
    for (const auto& e : node.ends) sum += (e.end == 1 ? 1.0 : -1.0) * s.segment_currents[e.segment][e.end];
    EXPECT_LE(std::abs(sum), 1e-12 * std::abs(s.port_currents[0]));
  }
  EXPECT_LT(s.report.relative_residual, 1e-10);
}

}  // namespace
}  // namespace lobe
