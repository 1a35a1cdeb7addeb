#pragma once
/// A meshed model ready to solve at any frequency, and the solution at one frequency.
#include <array>
#include <memory>
#include <vector>

#include "geometry/model.hpp"
#include "geometry/surface_mesher.hpp"
#include "geometry/wire_mesh.hpp"
#include "solver/basis_samples.hpp"
#include "solver/feed_network.hpp"
#include "solver/junction_star.hpp"
#include "solver/medium.hpp"
#include "solver/rwg_basis.hpp"
#include "solver/system_matrix.hpp"
#include "solver/wire_basis.hpp"

namespace lobe {

struct FillGeometry;

/// A probe or via through a substrate: one vertical segment from the ground up to a vertex
/// of a printed plate, carrying one uniform-current function that the junction star at its
/// top carries on into the plate.
struct Probe {
  int segment = -1;
  int basis = -1;  ///< its function (the star's)
  int star = -1;   ///< index in AntennaProblem::stars
  Vec3 foot = Vec3::Zero();
  Real radius = 0.0;
};

/// Everything that does not change with frequency: the medium, meshes, bases, the fill's
/// geometry, port and load couplings. Unknowns are the wire functions (junction functions
/// among them) first, then the RWG functions of the surfaces. An antenna (driven at its
/// ports) and a scatterer (lit by the model's wave) are the same problem.
struct AntennaProblem {
  explicit AntennaProblem(const Model& model);
  /// From meshes already made for this model (with the constraints the model implies:
  /// wire ends and junctions as points, plate-port lines), e.g. exact mirror images.
  AntennaProblem(const Model& model, WireMesh wires, SurfaceMeshReport surfaces);
  const Model& model;
  Medium medium;
  WireMesh mesh;
  SurfaceMeshReport surfaces;
  std::vector<int> node_vertex;     ///< per wire node: the surface vertex it is attached to, or −1
  WireBasis basis;
  RwgBasis rwg;
  std::vector<JunctionStar> stars;  ///< one per wire node attached to a surface
  /// What the pair integrators need of the meshes, made once (solver/fill_geometry.hpp).
  std::shared_ptr<const FillGeometry> geometry;
  std::vector<Probe> probes;        ///< on a substrate, every wire (each is a probe)
  /// Every basis function's current at the points the far field and the excitations share.
  /// A probe's vertical current is not among them: inside a slab it radiates and launches
  /// surface waves by its own spectra (solver/grounded_slab.hpp), which use `probes`.
  std::vector<BasisSample> samples;
  Eigen::MatrixXd port_vectors;     ///< N × ports: column p couples basis currents to port p (zero at a free point)
  Eigen::MatrixXd load_vectors;     ///< N × loads
  FeedNetwork network;              ///< lines, stubs, transformers and parts; empty without them
  /// Over real ground with a stated ground system: N × points where wires end on the
  /// ground, coupling the basis currents to the current into the ground there.
  Eigen::MatrixXd ground_system_vectors;

  int unknowns() const { return basis.size() + rwg.size(); }

 private:
  AntennaProblem(const Model& model, const WireMesh& wires);
};

/// Throws InputError when the system matrix of the problem could not be held in memory:
/// call before the first solve, so that a run is refused before any work.
void require_solvable(const AntennaProblem& problem);

/// The solved currents at one frequency.
struct FrequencySolution {
  Real frequency_hz = 0.0;
  /// Y(i, j): current into port i with 1 V at port j and 0 V at all others, siemens.
  ComplexMatrix port_admittance;
  ComplexVector port_voltages;   ///< as the model drives them, V
  ComplexVector port_currents;   ///< resulting port currents, A
  /// Under the model's wave: the current the wave drives through each port while every
  /// port is shorted, A (empty without a wave). The open-circuit voltages are Y⁻¹ times it.
  ComplexVector received_currents;
  ComplexVector coefficients;    ///< every basis function's current for the model's drive and wave, A
  /// With a feed network, for the model's drive and wave: each terminal's voltage
  /// (FeedNetwork::terminals), V, and the current into every element end, A.
  ComplexVector network_voltages, network_currents;
  /// Current at the start and end of each segment, along the segment direction, A.
  std::vector<std::array<Complex, 2>> segment_currents;
  SolveReport report;
  /// Filled from a rational interpolant of solved frequencies, not solved here (an adaptive
  /// sweep); the report is then the nearest solve's.
  bool interpolated = false;
};

/// Fills (solver/assembly.hpp), factors and solves once for all ports and the model's wave.
/// Throws NumericalError on a singular matrix or non-finite results. Cost: O((S + T)²)
/// fill, O(N³/3) factorisation.
FrequencySolution solve_frequency(const AntennaProblem& problem, Real frequency_hz);
/// The same in `matrix` (of the problem's size), cleared first: a loop over frequencies
/// reuses one.
FrequencySolution solve_frequency(const AntennaProblem& problem, Real frequency_hz, SystemMatrix& matrix);

/// The surface current density at the centroid of every triangle, A/m (junction stars
/// included), for the solved coefficients.
std::vector<Eigen::Vector3cd> triangle_current_density(const AntennaProblem& problem, const ComplexVector& coefficients);

}  // namespace lobe
