#pragma once
/// The feed network (lines, stubs, transformers, lumped parts) joined to the antenna where
/// it meets the wires. The antenna is a multi-port at those gaps, its admittance matrix
/// taken from the moment-method solve; the network is solved with it by nodal equations
/// plus one unknown current per element end, in chain-matrix form, so that a lossless
/// half-wave line or a quarter-wave shorted stub (infinite impedance parameters) is exact.
#include <string>
#include <vector>

#include "geometry/model.hpp"
#include "geometry/wire_mesh.hpp"
#include "solver/wire_basis.hpp"

namespace lobe {

/// A place where network elements and ports meet: a gap on the antenna (a column of the
/// couplings) or a free point of the network.
struct NetworkTerminal {
  std::string label;   ///< "dipole at 0.5", a port's name, or the free point's name
  int coupling = -1;   ///< column of FeedNetwork::couplings, −1 for a free point
  bool has_elements = false;  ///< some line, stub, transformer or part joins here
};

/// What the network's solve gives at one frequency.
struct NetworkSolution {
  /// P × P: current out of port i's source with 1 V at port j and 0 V at the others, S.
  ComplexMatrix port_admittance;
  /// T × (P + 1): every terminal's voltage for each port's unit drive, then (last column)
  /// under the model's wave with every port shorted, V.
  ComplexMatrix terminal_voltages;
  /// Under the wave: the current through each shorted port, A (zero without a wave).
  ComplexVector received_currents;
  /// Branch currents into every element end, in element order, for each column as above.
  ComplexMatrix element_currents;
};

class FeedNetwork {
 public:
  FeedNetwork() = default;
  /// From the model's ports and network and the gap couplings already made: `port_vectors`
  /// (N × ports; zero for a port at a free point), `load_vectors` (N × loads) and the
  /// couplings of WireMesh::network_gaps, in order. A wire load at a gap the network meets
  /// becomes one of its elements (it is in parallel with them there).
  FeedNetwork(const Model& model, const Eigen::MatrixXd& port_vectors, const Eigen::MatrixXd& load_vectors,
              const std::vector<Eigen::VectorXd>& network_gap_vectors);

  bool empty() const { return m_elements.empty(); }
  /// N × A: the couplings of the antenna's terminals; the solve needs Z⁻¹ times each.
  const Eigen::MatrixXd& couplings() const { return m_couplings; }
  const std::vector<NetworkTerminal>& terminals() const { return m_terminals; }
  /// The terminals where network elements meet the antenna (a feed line's antenna end),
  /// in terminal order.
  std::vector<int> antenna_ends() const;
  /// Whether wire load l stays a stamp in the system matrix (false: it joined the network).
  bool load_is_stamped(std::size_t l) const { return m_load_stamped[l]; }
  /// Which loads joined, by index in Model::loads, in the order of element_currents after
  /// the model's own elements.
  const std::vector<std::size_t>& joined_loads() const { return m_joined_loads; }

  /// The network with the antenna of admittance Y (A × A, current into the antenna at
  /// terminal a for 1 V at terminal b, others shorted) and, under a wave, the currents it
  /// drives through the shorted terminals (A, or empty). Throws NumericalError when the
  /// network has no unique solution at this frequency.
  NetworkSolution solve(Real frequency_hz, const ComplexMatrix& antenna_admittance,
                        const ComplexVector& short_circuit_currents) const;

  /// For the power budget: the power each element end takes, summed over its ends, for
  /// terminal voltages v and element currents i of one drive, W (a line's loss; a lumped
  /// part's dissipation; zero for a lossless line or a transformer).
  std::vector<Real> element_powers(const ComplexVector& voltages, const ComplexVector& currents) const;
  /// The element's name, in the order of element_powers.
  const std::string& element_name(std::size_t e) const { return m_elements[e].name; }
  std::size_t element_count() const { return m_elements.size(); }
  /// True for a lumped part (its power is a load's), false for a line, stub or transformer.
  bool element_is_lumped(std::size_t e) const { return m_elements[e].kind == NetworkKind::lumped; }

 private:
  struct Element {
    NetworkKind kind = NetworkKind::line;
    const NetworkElement* model = nullptr;  ///< null for a joined wire load
    const LumpedValues* part = nullptr;     ///< lumped values (a part's or a joined load's)
    std::string name;
    int ends[2] = {-1, -1};                 ///< terminals; one-ports have ends[1] = −1
    int first_current = 0;                  ///< index of its first end current
  };
  int terminal_for_coupling(const Eigen::VectorXd& p, const std::string& label);
  int terminal_for_node(const std::string& node);

  std::vector<NetworkTerminal> m_terminals;
  Eigen::MatrixXd m_couplings;
  std::vector<Element> m_elements;
  std::vector<int> m_port_terminals;
  std::vector<bool> m_load_stamped;
  std::vector<std::size_t> m_joined_loads;
  int m_currents = 0;
};

}  // namespace lobe
