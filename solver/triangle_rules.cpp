#include "solver/triangle_rules.hpp"

#include <cmath>

namespace lobe {

const TriangleRule& triangle_rule_degree5() {
  static const TriangleRule rule = [] {
    // Dunavant (1985), Table degree 5: centroid, and two orbits of three points.
    const Real s15 = std::sqrt(15.0);
    const Real a1 = (6.0 - s15) / 21.0, b1 = (9.0 + 2.0 * s15) / 21.0;
    const Real a2 = (6.0 + s15) / 21.0, b2 = (9.0 - 2.0 * s15) / 21.0;
    const Real w1 = (155.0 - s15) / 1200.0, w2 = (155.0 + s15) / 1200.0;
    TriangleRule r;
    r.points = {{1.0 / 3, 1.0 / 3, 1.0 / 3}, {a1, a1, b1}, {a1, b1, a1}, {b1, a1, a1},
                {a2, a2, b2}, {a2, b2, a2}, {b2, a2, a2}};
    r.weights = {9.0 / 40, w1, w1, w1, w2, w2, w2};
    return r;
  }();
  return rule;
}

const TriangleRule& triangle_rule_degree4() {
  static const TriangleRule rule = [] {
    // Dunavant (1985), Table degree 4.
    const Real a1 = 0.445948490915964886, b1 = 1.0 - 2.0 * a1, w1 = 0.223381589678011466;
    const Real a2 = 0.091576213509770743, b2 = 1.0 - 2.0 * a2, w2 = 0.109951743655321868;
    TriangleRule r;
    r.points = {{a1, a1, b1}, {a1, b1, a1}, {b1, a1, a1}, {a2, a2, b2}, {a2, b2, a2}, {b2, a2, a2}};
    r.weights = {w1, w1, w1, w2, w2, w2};
    return r;
  }();
  return rule;
}

TriangleRule subdivided_triangle_rule(int levels) {
  // Sub-triangles as barycentric corner triples, split 4-fold per level.
  using Corner = std::array<Real, 3>;
  std::vector<std::array<Corner, 3>> pieces{{Corner{1, 0, 0}, Corner{0, 1, 0}, Corner{0, 0, 1}}};
  auto mid = [](const Corner& a, const Corner& b) { return Corner{(a[0] + b[0]) / 2, (a[1] + b[1]) / 2, (a[2] + b[2]) / 2}; };
  for (int level = 0; level < levels; ++level) {
    std::vector<std::array<Corner, 3>> next;
    for (const auto& [p, q, r] : pieces) {
      const Corner pq = mid(p, q), qr = mid(q, r), rp = mid(r, p);
      next.push_back({p, pq, rp});
      next.push_back({pq, q, qr});
      next.push_back({rp, qr, r});
      next.push_back({pq, qr, rp});
    }
    pieces = std::move(next);
  }
  const TriangleRule& base = triangle_rule_degree5();
  TriangleRule rule;
  const Real share = 1.0 / static_cast<Real>(pieces.size());
  for (const auto& corners : pieces)
    for (std::size_t i = 0; i < base.points.size(); ++i) {
      Corner point{0, 0, 0};
      for (int k = 0; k < 3; ++k)
        for (int c = 0; c < 3; ++c) point[c] += base.points[i][k] * corners[k][c];
      rule.points.push_back(point);
      rule.weights.push_back(base.weights[i] * share);
    }
  return rule;
}

}  // namespace lobe
