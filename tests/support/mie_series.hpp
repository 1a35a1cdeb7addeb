#pragma once
/// Mie series for plane-wave scattering by a perfectly conducting sphere: the reference
/// for surface scattering tests (Mie 1908; series as in Bohren & Huffman, "Absorption and
/// Scattering of Light by Small Particles", 1983, ch. 4, in the limit m → ∞).
#include <complex>
#include <vector>

namespace lobe::testing {

/// Scattering coefficients a_n, b_n (n = 1 … N) of a perfectly conducting sphere of size
/// parameter x = ka, Bohren & Huffman's convention: a_n = [x j_n(x)]' / [x h_n(x)]',
/// b_n = j_n(x) / h_n(x), h_n = j_n + i y_n. N from Wiscombe's rule, x + 4 x^(1/3) + 2.
class PecSphereMie {
 public:
  explicit PecSphereMie(double size_parameter);
  /// Monostatic (backscattering) cross-section over πa².
  double backscatter_efficiency() const;
  /// Bistatic cross-section over πa² at scattering angle θ (0 = forward), in the plane
  /// containing the incident electric field (E-plane) or perpendicular to it (H-plane).
  double bistatic_efficiency_e_plane(double theta) const;
  double bistatic_efficiency_h_plane(double theta) const;
  /// Total scattered power over πa² |E|²/(2η), from the coefficients.
  double scattering_efficiency() const;
  /// Extinction over πa², from the forward amplitude (optical theorem).
  double extinction_efficiency() const;

 private:
  /// S1 (perpendicular) and S2 (parallel) amplitude functions at angle θ.
  struct Amplitudes {
    std::complex<double> s1 = 0.0, s2 = 0.0;
  };
  Amplitudes amplitudes(double theta) const;
  double m_x;
  std::vector<std::complex<double>> m_a, m_b;  ///< index n − 1
};

}  // namespace lobe::testing
