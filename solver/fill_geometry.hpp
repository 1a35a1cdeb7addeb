#pragma once
/// What the pair integrators need of the meshes, computed once per problem and medium and
/// reused at every frequency: segment ends, lengths and directions, triangle quadrature
/// points, and the same for every image the medium adds.
#include <vector>

#include "geometry/surface_mesh.hpp"
#include "geometry/wire_mesh.hpp"
#include "solver/junction_star.hpp"
#include "solver/medium.hpp"
#include "solver/segment_integrals.hpp"
#include "solver/triangle_pair_integrals.hpp"

namespace lobe {

/// The source elements as one image term of the medium sees them.
struct ImagedElements {
  ImageSource image;
  std::vector<SegmentGeometry> segments;
  std::vector<Vec3> directions;
  std::vector<TriangleQuadrature> triangles;
  std::vector<JunctionStar> stars;
};

/// The triangles moved down to one quasi-static image of a grounded slab.
struct SlabImageTriangles {
  SlabStaticImage image;
  std::vector<TriangleQuadrature> triangles;
};

/// A junction star as the substrate's fill needs it: its Duffy samples (the table's
/// remainder is summed over them) and the star moved down to each quasi-static image
/// shallow enough to be near it (integrated exactly in place of the samples' share).
/// Duffy points per direction on each star triangle for the substrate's remainder.
constexpr int slab_star_order = 8;

struct SlabStar {
  std::vector<StarSample> samples;
  std::vector<std::pair<SlabStaticImage, JunctionStar>> images;
};

/// A source triangle (of the surface, an image or a slab image) near an observer triangle,
/// with the pair's static part.
struct NearSource {
  const TriangleQuadrature* source;
  NearPairStatics statics;
};

struct FillGeometry {
  FillGeometry(const WireMesh& wires, const SurfaceMesh& surface, const std::vector<JunctionStar>& stars,
               const Medium& medium);
  // near_sources points into the triangle vectors: a copy would point into the original's.
  FillGeometry(const FillGeometry&) = delete;
  FillGeometry& operator=(const FillGeometry&) = delete;

  /// The static part of the near pair (triangles[observer], source), source one of
  /// triangles[q ≥ observer] or their images or slab images.
  const NearPairStatics& near_statics(int observer, const TriangleQuadrature& source) const;

  std::vector<SegmentGeometry> segments;
  std::vector<Real> lengths;
  std::vector<Vec3> directions;
  std::vector<TriangleQuadrature> triangles;
  /// The triangles along a space-filling curve (solver/spatial_order.hpp): the order in
  /// which the fill visits an observer's sources.
  std::vector<int> triangle_order;
  std::vector<ImagedElements> images;  ///< one per image term of the medium
  /// On a substrate, its quasi-static images shallow enough to be near a triangle.
  std::vector<SlabImageTriangles> slab_images;
  /// On a substrate, one per junction star.
  std::vector<SlabStar> slab_stars;
  /// Per observer triangle p, its near sources among triangles[q ≥ p], their images and
  /// slab images, found and integrated once per mesh: the static parts do not depend on k,
  /// and were a sixteenth of a surface fill at every frequency.
  std::vector<std::vector<NearSource>> near_sources;
};

}  // namespace lobe
