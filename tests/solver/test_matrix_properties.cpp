#include <gtest/gtest.h>

#include "geometry/model_parser.hpp"
#include "solver/dense_matrix.hpp"
#include "solver/antenna_problem.hpp"
#include "solver/coupling_fill.hpp"
#include "solver/impedance_fill.hpp"
#include "solver/surface_fill.hpp"

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

// A plate over ground with a whip on it, a wire from the ground up to the plate and a port
// across a line on the plate: wire, surface, junction and image terms of every kind.
const char* mixed =
    "units mm\nground perfect\n"
    "plate deck rectangle corner (-100, -100, 50) size (200, 200)\nmesh deck size 40\n"
    "wire whip from (0, 0, 50) to (0, 0, 120) radius 1\n"
    "wire riser from (50, 0, 0) to (50, 0, 50) radius 1\n"
    "wire stub from (-60, -60, 90) to (60, -60, 90) radius 1\n"
    "port a on whip at start\nport b on riser at start\n"
    "port c on deck along (-100, 60, 50) to (-40, 60, 50)\nfrequency 600 MHz\n";

// Galerkin testing of a symmetric kernel, wires and surfaces alike: Z_mn = Z_nm; and the
// port admittances from a general (unsymmetric) LU solve are reciprocal. 1e-6 relative.
TEST(MatrixProperties, MixedWireSurfaceFillIsSymmetricAndReciprocal) {
  const Model model = parse_model(mixed, "m");
  const AntennaProblem problem(model);
  ASSERT_EQ(problem.stars.size(), 2u);
  const Real f = 600e6;
  ComplexMatrix z = ComplexMatrix::Zero(problem.unknowns(), problem.unknowns());
  add_wire_impedance(problem.mesh, problem.basis, true, f, z);
  add_surface_impedance(problem.surfaces.mesh, problem.rwg, true, f, z);
  add_coupling_impedance(problem.mesh, problem.basis, problem.surfaces.mesh, problem.rwg, problem.stars, true, f, z);
  ASSERT_TRUE(z.allFinite());
  EXPECT_LE((z - z.transpose()).norm(), 1e-6 * z.norm());
  const ComplexMatrix p = problem.port_vectors.cast<Complex>();
  const ComplexMatrix y = p.transpose() * z.partialPivLu().solve(p);
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < i; ++j) EXPECT_LE(std::abs(y(i, j) - y(j, i)), 1e-6 * y.norm()) << i << ", " << j;
}

}  // namespace
}  // namespace lobe
