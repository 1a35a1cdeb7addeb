// The one assembly loop against the matrix the separate wire, surface and coupling fills
// produced before they were merged into it (tests/data/fill_reference_matrix.bin: written
// once by that earlier code, 91 × 91 complex doubles, column-major, little-endian). That
// code took every far triangle pair by 7 × 7 points; distant pairs now take 6 × 6, and the
// test takes that change out again, pair by pair, before comparing. That code numbered the
// surface functions in the order of their edges' vertex pairs; they are now numbered along
// a space-filling curve, and the test compares each entry with its counterpart.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <numeric>
#include <tuple>
#include <vector>

#include "core/text_file.hpp"
#include "geometry/model_parser.hpp"
#include "solver/antenna_problem.hpp"
#include "solver/assembly.hpp"
#include "solver/dense_matrix.hpp"
#include "solver/fill_geometry.hpp"
#include "solver/triangle_pair_integrals.hpp"

namespace lobe {
namespace {

ComplexMatrix reference_matrix(Eigen::Index n) {
  ComplexMatrix z(n, n);
  std::ifstream in(LOBE_SOURCE_DIR "/tests/data/fill_reference_matrix.bin", std::ios::binary);
  in.read(reinterpret_cast<char*>(z.data()), static_cast<std::streamsize>(sizeof(Complex) * n * n));
  EXPECT_TRUE(in && in.peek() == EOF) << "reference matrix of another size";
  return z;
}

/// What the distant pairs' 6 × 6 rule adds to Z over the 7 × 7 rule, direct and image terms,
/// (an RwgPiece's basis is the function's index among all unknowns).
ComplexMatrix distant_rule_change(const AntennaProblem& problem, Real frequency_hz) {
  const FillGeometry& g = *problem.geometry;
  const Real k = problem.medium.wavenumber(frequency_hz);
  const Complex vector_factor = problem.medium.vector_factor(frequency_hz);
  const Complex scalar_factor = problem.medium.scalar_factor(frequency_hz);
  const auto change = [k](const TriangleQuadrature& p, const TriangleQuadrature& q) {
    TrianglePairIntegrals d;
    if (!triangle_pair_is_distant(p, q)) return d;
    const TrianglePairIntegrals six = triangle_pair_integrals_distant(p, q, k);
    const TrianglePairIntegrals seven = triangle_pair_integrals_by_points(p, q, k);
    d.vector = six.vector - seven.vector;
    d.scalar = six.scalar - seven.scalar;
    return d;
  };
  const int count = static_cast<int>(g.triangles.size());
  ComplexMatrix delta = ComplexMatrix::Zero(problem.unknowns(), problem.unknowns());
  for (int p = 0; p < count; ++p)
    for (int q = p; q < count; ++q) {
      TrianglePairIntegrals d = change(g.triangles[p], g.triangles[q]);
      for (const ImagedElements& imaged : g.images) {
        const TrianglePairIntegrals image = change(g.triangles[p], imaged.triangles[q]);
        d.vector += imaged.image.current_sign * image.vector;
        d.scalar += imaged.image.charge_sign * image.scalar;
      }
      for (const RwgPiece& pm : problem.rwg.pieces_on(p))
        for (const RwgPiece& pn : problem.rwg.pieces_on(q)) {
          const Complex value = pm.coefficient * pn.coefficient *
                                (vector_factor * d.vector(pm.free_corner, pn.free_corner) + scalar_factor * 4.0 * d.scalar);
          delta(pm.basis, pn.basis) += value;
          if (p != q) delta(pn.basis, pm.basis) += value;
        }
    }
  return delta;
}

/// Per unknown, its index in the reference matrix: the surface functions there come in the
/// order of their edges' vertex pairs (a < b), the other unknowns where they are now.
std::vector<Eigen::Index> reference_numbering(const AntennaProblem& problem) {
  std::vector<Eigen::Index> numbering(static_cast<std::size_t>(problem.unknowns()));
  std::iota(numbering.begin(), numbering.end(), 0);
  const RwgBasis& rwg = problem.rwg;
  std::vector<int> by_vertices(static_cast<std::size_t>(rwg.size()));
  std::iota(by_vertices.begin(), by_vertices.end(), 0);
  std::sort(by_vertices.begin(), by_vertices.end(), [&rwg](int x, int y) {
    return std::tie(rwg.edge(x).a, rwg.edge(x).b) < std::tie(rwg.edge(y).a, rwg.edge(y).b);
  });
  for (std::size_t rank = 0; rank < by_vertices.size(); ++rank)
    numbering[static_cast<std::size_t>(rwg.first() + by_vertices[rank])] = rwg.first() + static_cast<Eigen::Index>(rank);
  return numbering;
}

// Wires (a bent one among them), a plate, two wire-to-plate junctions, a lumped load,
// conductor loss on two wires and a perfect ground: every integrator, every image term and
// both stamps. Each entry within 1e-12 of the old one relative to its scale
// √|Z_ii Z_jj|: an entry that cancels to ~1e-17 of that scale cannot be compared to
// itself (the old fill run with one thread instead of two moved one such entry by 85 %,
// and every other by less than 5e-16 of the scale).
TEST(Assembly, ReproducesTheSeparateFillsEntryByEntry) {
  const std::string path = LOBE_SOURCE_DIR "/tests/data/fill_reference.lobe";
  const Model model = parse_model(read_text_file(path, 1 << 20, "model"), path);
  const AntennaProblem problem(model);
  ASSERT_EQ(problem.unknowns(), 91);
  ASSERT_EQ(problem.stars.size(), 2u);
  DenseMatrix matrix(problem.unknowns());
  assemble_system(problem, model.frequencies_hz.front(), matrix);
  const ComplexMatrix z = matrix.entries() - distant_rule_change(problem, model.frequencies_hz.front());
  const ComplexMatrix stored = reference_matrix(problem.unknowns());
  const std::vector<Eigen::Index> numbering = reference_numbering(problem);
  const auto old = [&stored, &numbering](Eigen::Index i, Eigen::Index j) {
    return stored(numbering[static_cast<std::size_t>(i)], numbering[static_cast<std::size_t>(j)]);
  };
  Real worst = 0.0;
  for (Eigen::Index j = 0; j < z.cols(); ++j)
    for (Eigen::Index i = 0; i < z.rows(); ++i) {
      const Real scale = std::sqrt(std::abs(old(i, i)) * std::abs(old(j, j)));
      worst = std::max(worst, std::abs(z(i, j) - old(i, j)) / scale);
    }
  std::printf("largest difference from the separate fills: %.2e of the entry's scale\n", worst);
  EXPECT_LE(worst, 1e-12);
}

}  // namespace
}  // namespace lobe
