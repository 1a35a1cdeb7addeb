// Triangle–triangle terms of the surface (RWG) fill.
#include <algorithm>
#include <array>

#include "solver/assembly.hpp"
#include "solver/pair_integrators.hpp"
#include "solver/slab_pair_remainders.hpp"
#include "solver/triangle_rules.hpp"

namespace lobe {
namespace {

/// Sums of pair integrals, Σ_m (vector_weight_m vector_m, scalar_weight_m scalar_m) over one
/// observer triangle's pairs with a source and its images, the far and distant pairs queued
/// and integrated eight at a time, a source triangle to each vector lane.
class PairSumQueue {
 public:
  PairSumQueue(const FillGeometry& geometry, int observer, Real k)
      : m_geometry(geometry), m_observer_index(observer), m_observer(geometry.triangles[observer]), m_k(k) {}

  /// Adds the weighted integrals over (observer, source) to `sum`, now or at the next flush().
  void add(const TriangleQuadrature& source, Complex vector_weight, Complex scalar_weight, TrianglePairIntegrals& sum) {
    const bool distant = triangle_pair_is_distant(m_observer, source);
    if (!distant && triangle_pair_is_near(m_observer, source)) {
      const TrianglePairIntegrals near =
          triangle_pair_integrals_near(m_observer, source, m_geometry.near_statics(m_observer_index, source), m_k);
      sum.vector += vector_weight * near.vector;
      sum.scalar += scalar_weight * near.scalar;
      return;
    }
    queue(distant ? m_distant : m_far, source, vector_weight, scalar_weight, sum);
  }

  /// Adds the weighted integrals over (observer, source) by the 7 × 7 rule, whatever the
  /// pair's distance, at the next flush().
  void add_by_points(const TriangleQuadrature& source, Complex vector_weight, Complex scalar_weight,
                     TrianglePairIntegrals& sum) {
    queue(m_far, source, vector_weight, scalar_weight, sum);
  }

  /// Completes every queued sum.
  void flush() {
    integrate(m_far);
    integrate(m_distant);
  }

 private:
  struct Target {
    TrianglePairIntegrals* sum;
    Complex vector_weight, scalar_weight;
  };
  struct Batch {
    bool distant = false;
    int count = 0;
    std::array<const TriangleQuadrature*, pair_batch_limit> sources;
    std::array<Target, pair_batch_limit> targets;
  };

  void queue(Batch& batch, const TriangleQuadrature& source, Complex vector_weight, Complex scalar_weight,
             TrianglePairIntegrals& sum) {
    batch.sources[batch.count] = &source;
    batch.targets[batch.count] = {&sum, vector_weight, scalar_weight};
    if (++batch.count == pair_batch_limit) integrate(batch);
  }

  void integrate(Batch& batch) {
    if (batch.count == 0) return;
    if (batch.distant) {
      triangle_pair_integrals_distant(m_observer, batch.sources.data(), batch.count, m_k, m_integrals.data());
    } else {
      triangle_pair_integrals_by_points(m_observer, batch.sources.data(), batch.count, m_k, m_integrals.data());
    }
    for (int l = 0; l < batch.count; ++l) {
      const Target& t = batch.targets[l];
      // Entry by entry: Eigen's scalar-times-matrix expression went through the stack.
      Complex* sum = t.sum->vector.data();
      const Complex* integral = m_integrals[l].vector.data();
      for (int i = 0; i < 9; ++i) sum[i] += t.vector_weight * integral[i];
      t.sum->scalar += t.scalar_weight * m_integrals[l].scalar;
    }
    batch.count = 0;
  }

  const FillGeometry& m_geometry;
  int m_observer_index;
  const TriangleQuadrature& m_observer;
  Real m_k;
  Batch m_far, m_distant{.distant = true, .count = 0, .sources = {}, .targets = {}};
  std::array<TrianglePairIntegrals, pair_batch_limit> m_integrals;  // a member: made once, not per batch
};

/// Asks for the parts of a source triangle its pairing reads first (the centroid and size
/// that classify the pair, the lanes of a distant pair): the sources come in spatial order,
/// scattered in memory, and each read had waited for its cache line.
void prefetch_source(const TriangleQuadrature& t) {
  __builtin_prefetch(&t.size);
  for (const Real* lane : {t.distant.x.data(), t.distant.y.data(), t.distant.z.data(), t.distant.w.data()})
    __builtin_prefetch(lane);
}

/// Source triangles whose pair sums are gathered before any is used: enough to fill the
/// batches many times over, few enough that the sums stay in the first-level cache.
constexpr int sources_per_pass = 64;

}  // namespace

void add_triangle_triangle_terms(const FillContext& c, int p, ObserverRows& rows) {
  const RwgBasis& basis = c.problem.rwg;
  const FillGeometry& g = c.geometry;
  if (basis.pieces_on(p).empty()) return;
  const TriangleQuadrature& observer = g.triangles[p];
  const int count = static_cast<int>(g.triangles.size());
  PairSumQueue queue(g, p, c.k);
  std::array<int, sources_per_pass> sources;
  std::array<TrianglePairIntegrals, sources_per_pass> sums;
  // The sources q ≥ p (the pair's roles as they always were: a near pair's integrals
  // depend slightly on which triangle observes) in the spatial order, so that the rows of
  // their functions follow one another down the observer's columns.
  for (int next = 0; next < count;) {
    int pass = 0;
    for (; next < count && pass < sources_per_pass; ++next) {
      const int q = g.triangle_order[next];
      if (q < p || basis.pieces_on(q).empty()) continue;
      sources[pass++] = q;
      prefetch_source(g.triangles[q]);
      for (const ImagedElements& imaged : g.images) prefetch_source(imaged.triangles[q]);
    }
    for (int s = 0; s < pass; ++s) {
      const int q = sources[s];
      TrianglePairIntegrals& sum = sums[s];
      sum = TrianglePairIntegrals();
      queue.add(g.triangles[q], 1.0, 1.0, sum);
      // The image of f = c (r − v) on the mirrored triangle is c (r' − M v): the integrals
      // over the mirrored source, weighted by the image's signs. G(r, M r') is symmetric in
      // the pair, so the image terms keep Z symmetric.
      for (const ImagedElements& imaged : g.images)
        queue.add(imaged.triangles[q], imaged.image.current_sign, imaged.image.charge_sign, sum);
    }
    queue.flush();
    // On a substrate the free-space integrals are the quasi-static term: the vector
    // potential's coefficient is 1, the scalar potential's 2/(εr + 1).
    if (c.slab) {
      for (int s = 0; s < pass; ++s) {
        const int q = sources[s];
        TrianglePairIntegrals& sum = sums[s];
        sum.scalar *= c.slab->quasi_static().scalar;
        const TrianglePairIntegrals remainders = slab_remainder_integrals(*c.slab, observer, g.triangles[q]);
        sum.vector += remainders.vector;
        sum.scalar += remainders.scalar;
        // The remainder holds the quasi-static images at depths 2nh, which vary on the
        // thickness's scale, finer than a triangle on a thin board: where one is near, its
        // points' share is replaced by the exact integral.
        for (const SlabImageTriangles& imaged : g.slab_images) {
          const TriangleQuadrature& image = imaged.triangles[q];
          if (!triangle_pair_is_near(observer, image)) continue;
          const Complex vector_weight = imaged.image.vector_weight, scalar_weight = imaged.image.scalar_weight;
          queue.add(image, vector_weight, scalar_weight, sum);
          queue.add_by_points(image, -vector_weight, -scalar_weight, sum);
        }
      }
      queue.flush();
    }
    for (int s = 0; s < pass; ++s) {
      const int q = sources[s];
      TrianglePairIntegrals& integrals = sums[s];
      if (p == q) integrals.vector = (0.5 * (integrals.vector + integrals.vector.transpose())).eval();
      // f = c (r − v_free), ∇·f = 2c.
      const Complex scalar_term = c.scalar_factor * 4.0 * integrals.scalar;
      // Every term is mirrored; the self pair's are each other's mirrors (the integrals were
      // made symmetric, so the two values are equal), and each brings half.
      const Real share = p == q ? 0.5 : 1.0;
      for (const RwgPiece& pm : basis.pieces_on(p)) {
        Complex* row = rows.row(pm.free_corner);
        for (const RwgPiece& pn : basis.pieces_on(q))
          row[pn.basis] += share * pm.coefficient * pn.coefficient *
                           (c.vector_factor * integrals.vector(pm.free_corner, pn.free_corner) + scalar_term);
      }
      for (const RwgPiece& pn : basis.pieces_on(q)) rows.touch(pn.basis);
    }
  }
}

double triangle_pair_kernel_evaluations(const AntennaProblem& problem) {
  const FillGeometry& g = *problem.geometry;
  const int count = static_cast<int>(g.triangles.size());
  const auto distant_points = static_cast<double>(triangle_rule_degree4().points.size());
  const auto kernels = [distant_points](const TriangleQuadrature& p, const TriangleQuadrature& q) {
    constexpr int points = TriangleQuadrature::points;
    return triangle_pair_is_distant(p, q) ? distant_points * distant_points : static_cast<double>(points * points);
  };
  double total = 0.0;
  for (int p = 0; p < count; ++p) {
    if (problem.rwg.pieces_on(p).empty()) continue;
    for (int q = p; q < count; ++q) {
      if (problem.rwg.pieces_on(q).empty()) continue;
      total += kernels(g.triangles[p], g.triangles[q]);
      for (const ImagedElements& imaged : g.images) total += kernels(g.triangles[p], imaged.triangles[q]);
    }
  }
  return total;
}

}  // namespace lobe
