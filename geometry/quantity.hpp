#pragma once
/// A value with its physical dimension, as the model language computes with it.
#include <array>
#include <string>

#include "core/types.hpp"

namespace lobe {

/// Exponents of metre, kilogram, second, ampere and angle. Angle is kept as its own
/// dimension so that a length can never be given where an angle belongs.
struct Dimension {
  std::array<int, 5> exponent{0, 0, 0, 0, 0};

  bool operator==(const Dimension&) const = default;
  bool is_none() const { return *this == Dimension{}; }
  Dimension operator*(const Dimension& other) const;
  Dimension operator/(const Dimension& other) const;
  Dimension power(int n) const;
};

namespace dimension {
inline constexpr Dimension none{};
inline constexpr Dimension length{{1, 0, 0, 0, 0}};
inline constexpr Dimension frequency{{0, 0, -1, 0, 0}};
inline constexpr Dimension angle{{0, 0, 0, 0, 1}};
inline constexpr Dimension voltage{{2, 1, -3, -1, 0}};
inline constexpr Dimension resistance{{2, 1, -3, -2, 0}};
inline constexpr Dimension inductance{{2, 1, -2, -2, 0}};
inline constexpr Dimension capacitance{{-2, -1, 4, 2, 0}};
inline constexpr Dimension conductivity{{-3, -1, 3, 2, 0}};
}  // namespace dimension

/// A readable name of a dimension ("length", "frequency", or "m^2 s^-1").
std::string dimension_name(const Dimension& d);

/// The dimension in SI base symbols, "m^2 kg s^-3 A^-1"; empty for a plain number.
std::string unit_symbols(const Dimension& d);

/// A number with a dimension, in SI units (angles in radians).
struct Quantity {
  Real value = 0.0;
  Dimension dim;
};

}  // namespace lobe
