#include "solver/fill_geometry.hpp"

#include <algorithm>
#include <stdexcept>

#include "solver/spatial_order.hpp"

namespace lobe {
namespace {

/// Per observer triangle p, the sources among sets[m][q ≥ p] near it, with their statics.
std::vector<std::vector<NearSource>> find_near_sources(const std::vector<TriangleQuadrature>& triangles,
                                                       const std::vector<const std::vector<TriangleQuadrature>*>& sets) {
  const int count = static_cast<int>(triangles.size());
  std::vector<std::vector<NearSource>> near(count);
#pragma omp parallel for schedule(dynamic, 16)
  for (int p = 0; p < count; ++p)
    for (const std::vector<TriangleQuadrature>* set : sets)
      for (int q = p; q < count; ++q) {
        const TriangleQuadrature& source = (*set)[q];
        if (triangle_pair_is_near(triangles[p], source))
          near[p].push_back({&source, near_pair_statics(triangles[p], source)});
      }
  return near;
}

}  // namespace

FillGeometry::FillGeometry(const WireMesh& wires, const SurfaceMesh& surface, const std::vector<JunctionStar>& stars,
                           const Medium& medium)
    : triangles(triangle_quadrature(surface)) {
  std::vector<Vec3> centroids;
  for (const TriangleQuadrature& t : triangles) centroids.push_back(t.centroid);
  triangle_order = space_filling_order(centroids);
  for (const Segment& seg : wires.segments) {
    segments.push_back({seg.start, seg.end, seg.radius});
    lengths.push_back(seg.length());
    directions.push_back(seg.direction());
  }
  for (const ImageSource& image : medium.images()) {
    ImagedElements imaged{image, {}, {}, {}, {}};
    for (std::size_t s = 0; s < segments.size(); ++s) {
      imaged.segments.push_back({image.point(segments[s].start), image.point(segments[s].end), segments[s].radius});
      imaged.directions.push_back(image.point(directions[s]));
    }
    SurfaceMesh mirrored = surface;
    for (Vec3& v : mirrored.vertices) v = image.point(v);
    imaged.triangles = triangle_quadrature(mirrored);
    for (const JunctionStar& star : stars) imaged.stars.push_back(star.imaged(image.mirror));
    images.push_back(std::move(imaged));
  }
  if (medium.has_slab()) {
    // Deeper than two triangle sizes an image is never a near pair's (triangle_pair_is_near).
    Real largest = 0.0;
    for (const TriangleQuadrature& t : triangles) largest = std::max(largest, t.size);
    for (const SlabStaticImage& image :
         slab_static_images(medium.slab_thickness(), medium.slab_permittivity(), near_distance_in_sizes * largest)) {
      SurfaceMesh moved = surface;
      for (Vec3& v : moved.vertices) v.z() -= image.depth;
      slab_images.push_back({image, triangle_quadrature(moved)});
    }
    for (const JunctionStar& star : stars) {
      SlabStar slab_star{star_samples(star, slab_star_order), {}};
      for (const SlabStaticImage& image : slab_static_images(medium.slab_thickness(), medium.slab_permittivity(),
                                                             near_distance_in_sizes * star.radius())) {
        JunctionStar moved = star;
        const Vec3 down(0.0, 0.0, image.depth);
        moved.vertex -= down;
        for (StarTriangle& t : moved.triangles) t.a -= down, t.b -= down;
        slab_star.images.emplace_back(image, std::move(moved));
      }
      slab_stars.push_back(std::move(slab_star));
    }
  }
  std::vector<const std::vector<TriangleQuadrature>*> sets{&triangles};
  for (const ImagedElements& imaged : images) sets.push_back(&imaged.triangles);
  for (const SlabImageTriangles& imaged : slab_images) sets.push_back(&imaged.triangles);
  near_sources = find_near_sources(triangles, sets);
}

const NearPairStatics& FillGeometry::near_statics(int observer, const TriangleQuadrature& source) const {
  for (const NearSource& near : near_sources[observer])
    if (near.source == &source) return near.statics;
  throw std::logic_error("a near pair missing from the fill geometry's table");
}

}  // namespace lobe
