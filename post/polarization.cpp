#include "post/polarization.hpp"

#include <cmath>

#include "core/constants.hpp"

namespace lobe {

CircularComponents circular_components(Complex e_theta, Complex e_phi) {
  const Real s = 1.0 / std::sqrt(2.0);
  return {s * (e_theta + j_unit * e_phi), s * (e_theta - j_unit * e_phi)};
}

Real axial_ratio_db(const CircularComponents& c) {
  const Real r = std::abs(c.right), l = std::abs(c.left);
  const Real major = r + l, minor = std::abs(r - l);
  if (minor <= major * std::pow(10.0, -axial_ratio_ceiling_db / 20.0)) return axial_ratio_ceiling_db;
  return 20.0 * std::log10(major / minor);
}

Hand polarization_hand(const CircularComponents& c) {
  const Real r = std::abs(c.right), l = std::abs(c.left);
  if (r + l == 0.0 || axial_ratio_db(c) > linear_axial_ratio_db) return Hand::linear;
  return r > l ? Hand::right : Hand::left;
}

const char* hand_name(Hand hand) {
  switch (hand) {
    case Hand::right: return "right-hand";
    case Hand::left: return "left-hand";
    case Hand::linear: return "not circular";
  }
  return "not circular";
}

}  // namespace lobe
