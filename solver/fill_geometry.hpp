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

struct FillGeometry {
  FillGeometry(const WireMesh& wires, const SurfaceMesh& surface, const std::vector<JunctionStar>& stars,
               const Medium& medium);
  std::vector<SegmentGeometry> segments;
  std::vector<Real> lengths;
  std::vector<Vec3> directions;
  std::vector<TriangleQuadrature> triangles;
  std::vector<ImagedElements> images;  ///< one per image term of the medium
  /// On a substrate, its quasi-static images shallow enough to be near a triangle.
  std::vector<SlabImageTriangles> slab_images;
  /// On a substrate, one per junction star.
  std::vector<SlabStar> slab_stars;
};

}  // namespace lobe
