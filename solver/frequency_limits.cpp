#include "solver/frequency_limits.hpp"

#include <algorithm>
#include <cmath>
#include <utility>

#include "core/constants.hpp"
#include "core/formatted_text.hpp"
#include "core/number_text.hpp"
#include "solver/gauss_legendre.hpp"

namespace lobe {
namespace {

/// Below this k·D the method cannot resolve radiation; below the second, results lose digits.
constexpr Real smallest_electrical_size = 1e-5;
constexpr Real small_electrical_size = 1e-3;
/// No element may be longer than this fraction of a wavelength.
constexpr Real longest_element_wavelengths = 0.5;
/// Radians of phase across the bounding sphere that the radiated-power rule can integrate
/// (FarField::radiated_power takes kR + 16 points in θ).
const Real largest_phase_extent = max_gauss_legendre_order - 16;

std::string hz_text(Real f, int digits = 4) {
  if (f >= 1e9) return formatted("%.*g GHz", digits, f / 1e9);
  if (f >= 1e6) return formatted("%.*g MHz", digits, f / 1e6);
  if (f >= 1e3) return formatted("%.*g kHz", digits, f / 1e3);
  return formatted("%.*g Hz", digits, f);
}

/// A frequency and the limit it falls short of, with the digits that tell them apart: a
/// warning never says "at 95.43 kHz ... below 95.43 kHz".
std::pair<std::string, std::string> hz_texts_apart(Real f, Real limit) {
  int digits = 4;
  while (digits < 9 && hz_text(f, digits) == hz_text(limit, digits)) ++digits;
  return {hz_text(f, digits), hz_text(limit, digits)};
}

}  // namespace

Real structure_extent_m(const WireMesh& wires, const SurfaceMesh& surfaces, const Medium& medium) {
  Vec3 low = Vec3::Constant(INFINITY), high = Vec3::Constant(-INFINITY);
  auto include = [&](const Vec3& p) {
    low = low.cwiseMin(p);
    high = high.cwiseMax(p);
    for (const ImageSource& image : medium.images()) {
      low = low.cwiseMin(image.point(p));
      high = high.cwiseMax(image.point(p));
    }
  };
  for (const Segment& s : wires.segments) include(s.start), include(s.end);
  for (const Vec3& v : surfaces.vertices) include(v);
  return (high - low).norm();
}

std::vector<MeshWarning> check_frequency_limits(const Model& model, const Medium& medium, const WireMesh& wires,
                                                const SurfaceMesh& surfaces) {
  std::vector<MeshWarning> warnings;
  if (model.frequencies_hz.empty() || (wires.segments.empty() && surfaces.triangles.empty())) return warnings;
  const SourceLocation& where = model.frequency_where;
  Real longest = 0.0;
  for (const Segment& s : wires.segments) longest = std::max(longest, s.length());
  for (std::size_t t = 0; t < surfaces.triangles.size(); ++t)
    for (int k = 0; k < 3; ++k)
      longest = std::max(longest, (surfaces.corner(static_cast<int>(t), k) - surfaces.corner(static_cast<int>(t), (k + 1) % 3)).norm());
  const Real extent = structure_extent_m(wires, surfaces, medium);
  const auto [lowest, highest] = std::minmax_element(model.frequencies_hz.begin(), model.frequencies_hz.end());
  const Real k_low = 2 * pi * *lowest / speed_of_light, k_high = 2 * pi * *highest / speed_of_light;

  if (k_low * extent < smallest_electrical_size) {
    const auto [at, limit] = hz_texts_apart(*lowest, smallest_electrical_size * speed_of_light / (2 * pi * extent));
    throw InputError(where, formatted("at %s the model is %.3g wavelengths across: too small for the integral equation "
                                      "to resolve its radiation (it loses the resistance below %s here); raise the "
                                      "lowest frequency",
                                      at.c_str(), extent * *lowest / speed_of_light, limit.c_str()));
  }
  if (k_low * extent < small_electrical_size) {
    const auto [at, limit] = hz_texts_apart(*lowest, small_electrical_size * speed_of_light / (2 * pi * extent));
    warnings.push_back({where, formatted("at %s the model is only %.3g wavelengths across: the radiation resistance and "
                                         "efficiency keep fewer digits below %s; treat them as estimates",
                                         at.c_str(), extent * *lowest / speed_of_light, limit.c_str())});
  }
  if (longest > longest_element_wavelengths * speed_of_light / *highest)
    throw InputError(where, formatted("at %s an element of the mesh is %s wavelengths long; above half a wavelength "
                                      "its basis cannot follow the current: give more segments or a finer mesh, or "
                                      "lower the highest frequency",
                                      hz_text(*highest).c_str(),
                                      beside_limit(longest * *highest / speed_of_light, longest_element_wavelengths).c_str()));
  if (0.5 * k_high * extent > largest_phase_extent)
    throw InputError(where, formatted("at %s the model is %s wavelengths across, beyond the %.3g that the far-field "
                                      "integration handles; lower the highest frequency",
                                      hz_text(*highest).c_str(),
                                      beside_limit(extent * *highest / speed_of_light, 2 * largest_phase_extent / (2 * pi)).c_str(),
                                      2 * largest_phase_extent / (2 * pi)));
  return warnings;
}

}  // namespace lobe
