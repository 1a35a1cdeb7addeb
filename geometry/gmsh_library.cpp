#include "geometry/gmsh_library.hpp"

#include <dlfcn.h>
#include <gmshc.h>

#include <mutex>
#include <stdexcept>

namespace lobe::gmsh_library {
namespace {

/// The library's handle, opened once; null with `load_error` set when it could not be.
void* library = nullptr;
std::string load_error;

void open_library() {
  static std::once_flag once;
  std::call_once(once, [] {
    // The file the build found, then the same name on the loader's search path.
    for (const char* name : {LOBE_GMSH_LIBRARY, LOBE_GMSH_SONAME}) {
      library = dlopen(name, RTLD_NOW | RTLD_LOCAL);
      if (library) return;
      load_error = dlerror();
    }
  });
}

/// The function `name` of the library, with the type its C declaration gives it.
template <typename Function>
Function* resolve(const char* name) {
  open_library();
  if (!library) throw std::runtime_error("plates and bodies need Gmsh's library, which did not load: " + load_error);
  void* address = dlsym(library, name);
  if (!address) throw std::runtime_error(std::string("Gmsh's library lacks ") + name);
  return reinterpret_cast<Function*>(address);
}

// Each wrapper resolves its function once (a function-local static per call site).
#define LOBE_GMSH(function) (*[] { static auto* f = resolve<decltype(::function)>(#function); return f; }())

/// Throws Gmsh's last error message when `ierr` reports a failure.
void check(int ierr, const char* what) {
  if (ierr == 0) return;
  char* message = nullptr;
  int ignored = 0;
  LOBE_GMSH(gmshLoggerGetLastError)(&message, &ignored);
  std::string text = std::string("Gmsh failed in ") + what + (message && *message ? std::string(": ") + message : "");
  if (message) LOBE_GMSH(gmshFree)(message);
  throw std::runtime_error(text);
}

std::vector<int> flat(const DimTags& entities) {
  std::vector<int> out;
  for (const auto& [dim, tag] : entities) out.insert(out.end(), {dim, tag});
  return out;
}

DimTags pairs(const int* flat, std::size_t count) {
  DimTags out;
  for (std::size_t i = 0; i + 1 < count; i += 2) out.emplace_back(flat[i], flat[i + 1]);
  return out;
}

/// Copies an array Gmsh allocated and frees it.
template <typename T>
std::vector<T> take(T* data, std::size_t count) {
  std::vector<T> out(data, data + count);
  LOBE_GMSH(gmshFree)(data);
  return out;
}

using BooleanFunction = decltype(gmshModelOccCut);

BooleanResult boolean(BooleanFunction* function, DimTags objects, DimTags tools, const char* what) {
  std::vector<int> o = flat(objects), t = flat(tools);
  int* out = nullptr;
  std::size_t out_n = 0, map_nn = 0;
  int** map = nullptr;
  std::size_t* map_n = nullptr;
  int ierr = 0;
  function(o.data(), o.size(), t.data(), t.size(), &out, &out_n, &map, &map_n, &map_nn, -1, 1, 1, &ierr);
  check(ierr, what);
  BooleanResult result;
  result.out = pairs(out, out_n);
  LOBE_GMSH(gmshFree)(out);
  for (std::size_t i = 0; i < map_nn; ++i) {
    result.map.push_back(pairs(map[i], map_n[i]));
    LOBE_GMSH(gmshFree)(map[i]);
  }
  LOBE_GMSH(gmshFree)(map);
  LOBE_GMSH(gmshFree)(map_n);
  return result;
}

}  // namespace

void initialize() {
  int ierr = 0;
  // Without the user's Gmsh configuration files: meshes must not depend on them.
  LOBE_GMSH(gmshInitialize)(0, nullptr, 0, &ierr);
  check(ierr, "initialize");
}

void finalize() {
  int ierr = 0;
  LOBE_GMSH(gmshFinalize)(&ierr);
  check(ierr, "finalize");
}

void set_number_option(const std::string& name, double value) {
  int ierr = 0;
  LOBE_GMSH(gmshOptionSetNumber)(name.c_str(), value, &ierr);
  check(ierr, "setting an option");
}

void add_model(const std::string& name) {
  int ierr = 0;
  LOBE_GMSH(gmshModelAdd)(name.c_str(), &ierr);
  check(ierr, "adding a model");
}

int add_point(const Vec3& p) {
  int ierr = 0;
  const int tag = LOBE_GMSH(gmshModelOccAddPoint)(p.x(), p.y(), p.z(), 0.0, -1, &ierr);
  check(ierr, "adding a point");
  return tag;
}

int add_line(int start, int end) {
  int ierr = 0;
  const int tag = LOBE_GMSH(gmshModelOccAddLine)(start, end, -1, &ierr);
  check(ierr, "adding a line");
  return tag;
}

int add_curve_loop(std::vector<int> curves) {
  int ierr = 0;
  const int tag = LOBE_GMSH(gmshModelOccAddCurveLoop)(curves.data(), curves.size(), -1, &ierr);
  check(ierr, "adding a curve loop");
  return tag;
}

int add_plane_surface(std::vector<int> loops) {
  int ierr = 0;
  const int tag = LOBE_GMSH(gmshModelOccAddPlaneSurface)(loops.data(), loops.size(), -1, &ierr);
  check(ierr, "adding a plane surface");
  return tag;
}

int add_disk(const Vec3& centre, double rx, double ry) {
  int ierr = 0;
  const int tag = LOBE_GMSH(gmshModelOccAddDisk)(centre.x(), centre.y(), centre.z(), rx, ry, -1, &ierr);
  check(ierr, "adding a disc");
  return tag;
}

int add_sphere(const Vec3& centre, double radius) {
  int ierr = 0;
  constexpr double pi = 3.14159265358979323846;
  const int tag = LOBE_GMSH(gmshModelOccAddSphere)(centre.x(), centre.y(), centre.z(), radius, -1, -pi / 2, pi / 2,
                                                   2 * pi, &ierr);
  check(ierr, "adding a sphere");
  return tag;
}

int add_box(const Vec3& corner, const Vec3& size) {
  int ierr = 0;
  const int tag =
      LOBE_GMSH(gmshModelOccAddBox)(corner.x(), corner.y(), corner.z(), size.x(), size.y(), size.z(), -1, &ierr);
  check(ierr, "adding a box");
  return tag;
}

void rotate(DimTags entities, const Vec3& point, const Vec3& axis, double angle) {
  std::vector<int> e = flat(entities);
  int ierr = 0;
  LOBE_GMSH(gmshModelOccRotate)(e.data(), e.size(), point.x(), point.y(), point.z(), axis.x(), axis.y(), axis.z(), angle,
                                &ierr);
  check(ierr, "rotating");
}

void translate(DimTags entities, const Vec3& shift) {
  std::vector<int> e = flat(entities);
  int ierr = 0;
  LOBE_GMSH(gmshModelOccTranslate)(e.data(), e.size(), shift.x(), shift.y(), shift.z(), &ierr);
  check(ierr, "translating");
}

void affine_transform(DimTags entities, std::vector<double> rows) {
  std::vector<int> e = flat(entities);
  int ierr = 0;
  LOBE_GMSH(gmshModelOccAffineTransform)(e.data(), e.size(), rows.data(), rows.size(), &ierr);
  check(ierr, "transforming");
}

double mass(int dim, int tag) {
  double m = 0.0;
  int ierr = 0;
  LOBE_GMSH(gmshModelOccGetMass)(dim, tag, &m, &ierr);
  check(ierr, "measuring an area");
  return m;
}

Vec3 centre_of_mass(int dim, int tag) {
  double x = 0, y = 0, z = 0;
  int ierr = 0;
  LOBE_GMSH(gmshModelOccGetCenterOfMass)(dim, tag, &x, &y, &z, &ierr);
  check(ierr, "finding a centre");
  return {x, y, z};
}

BooleanResult cut(DimTags objects, DimTags tools) {
  return boolean(LOBE_GMSH(gmshModelOccCut), std::move(objects), std::move(tools), "cutting");
}

BooleanResult fragment(DimTags objects, DimTags tools) {
  return boolean(LOBE_GMSH(gmshModelOccFragment), std::move(objects), std::move(tools), "fragmenting");
}

void synchronize() {
  int ierr = 0;
  LOBE_GMSH(gmshModelOccSynchronize)(&ierr);
  check(ierr, "synchronising");
}

DimTags boundary(DimTags entities, bool combined, bool oriented, bool recursive) {
  std::vector<int> e = flat(entities);
  int* out = nullptr;
  std::size_t out_n = 0;
  int ierr = 0;
  LOBE_GMSH(gmshModelGetBoundary)(e.data(), e.size(), &out, &out_n, combined, oriented, recursive, &ierr);
  check(ierr, "finding a boundary");
  DimTags result = pairs(out, out_n);
  LOBE_GMSH(gmshFree)(out);
  return result;
}

void set_mesh_size(DimTags points, double size) {
  std::vector<int> e = flat(points);
  int ierr = 0;
  LOBE_GMSH(gmshModelMeshSetSize)(e.data(), e.size(), size, &ierr);
  check(ierr, "setting a mesh size");
}

void generate_mesh(int dim) {
  int ierr = 0;
  LOBE_GMSH(gmshModelMeshGenerate)(dim, &ierr);
  check(ierr, "meshing");
}

Nodes nodes(int dim, int tag, bool include_boundary) {
  std::size_t* tags = nullptr;
  double *coordinates = nullptr, *parametric = nullptr;
  std::size_t tags_n = 0, coordinates_n = 0, parametric_n = 0;
  int ierr = 0;
  LOBE_GMSH(gmshModelMeshGetNodes)(&tags, &tags_n, &coordinates, &coordinates_n, &parametric, &parametric_n, dim, tag,
                                   include_boundary, 0, &ierr);
  check(ierr, "reading nodes");
  Nodes result{take(tags, tags_n), take(coordinates, coordinates_n)};
  LOBE_GMSH(gmshFree)(parametric);
  return result;
}

Elements elements_of_type(int type, int tag) {
  std::size_t *element_tags = nullptr, *node_tags = nullptr;
  std::size_t element_n = 0, node_n = 0;
  int ierr = 0;
  LOBE_GMSH(gmshModelMeshGetElementsByType)(type, &element_tags, &element_n, &node_tags, &node_n, tag, 0, 1, &ierr);
  check(ierr, "reading elements");
  return {take(element_tags, element_n), take(node_tags, node_n)};
}

}  // namespace lobe::gmsh_library
