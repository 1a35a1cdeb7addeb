#pragma once
/// The pair integrators, one per kind of element pair. Each appends the Galerkin terms of
/// the mixed-potential EFIE
///   Z_mn = jωμ ∫∫ f_m·f_n G − (j/(ωε)) ∫∫ (∇·f_m)(∇·f_n) G
/// for the pairs of one observing element with its partners, over the direct term and every
/// image term the medium supplies, as MatrixContributions that the assembly loop adds to
/// the system matrix. Every unordered pair is integrated once and written at (m, n) and
/// (n, m), so Z is exactly symmetric.
#include <memory>
#include <vector>

#include "solver/antenna_problem.hpp"
#include "solver/fill_geometry.hpp"
#include "solver/ground_kernel_table.hpp"
#include "solver/observer_rows.hpp"
#include "solver/probe_kernels.hpp"
#include "solver/slab_kernel_table.hpp"
#include "solver/system_matrix.hpp"

namespace lobe {

/// What every integrator needs at one frequency.
struct FillContext {
  FillContext(const AntennaProblem& problem, Real frequency_hz);
  const AntennaProblem& problem;
  const FillGeometry& geometry;
  Real k;                ///< wavenumber, rad/m
  Complex vector_factor; ///< jωμ
  Complex scalar_factor; ///< −j/(ωε)
  Complex ground_permittivity;  ///< εg of real ground (its images are weighted with it)
  /// On a substrate, its kernels at this frequency (else null): the integrators then take
  /// the quasi-static part from the free-space integrals and add the table's remainder.
  std::shared_ptr<const SlabKernelTable> slab;
  /// With probes through the substrate, their kernels at this frequency (else null).
  std::shared_ptr<const ProbeKernels> probe_kernels;
  /// Near real ground, its reflected field at this frequency (else null): the wires' image
  /// terms are then replaced by it.
  std::shared_ptr<const GroundKernelTable> ground_table;
};

/// Segment s against segments t ≥ s (thin-wire reduced kernel; solver/segment_integrals).
/// O(S) pairs per row.
void add_segment_segment_terms(const FillContext& c, int s, std::vector<MatrixContribution>& out);

/// Segment s observing every triangle (the wire current on its axis, exact kernel).
void add_segment_triangle_terms(const FillContext& c, int s, std::vector<MatrixContribution>& out);

/// On a substrate, the vertical part of the probe on segment s against every function
/// (solver/probe_pairs.cpp); the segment integrators are not used there.
void add_probe_terms(const FillContext& c, int s, std::vector<MatrixContribution>& out);

/// Triangle p against triangles q ≥ p (solver/triangle_pair_integrals), into the rows of
/// p's functions.
void add_triangle_triangle_terms(const FillContext& c, int p, ObserverRows& rows);

/// The junction stars as sources, observed by element e of the list [segments, triangles,
/// stars]; a star observes only the stars up to itself, so each pair is met once.
void add_star_source_terms(const FillContext& c, int e, std::vector<MatrixContribution>& out);

}  // namespace lobe
