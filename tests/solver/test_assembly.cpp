// The one assembly loop against the matrix the separate wire, surface and coupling fills
// produced before they were merged into it (tests/data/fill_reference_matrix.bin: written
// once by that earlier code, 91 × 91 complex doubles, column-major, little-endian).
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <fstream>

#include "core/text_file.hpp"
#include "geometry/model_parser.hpp"
#include "solver/antenna_problem.hpp"
#include "solver/assembly.hpp"
#include "solver/dense_matrix.hpp"

namespace lobe {
namespace {

ComplexMatrix reference_matrix(Eigen::Index n) {
  ComplexMatrix z(n, n);
  std::ifstream in(LOBE_SOURCE_DIR "/tests/data/fill_reference_matrix.bin", std::ios::binary);
  in.read(reinterpret_cast<char*>(z.data()), static_cast<std::streamsize>(sizeof(Complex) * n * n));
  EXPECT_TRUE(in && in.peek() == EOF) << "reference matrix of another size";
  return z;
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
  const ComplexMatrix& z = matrix.entries();
  const ComplexMatrix old = reference_matrix(problem.unknowns());
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
