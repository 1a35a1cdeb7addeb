#include "solver/half_space_field.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "solver/complex_bessel.hpp"
#include "solver/sommerfeld_integral.hpp"

namespace lobe {
namespace {

/// √(k² − kρ²) on the proper sheet (Im ≤ 0, a wave that leaves or decays), continued
/// above the real axis: −j √(kρ² − k²) with the principal root.
Complex vertical_wavenumber(Complex k_squared, Complex k_rho) { return -j_unit * std::sqrt(k_rho * k_rho - k_squared); }

}  // namespace

ReflectedIntegrals reflected_integrals(Complex eps, Real k, Real rho, Real h, Real relative) {
  const Real k2 = k * k;
  const std::function<Eigen::Vector4cd(Complex)> integrand = [&](Complex k_rho) -> Eigen::Vector4cd {
    const Complex kz = vertical_wavenumber(k2, k_rho), kz1 = vertical_wavenumber(eps * k2, k_rho);
    const Complex r_te = (kz - kz1) / (kz + kz1), r_tm = (eps * kz - kz1) / (eps * kz + kz1);
    const Complex w = k_rho * std::exp(-j_unit * kz * h) / (2.0 * j_unit * kz);
    const Complex u = k_rho * rho;
    const Complex j0 = bessel_j(0, u), j1 = rho > 0.0 ? bessel_j(1, u) : 0.0, j2 = rho > 0.0 ? bessel_j(2, u) : 0.0;
    const Complex tm = r_tm * kz * kz / k2;
    return Eigen::Vector4cd((r_te - tm) * w * j0, (r_te + tm) * w * j2, r_tm * (kz * k_rho / k2) * w * j1,
                            r_tm * (k_rho * k_rho / k2) * w * j0);
  };
  // The detour clears the branch point k, the surface-wave pole near it and, for a ground of
  // little loss, the branch point k√εg close to the axis (εr ≤ 100 puts it within 10 k; a
  // conductive ground's lies as far below the axis as along it, clear of the path).
  const SommerfeldPath path{k * (1.5 + std::min(std::sqrt(eps).real(), 11.0)), k};
  const Eigen::Vector4cd t = sommerfeld_path_integral(integrand, rho, path, relative) / (4.0 * pi);
  return {t[0], t[1], t[2], t[3]};
}

Eigen::Matrix3cd reflected_dyadic(const ReflectedIntegrals& t, Real c, Real s) {
  const Real c2 = c * c - s * s, s2 = 2 * s * c;
  Eigen::Matrix3cd g;
  g << t.t1 + t.t2 * c2, t.t2 * s2, 2.0 * j_unit * t.t3 * c,  //
      t.t2 * s2, t.t1 - t.t2 * c2, 2.0 * j_unit * t.t3 * s,    //
      -2.0 * j_unit * t.t3 * c, -2.0 * j_unit * t.t3 * s, 2.0 * t.t4;
  return g;
}

}  // namespace lobe
