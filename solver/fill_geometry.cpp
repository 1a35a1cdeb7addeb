#include "solver/fill_geometry.hpp"

#include <algorithm>

namespace lobe {

FillGeometry::FillGeometry(const WireMesh& wires, const SurfaceMesh& surface, const std::vector<JunctionStar>& stars,
                           const Medium& medium)
    : triangles(triangle_quadrature(surface)) {
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
}

}  // namespace lobe
