#pragma once
/// The part of Gmsh's API the surface mesher uses, through Gmsh's C interface, with the
/// library loaded on first use: Gmsh and the OpenCASCADE libraries under it take about
/// 0.1 s to load and initialise, which a model without plates or bodies should not pay.
/// Every call throws std::runtime_error with Gmsh's message when Gmsh reports a failure,
/// or when the library cannot be loaded.
#include <cstddef>
#include <string>
#include <utility>
#include <vector>

#include "core/types.hpp"

namespace lobe::gmsh_library {

/// (dimension, tag) pairs, Gmsh's way of naming model entities.
using DimTags = std::vector<std::pair<int, int>>;

void initialize();
void finalize();
void set_number_option(const std::string& name, double value);
void add_model(const std::string& name);

int add_point(const Vec3& p);
int add_line(int start, int end);
int add_curve_loop(std::vector<int> curves);
int add_plane_surface(std::vector<int> loops);
int add_disk(const Vec3& centre, double rx, double ry);
int add_sphere(const Vec3& centre, double radius);
int add_box(const Vec3& corner, const Vec3& size);
void rotate(DimTags entities, const Vec3& point, const Vec3& axis, double angle);
void translate(DimTags entities, const Vec3& shift);
/// `rows`: a 3 × 4 matrix by rows.
void affine_transform(DimTags entities, std::vector<double> rows);
double mass(int dim, int tag);
Vec3 centre_of_mass(int dim, int tag);

/// A boolean operation's result and, per input entity, what it became.
struct BooleanResult {
  DimTags out;
  std::vector<DimTags> map;
};
BooleanResult cut(DimTags objects, DimTags tools);
BooleanResult fragment(DimTags objects, DimTags tools);

void synchronize();
DimTags boundary(DimTags entities, bool combined, bool oriented, bool recursive);
void set_mesh_size(DimTags points, double size);
void generate_mesh(int dim);

struct Nodes {
  std::vector<std::size_t> tags;
  std::vector<double> coordinates;  ///< x, y, z per node
};
/// The nodes of entity (dim, tag), or of the whole model with dim = tag = −1.
Nodes nodes(int dim = -1, int tag = -1, bool include_boundary = false);

struct Elements {
  std::vector<std::size_t> tags;
  std::vector<std::size_t> nodes;  ///< node tags, one run per element
};
Elements elements_of_type(int type, int tag);

}  // namespace lobe::gmsh_library
