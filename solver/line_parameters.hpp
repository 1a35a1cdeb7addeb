#pragma once
/// Circuit parameters of the feed network's elements at one frequency: transmission lines
/// (TEM, real characteristic impedance), stubs, ideal transformers and lumped parts.
#include "geometry/model.hpp"

namespace lobe {

/// A two-port's chain matrix, both rows scaled by `scale`:
///   scale · v1 = a v2 + b (−i2),   scale · i1 = c v2 + d (−i2),
/// with i1, i2 the currents into the two-port at its ends. A line's scale is e^{−αl}, so
/// that a long lossy line stays finite where cosh γl would overflow.
struct ChainMatrix {
  Complex a{1.0}, b{0.0}, c{0.0}, d{1.0};
  Real scale = 1.0;
};

/// γ = α + jβ, per metre: β = ω/(v c0), α from the line's loss in dB per metre (÷ 20 log10 e).
Complex propagation_constant(const NetworkElement& line, Real frequency_hz);

/// A line of characteristic impedance Z0 and length l: [cosh γl, Z0 sinh γl; sinh γl / Z0,
/// cosh γl] (Pozar, Microwave Engineering, 4th ed., table 4.1); negated when its conductors
/// are crossed.
ChainMatrix line_chain_matrix(const NetworkElement& line, Real frequency_hz);

/// An ideal transformer whose `to` end sees `ratio` times the impedance of its `from` end:
/// [1/n, 0; 0, n] with n = √ratio.
ChainMatrix transformer_chain_matrix(const NetworkElement& transformer);

/// The input impedance of a stub, Z0 tanh γl (short) or Z0 coth γl (open), as the pair
/// (numerator, denominator) of v/i, finite even where the impedance is not (a lossless
/// quarter-wave short is an open circuit).
struct ImpedanceRatio {
  Complex voltage, current;  ///< v · current = i · voltage
};
ImpedanceRatio stub_input(const NetworkElement& stub, Real frequency_hz);

/// A lumped part as a ratio too: a lossless parallel LC at resonance is an open circuit.
ImpedanceRatio lumped_input(const LumpedValues& part, Real frequency_hz);

}  // namespace lobe
