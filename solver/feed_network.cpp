#include "solver/feed_network.hpp"

#include <cmath>
#include <cstdio>

#include "solver/line_parameters.hpp"
#include "solver/system_matrix.hpp"

namespace lobe {
namespace {

std::string place_label(const WirePosition& p) {
  char fraction[32];
  std::snprintf(fraction, sizeof fraction, "%.6g", p.fraction);
  return p.wire + " at " + fraction;
}

}  // namespace

FeedNetwork::FeedNetwork(const Model& model, const Eigen::MatrixXd& port_vectors, const Eigen::MatrixXd& load_vectors,
                         const std::vector<Eigen::VectorXd>& network_gap_vectors)
    : m_couplings(port_vectors.rows(), 0), m_load_stamped(model.loads.size(), true) {
  if (model.network.empty()) return;
  for (std::size_t p = 0; p < model.ports.size(); ++p) {
    const Port& port = model.ports[p];
    m_port_terminals.push_back(port.node.empty() ? terminal_for_coupling(port_vectors.col(static_cast<Eigen::Index>(p)), port.name)
                                                 : terminal_for_node(port.node));
  }
  std::size_t gap = 0;
  for (const NetworkElement& e : model.network) {
    Element element;
    element.kind = e.kind;
    element.model = &e;
    element.part = &e.part;
    element.name = e.name;
    for (std::size_t k = 0; k < e.ends.size(); ++k) {
      const CircuitEnd& end = e.ends[k];
      element.ends[k] = end.wire ? terminal_for_coupling(network_gap_vectors[gap++], place_label(*end.wire))
                                 : terminal_for_node(end.node);
      m_terminals[element.ends[k]].has_elements = true;
    }
    element.first_current = m_currents;
    m_currents += static_cast<int>(e.ends.size());
    m_elements.push_back(element);
  }
  // A wire load where the network meets the antenna is in parallel with the network there.
  for (std::size_t l = 0; l < model.loads.size(); ++l) {
    const Eigen::VectorXd p = load_vectors.col(static_cast<Eigen::Index>(l));
    for (std::size_t t = 0; t < m_terminals.size(); ++t) {
      const NetworkTerminal& terminal = m_terminals[t];
      if (terminal.coupling < 0 || !terminal.has_elements || m_couplings.col(terminal.coupling) != p) continue;
      m_load_stamped[l] = false;
      m_joined_loads.push_back(l);
      Element element;
      element.kind = NetworkKind::lumped;
      element.part = &model.loads[l].values;
      element.name = model.loads[l].name;
      element.ends[0] = static_cast<int>(t);
      element.first_current = m_currents++;
      m_elements.push_back(element);
      break;
    }
  }
}

std::vector<int> FeedNetwork::antenna_ends() const {
  std::vector<int> ends;
  for (std::size_t t = 0; t < m_terminals.size(); ++t)
    if (m_terminals[t].coupling >= 0 && m_terminals[t].has_elements) ends.push_back(static_cast<int>(t));
  return ends;
}

int FeedNetwork::terminal_for_coupling(const Eigen::VectorXd& p, const std::string& label) {
  for (std::size_t t = 0; t < m_terminals.size(); ++t)
    if (m_terminals[t].coupling >= 0 && m_couplings.col(m_terminals[t].coupling) == p) return static_cast<int>(t);
  m_couplings.conservativeResize(Eigen::NoChange, m_couplings.cols() + 1);
  m_couplings.rightCols(1) = p;
  m_terminals.push_back({label, static_cast<int>(m_couplings.cols() - 1), false});
  return static_cast<int>(m_terminals.size() - 1);
}

int FeedNetwork::terminal_for_node(const std::string& node) {
  for (std::size_t t = 0; t < m_terminals.size(); ++t)
    if (m_terminals[t].coupling < 0 && m_terminals[t].label == node) return static_cast<int>(t);
  m_terminals.push_back({node, -1, false});
  return static_cast<int>(m_terminals.size() - 1);
}

NetworkSolution FeedNetwork::solve(Real frequency_hz, const ComplexMatrix& antenna_admittance,
                                   const ComplexVector& short_circuit_currents) const {
  // Unknowns: terminal voltages, the current into every element end, each port's source
  // current. Rows: current balance at each terminal, the elements' equations, the ports'
  // voltages.
  const auto terminals = static_cast<Eigen::Index>(m_terminals.size());
  const auto ports = static_cast<Eigen::Index>(m_port_terminals.size());
  const Eigen::Index currents = m_currents, first_source = terminals + currents;
  const Eigen::Index n = first_source + ports;
  ComplexMatrix m = ComplexMatrix::Zero(n, n);
  ComplexMatrix rhs = ComplexMatrix::Zero(n, ports + 1);

  for (Eigen::Index a = 0; a < terminals; ++a) {
    const int ca = m_terminals[a].coupling;
    if (ca < 0) continue;
    for (Eigen::Index b = 0; b < terminals; ++b)
      if (const int cb = m_terminals[b].coupling; cb >= 0) m(a, b) = antenna_admittance(ca, cb);
    if (short_circuit_currents.size() > 0) rhs(a, ports) = -short_circuit_currents[ca];
  }
  for (Eigen::Index p = 0; p < ports; ++p) {
    m(m_port_terminals[p], first_source + p) = -1.0;
    m(first_source + p, m_port_terminals[p]) = 1.0;
    rhs(first_source + p, p) = 1.0;
  }
  for (const Element& e : m_elements) {
    const Eigen::Index i1 = terminals + e.first_current, v1 = e.ends[0];
    m(v1, i1) += 1.0;
    if (e.ends[1] < 0) {
      // One-port: v · current − i · voltage = 0 for v/i = voltage/current.
      const ImpedanceRatio z = e.kind == NetworkKind::stub ? stub_input(*e.model, frequency_hz)
                                                            : lumped_input(*e.part, frequency_hz);
      m(i1, v1) = z.current;
      m(i1, i1) = -z.voltage;
      continue;
    }
    const Eigen::Index i2 = i1 + 1, v2 = e.ends[1];
    m(v2, i2) += 1.0;
    if (e.kind == NetworkKind::lumped) {
      // In series: (v1 − v2)·current − i1·voltage = 0, and i1 + i2 = 0.
      const ImpedanceRatio z = lumped_input(*e.part, frequency_hz);
      m(i1, v1) = z.current;
      m(i1, v2) = -z.current;
      m(i1, i1) = -z.voltage;
      m(i2, i1) = 1.0;
      m(i2, i2) = 1.0;
      continue;
    }
    const ChainMatrix t = e.kind == NetworkKind::line ? line_chain_matrix(*e.model, frequency_hz)
                                                      : transformer_chain_matrix(*e.model);
    // s v1 − a v2 + b i2 = 0,  s i1 − c v2 + d i2 = 0.
    m(i1, v1) = t.scale;
    m(i1, v2) = -t.a;
    m(i1, i2) = t.b;
    m(i2, i1) = t.scale;
    m(i2, v2) = -t.c;
    m(i2, i2) = t.d;
  }

  const Eigen::FullPivLU<ComplexMatrix> lu(m);
  if (!lu.isInvertible()) {
    char text[160];
    std::snprintf(text, sizeof text,
                  "the feed network has no unique solution at %.9g MHz (a part of it joined to nothing but lossless "
                  "lines or transformers?)", frequency_hz / 1e6);
    throw NumericalError(text);
  }
  const ComplexMatrix x = lu.solve(rhs);
  if (!x.allFinite()) throw NumericalError("the feed network's solution is not finite");
  NetworkSolution s;
  s.terminal_voltages = x.topRows(terminals);
  s.element_currents = x.middleRows(terminals, currents);
  s.port_admittance = x.bottomRows(ports).leftCols(ports);
  s.received_currents = x.bottomRows(ports).col(ports);
  return s;
}

std::vector<Real> FeedNetwork::element_powers(const ComplexVector& voltages, const ComplexVector& currents) const {
  std::vector<Real> powers;
  for (const Element& e : m_elements) {
    Real p = 0.0;
    for (int k = 0; k < 2 && e.ends[k] >= 0; ++k)
      p += 0.5 * (voltages[e.ends[k]] * std::conj(currents[e.first_current + k])).real();
    powers.push_back(p);
  }
  return powers;
}

}  // namespace lobe
