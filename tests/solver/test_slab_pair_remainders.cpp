// The substrate's remainder kernels over triangle pairs: distant pairs take the 6 × 6
// degree-4 rule, as in free space, and must lose no accuracy against what the 7 × 7 rule
// gives a pair at two sizes, both measured against a fine quadrature of the whole kernel
// with the tabulated remainders (the table itself is checked against Sommerfeld
// integration in test_layered_kernels.cpp).
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "core/constants.hpp"
#include "solver/slab_pair_remainders.hpp"
#include "solver/green_function.hpp"
#include "support/fine_pair_quadrature.hpp"

namespace lobe {
namespace {

// Printed-antenna boards: FR-4 1.6 mm at 2.4 GHz meshed at 2 mm and at 0.8 mm (triangles
// finer than the board is thick), and a thin 0.25 mm laminate at 5.8 GHz meshed at 1 mm;
// pairs in the board's plane, turned and offset, at two to ten sizes. What enters the
// matrix is the whole kernel: the free-space integrals with the quasi-static coefficients
// (1 and 2/(εr + 1)) plus the remainders, each pair by the rule of its distance.
TEST(SlabPairRemainders, DistantPairsAreIntegratedAsWellAsTheNearestFarPairs) {
  struct Board {
    Real thickness, permittivity, loss_tangent, frequency, size;
  };
  for (const Board& board : {Board{1.6e-3, 4.4, 0.02, 2.4e9, 2e-3}, Board{1.6e-3, 4.4, 0.02, 2.4e9, 0.8e-3},
                             Board{0.25e-3, 3.0, 0.002, 5.8e9, 1e-3}}) {
    const Real k0 = 2 * pi * board.frequency / speed_of_light;
    const GroundedSlab slab{board.thickness, Complex(board.permittivity, -board.permittivity * board.loss_tangent), k0};
    const SlabKernelTable table(slab, 0.1);
    const Complex scalar_coefficient = table.quasi_static().scalar;
    const auto whole_kernels = [&](Real distance) {
      const Complex g = green_scale * std::exp(Complex(0.0, -k0 * distance)) / distance;
      const SlabRemainders r = table.remainder(distance);
      return PairKernels{g + r.vector, scalar_coefficient * g + r.scalar};
    };
    const Vec3 a(0, 0, 0), b(board.size, 0, 0), c(0.5 * board.size, 0.866 * board.size, 0);
    const Vec3 centre = (a + b + c) / 3;
    Real worst_far = 0.0, worst_distant = 0.0;
    for (const Real sizes : {2.0, 3.0, 5.0, 10.0})
      for (int o = 0; o < 6; ++o) {
        const Eigen::Matrix3d turn = Eigen::AngleAxisd(1.1 * o, Vec3::UnitZ()).toRotationMatrix();
        // A little beyond the distance, so that the centroids' spacing is not on the boundary.
        const Vec3 offset = 1.0001 * sizes * board.size * Vec3(std::cos(0.5 * o), std::sin(0.5 * o), 0.0);
        SurfaceMesh mesh;
        mesh.vertices = {a, b, c};
        for (const Vec3& v : {a, b, c}) mesh.vertices.push_back(turn * (v - centre) + centre + offset);
        mesh.triangles = {{0, 1, 2}, {3, 4, 5}};
        const std::vector<TriangleQuadrature> t = triangle_quadrature(mesh);
        TrianglePairIntegrals whole = triangle_pair_integrals(t[0], t[1], k0);
        whole.scalar *= scalar_coefficient;
        const TrianglePairIntegrals remainders = slab_remainder_integrals(table, t[0], t[1]);
        whole.vector += remainders.vector;
        whole.scalar += remainders.scalar;
        const Real error = relative_error(whole, fine_pair_integrals(t[0], t[1], whole_kernels));
        if (sizes < distant_distance_in_sizes) {
          ASSERT_FALSE(triangle_pair_is_near(t[0], t[1]));
          worst_far = std::max(worst_far, error);
        } else {
          ASSERT_TRUE(triangle_pair_is_distant(t[0], t[1]));
          worst_distant = std::max(worst_distant, error);
        }
      }
    std::printf("h %.2f mm, triangles %.1f mm: 7 x 7 at two sizes %.1e, distant pairs %.1e\n", 1e3 * board.thickness,
                1e3 * board.size, worst_far, worst_distant);
    EXPECT_LT(worst_distant, worst_far) << "h " << board.thickness << ", size " << board.size;
  }
}

}  // namespace
}  // namespace lobe
