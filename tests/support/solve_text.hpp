#pragma once
/// Test helpers: solve a model given as text, and model texts for common test antennas.
#include <memory>
#include <string>

#include "geometry/model_parser.hpp"
#include "post/frequency_result.hpp"

namespace lobe::testing {

/// Frequency at which the free-space wavelength is exactly 1 m, so lengths in the
/// reference cases read directly in wavelengths.
constexpr Real one_metre_wavelength_hz = 299792458.0;

/// A model with its problem and its solution at the model's first frequency.
struct Solved {
  std::unique_ptr<Model> model;
  std::unique_ptr<AntennaProblem> problem;
  FrequencySolution solution;
  FrequencyResult result;
  Complex port_impedance(int port = 0) const { return result.ports[port].impedance; }
};

Solved solve_text(const std::string& text);

/// A straight z-directed dipole centred at the origin, fed at its middle, at λ = 1 m.
std::string dipole_text(Real length, Real radius, int segments);

/// Power balance ½Re(V I*) = radiated + dissipated, relative: the tolerance for
/// every reference case (the far-field sphere integral is independent of the matrix).
constexpr Real power_balance_tolerance = 1e-3;

/// Checks the power balance of a solved case (a GoogleTest expectation).
void expect_power_balance(const Solved& solved);

/// Maximum directivity over a fine θ grid in the φ = 0 plane (a z dipole is symmetric in φ).
Real peak_directivity(const Solved& solved);

}  // namespace lobe::testing
