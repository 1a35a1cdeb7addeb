#include "post/matching_network.hpp"

#include <array>
#include <cmath>

#include "core/check.hpp"
#include "core/constants.hpp"

namespace lobe {
namespace {

/// IEC 60063:2015, the E12 and E24 series (one decade, two significant figures).
constexpr std::array<Real, 12> e12 = {1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2};
constexpr std::array<Real, 24> e24 = {1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0,
                                      3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1};

}  // namespace

Complex through_parts(Complex z, const std::vector<MatchPart>& parts, Real frequency_hz) {
  const Real omega = 2 * pi * frequency_hz;
  for (const MatchPart& p : parts) {
    switch (p.kind) {
      case MatchPartKind::series_inductor: z += Complex(0.0, omega * p.value); break;
      case MatchPartKind::series_capacitor: z += Complex(0.0, -1.0 / (omega * p.value)); break;
      case MatchPartKind::shunt_inductor: z = 1.0 / (1.0 / z + Complex(0.0, -1.0 / (omega * p.value))); break;
      case MatchPartKind::shunt_capacitor: z = 1.0 / (1.0 / z + Complex(0.0, omega * p.value)); break;
      case MatchPartKind::line: {
        const Real t = std::tan(omega * p.value / (p.velocity_factor * speed_of_light));
        z = p.impedance * (z + j_unit * p.impedance * t) / (p.impedance + j_unit * z * t);
        break;
      }
      case MatchPartKind::open_stub:
      case MatchPartKind::shorted_stub: {
        const Real t = std::tan(omega * p.value / (p.velocity_factor * speed_of_light));
        // Input admittance: j tan βl / Z0 (open), 1/(j Z0 tan βl) = −j cot βl / Z0 (shorted).
        const Complex y = p.kind == MatchPartKind::open_stub ? Complex(0.0, t / p.impedance)
                                                             : Complex(0.0, -1.0 / (t * p.impedance));
        z = 1.0 / (1.0 / z + y);
        break;
      }
    }
  }
  return z;
}

std::vector<LSection> l_sections(Complex load, Real z0) {
  std::vector<LSection> sections;
  const Real r = load.real(), x = load.imag();
  if (!(r > 0.0)) return sections;
  if (r * r + x * x >= z0 * r) {
    // Shunt next to the load (Pozar eq. 5.3): exists where R² + X² ≥ Z0 R, always for R > Z0.
    const Real root = std::sqrt(r / z0) * std::sqrt(std::max(0.0, r * r + x * x - z0 * r));
    for (const Real sign : {1.0, -1.0}) {
      const Real b = (x + sign * root) / (r * r + x * x);
      if (b == 0.0) continue;
      sections.push_back({true, 1.0 / b + x * z0 / r - z0 / (b * r), b});
    }
  }
  if (r <= z0) {
    // Series next to the load (Pozar eq. 5.6).
    for (const Real sign : {1.0, -1.0}) {
      const Real reactance = sign * std::sqrt(r * (z0 - r)) - x;
      sections.push_back({false, reactance, sign * std::sqrt((z0 - r) / r) / z0});
    }
  }
  return sections;
}

std::vector<MatchPart> l_section_parts(const LSection& section, Real frequency_hz) {
  const Real omega = 2 * pi * frequency_hz;
  const MatchPart series = section.reactance > 0.0
                               ? MatchPart{MatchPartKind::series_inductor, section.reactance / omega}
                               : MatchPart{MatchPartKind::series_capacitor, -1.0 / (omega * section.reactance)};
  const MatchPart shunt = section.susceptance > 0.0
                              ? MatchPart{MatchPartKind::shunt_capacitor, section.susceptance / omega}
                              : MatchPart{MatchPartKind::shunt_inductor, -1.0 / (omega * section.susceptance)};
  return section.shunt_at_load ? std::vector<MatchPart>{shunt, series} : std::vector<MatchPart>{series, shunt};
}

std::pair<Real, Real> preferred_neighbours(Real value, int per_decade) {
  LOBE_CHECK(value > 0.0 && (per_decade == 12 || per_decade == 24), "preferred values of a positive value, E12 or E24");
  const Real decade = std::pow(10.0, std::floor(std::log10(value)));
  const Real mantissa = value / decade;
  const Real* series = per_decade == 12 ? e12.data() : e24.data();
  Real below = series[0] * decade, above = 10.0 * decade;
  for (int i = 0; i < per_decade; ++i) {
    const Real v = series[i] * decade;
    // Within rounding of a preferred value: that value, from both sides.
    if (std::abs(mantissa - series[i]) <= 1e-9 * series[i]) return {v, v};
    if (series[i] < mantissa) below = v;
    else {
      above = v;
      break;
    }
  }
  return {below, above};
}

}  // namespace lobe
