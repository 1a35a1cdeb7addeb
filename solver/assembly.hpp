#pragma once
/// The one fill of the system matrix: every element pair through its integrator in one
/// parallel loop, then the stamps.
#include "solver/antenna_problem.hpp"
#include "solver/system_matrix.hpp"

namespace lobe {

/// Adds Z(f) of `problem` (in its medium) to `matrix`: the EFIE terms of every pair of
/// segments, triangles and junction stars (solver/pair_integrators.hpp), the conductor loss
/// of finitely conducting segments and the lumped loads. OpenMP-parallel over observing
/// elements (dynamic schedule), each row's terms added in one short critical section.
/// Cost: O((S + T + J)²) pair integrals.
void assemble_system(const AntennaProblem& problem, Real frequency_hz, SystemMatrix& matrix);

/// The Green's-function kernels the triangle–triangle fill evaluates in free space or over
/// a perfect ground (direct and image terms): 49 for a near pair (the smooth part, beside
/// its closed-form static part) or a far pair, 36 for a distant one. For speed reports.
double triangle_pair_kernel_evaluations(const AntennaProblem& problem);

}  // namespace lobe
