#include "study/solution_packing.hpp"

#include <stdexcept>

namespace lobe {
namespace {

void pack_complex(const Complex* values, std::size_t count, std::vector<double>& out) {
  out.push_back(static_cast<double>(count));
  for (std::size_t i = 0; i < count; ++i) out.insert(out.end(), {values[i].real(), values[i].imag()});
}

/// Reads the next value, refusing to run past the end.
double next(const std::vector<double>& in, std::size_t& at) {
  if (at >= in.size()) throw std::runtime_error("a solution passed between processes ended too soon");
  return in[at++];
}

std::size_t next_count(const std::vector<double>& in, std::size_t& at) {
  const double n = next(in, at);
  if (!(n >= 0.0) || n > static_cast<double>(in.size())) throw std::runtime_error("a solution passed between processes is damaged");
  return static_cast<std::size_t>(n);
}

ComplexVector unpack_vector(const std::vector<double>& in, std::size_t& at) {
  ComplexVector v(static_cast<Eigen::Index>(next_count(in, at)));
  for (Eigen::Index i = 0; i < v.size(); ++i) {
    const double re = next(in, at);
    v(i) = Complex(re, next(in, at));
  }
  return v;
}

}  // namespace

void pack_solution(const FrequencySolution& s, std::vector<double>& out) {
  out.insert(out.end(), {s.frequency_hz, s.interpolated ? 1.0 : 0.0, static_cast<double>(s.report.factorization),
                         s.report.reciprocal_condition, s.report.relative_residual,
                         static_cast<double>(s.port_admittance.rows())});
  pack_complex(s.port_admittance.data(), static_cast<std::size_t>(s.port_admittance.size()), out);
  for (const ComplexVector* v : {&s.port_voltages, &s.port_currents, &s.received_currents, &s.coefficients,
                                 &s.network_voltages, &s.network_currents})
    pack_complex(v->data(), static_cast<std::size_t>(v->size()), out);
  pack_complex(s.segment_currents.empty() ? nullptr : s.segment_currents.front().data(), 2 * s.segment_currents.size(), out);
}

FrequencySolution unpack_solution(const std::vector<double>& in, std::size_t& at) {
  FrequencySolution s;
  s.frequency_hz = next(in, at);
  s.interpolated = next(in, at) != 0.0;
  s.report.factorization = static_cast<Factorization>(static_cast<int>(next(in, at)));
  s.report.reciprocal_condition = next(in, at);
  s.report.relative_residual = next(in, at);
  const auto rows = static_cast<Eigen::Index>(next_count(in, at));
  const ComplexVector admittance = unpack_vector(in, at);
  if (rows == 0 ? admittance.size() != 0 : admittance.size() % rows != 0)
    throw std::runtime_error("a solution passed between processes is damaged");
  s.port_admittance = Eigen::Map<const ComplexMatrix>(admittance.data(), rows, rows == 0 ? 0 : admittance.size() / rows);
  for (ComplexVector* v : {&s.port_voltages, &s.port_currents, &s.received_currents, &s.coefficients,
                           &s.network_voltages, &s.network_currents})
    *v = unpack_vector(in, at);
  const ComplexVector ends = unpack_vector(in, at);
  if (ends.size() % 2 != 0) throw std::runtime_error("a solution passed between processes is damaged");
  for (Eigen::Index i = 0; i < ends.size(); i += 2) s.segment_currents.push_back({ends(i), ends(i + 1)});
  return s;
}

}  // namespace lobe
