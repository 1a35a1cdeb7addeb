#include <gtest/gtest.h>

#include <cstdio>

#include "core/constants.hpp"
#include "geometry/model_parser.hpp"
#include "geometry/surface_mesher.hpp"
#include "solver/dense_matrix.hpp"
#include "solver/antenna_problem.hpp"
#include "solver/assembly.hpp"
#include "solver/segment_integrals.hpp"
#include "solver/triangle_pair_integrals.hpp"

namespace lobe {
namespace {

// A bent, branched structure with different radii over ground: every kind of element pair.
const char* branched =
    "units mm\nground perfect\n"
    "wire mast from (0,0,0) to (0,0,300) radius 2 segments 6\n"
    "wire arm1 through (0,0,300) (200,0,350) (250,100,400) radius 1 segments 7\n"
    "wire arm2 from (0,0,300) to (-150,50,250) radius 1.5 segments 4\n"
    "port p on mast at start\nfrequency 400 MHz\n";

// Reciprocity from independently computed entries. The fill writes Z_mn and Z_nm from one
// integral, so a symmetric matrix proves nothing; here each element pair is integrated with
// its roles swapped (the observer's graded rule and the source's closed-form static part
// exchange places), and the two must agree: I_st(i, j) = I_ts(j, i).
TEST(MatrixProperties, SegmentPairsAreReciprocalWhenComputedBothWays) {
  /// Two different quadratures of one integral: measured 5e-8 apart; a wrong image,
  /// radius or orientation in either role shows far above this.
  constexpr Real tolerance = 1e-6;
  const Model model = parse_model(branched, "m");
  const WireMesh mesh = mesh_wires(model);
  const Real k = 2 * pi * 400e6 / speed_of_light;
  Real worst = 0.0;
  for (std::size_t s = 0; s < mesh.segments.size(); ++s)
    for (std::size_t t = 0; t < s; ++t) {
      const Segment &a = mesh.segments[s], &b = mesh.segments[t];
      const PairIntegrals st = segment_pair_integrals({a.start, a.end, a.radius}, {b.start, b.end, b.radius}, k);
      const PairIntegrals ts = segment_pair_integrals({b.start, b.end, b.radius}, {a.start, a.end, a.radius}, k);
      Real scale = 0.0;
      for (const Complex& v : st) scale = std::max(scale, std::abs(v));
      for (int i = 0; i < 2; ++i)
        for (int j = 0; j < 2; ++j) worst = std::max(worst, std::abs(st[2 * i + j] - ts[2 * j + i]) / scale);
    }
  std::printf("largest relative difference of swapped segment pairs: %.2e\n", worst);
  EXPECT_LT(worst, tolerance);
}

TEST(MatrixProperties, TrianglePairsAreReciprocalWhenComputedBothWays) {
  /// The near rule integrates the source in closed form but the observer with Dunavant's
  /// 7 points, which meet the potential's kink along a shared edge: touching triangles
  /// measured 4.1e-3 apart in their vector part. A swapped role or a wrong corner order
  /// shows as order one.
  constexpr Real tolerance = 5e-3;
  const SurfaceMeshReport plate = mesh_surfaces([] {
    SurfaceShape s;
    s.name = "plate";
    s.width = s.length = 0.2;
    s.mesh_size = 0.05;
    return std::vector<SurfaceShape>{s};
  }());
  const std::vector<TriangleQuadrature> q = triangle_quadrature(plate.mesh);
  const Real k = 2 * pi * 600e6 / speed_of_light;
  Real worst = 0.0;
  for (std::size_t p = 0; p < q.size(); ++p)
    for (std::size_t r = 0; r < p; ++r) {
      const TrianglePairIntegrals pr = triangle_pair_integrals(q[p], q[r], k);
      const TrianglePairIntegrals rp = triangle_pair_integrals(q[r], q[p], k);
      worst = std::max(worst, std::abs(pr.scalar - rp.scalar) / std::abs(pr.scalar));
      worst = std::max(worst, (pr.vector - rp.vector.transpose()).norm() / pr.vector.norm());
    }
  std::printf("largest relative difference of swapped triangle pairs: %.2e\n", worst);
  EXPECT_LT(worst, tolerance);
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

// The port admittances of a mixed model from a general (unsymmetric) LU solve are
// reciprocal, Y_ij = Y_ji, to 1e-6 relative, and every entry is finite.
TEST(MatrixProperties, MixedModelPortAdmittancesAreReciprocal) {
  const Model model = parse_model(mixed, "m");
  const AntennaProblem problem(model);
  ASSERT_EQ(problem.stars.size(), 2u);
  const Real f = 600e6;
  DenseMatrix matrix(problem.unknowns());
  assemble_system(problem, f, matrix);
  const ComplexMatrix& z = matrix.entries();
  ASSERT_TRUE(z.allFinite());
  const ComplexMatrix p = problem.port_vectors.cast<Complex>();
  const ComplexMatrix y = p.transpose() * z.partialPivLu().solve(p);
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < i; ++j) EXPECT_LE(std::abs(y(i, j) - y(j, i)), 1e-6 * y.norm()) << i << ", " << j;
}

}  // namespace
}  // namespace lobe
