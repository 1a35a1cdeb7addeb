#include "solver/complex_images.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "solver/pencil_of_function.hpp"

namespace lobe {
namespace {

/// Samples F along k_z(t) = start + slope · t, t = 0, Δ, …, fits exponentials in t and turns
/// each b z^{t/Δ} = b e^{s t} (s = ln z/Δ) into a e^{−b' k_z}: t = (k_z − start)/slope gives
/// b' = −s/slope and a = b e^{−s start/slope}.
void fit_level(const std::function<Complex(Complex)>& f, Complex start, Complex slope, Real length,
               const ImageSampling& sampling, std::vector<ComplexImage>& images) {
  const Real step = length / (sampling.samples - 1);
  std::vector<Complex> samples(sampling.samples);
  for (int m = 0; m < sampling.samples; ++m) {
    const Complex kz = start + slope * (m * step);
    Complex value = f(kz);
    for (const ComplexImage& image : images) value -= image.amplitude * std::exp(-j_unit * kz * image.depth);
    samples[m] = value;
  }
  const ExponentialFit fit = pencil_of_function(samples, sampling.tolerance);
  for (std::size_t i = 0; i < fit.ratios.size(); ++i) {
    const Complex s = std::log(fit.ratios[i]) / step;
    const Complex b = -s / slope;  // e^{−b k_z}
    images.push_back({fit.amplitudes[i] * std::exp(-s * start / slope), -j_unit * b});
  }
}

}  // namespace

std::vector<ComplexImage> fit_complex_images(const std::function<Complex(Complex)>& f_of_kz, Real k0,
                                             const ImageSampling& sampling) {
  std::vector<ComplexImage> images;
  // e^{−b k_z} = e^{−j k_z depth} with depth = −j b.
  fit_level(f_of_kz, Complex(0.0, -k0 * sampling.far_start), Complex(0.0, -k0), sampling.far_length, sampling,
            images);
  fit_level(f_of_kz, Complex(k0, 0.0), Complex(-k0 / sampling.far_start, -k0), sampling.far_start, sampling,
            images);
  return images;
}

Complex image_sum(const std::vector<ComplexImage>& images, Real k0, Real rho) {
  Complex sum = 0.0;
  for (const ComplexImage& image : images) {
    Complex r = std::sqrt(rho * rho + image.depth * image.depth);
    if (r.real() < 0.0) r = -r;
    sum += image.amplitude * std::exp(-j_unit * k0 * r) / r;
  }
  return sum / (4.0 * pi);
}

}  // namespace lobe
