#include "solver/assembly.hpp"

#include <exception>
#include <vector>

#include "core/check.hpp"
#include "solver/frequency_limits.hpp"
#include "solver/pair_integrators.hpp"
#include "solver/stamps.hpp"
#include "solver/surface_loss.hpp"

namespace lobe {

namespace {

/// The reflected field over every distance between a wire point and a wire point's mirror
/// image: from twice the lowest height to the farthest pair.
std::shared_ptr<const GroundKernelTable> ground_kernel_table(const AntennaProblem& p, Real frequency_hz) {
  Vec3 low = Vec3::Constant(INFINITY), high = Vec3::Constant(-INFINITY);
  for (const Segment& s : p.mesh.segments)
    for (const Vec3& r : {s.start, s.end}) low = low.cwiseMin(r), high = high.cwiseMax(r);
  const Real shortest = 2 * low.z();
  const Real longest = std::hypot(high.x() - low.x(), high.y() - low.y(), 2 * high.z());
  return std::make_shared<const GroundKernelTable>(p.medium.ground_permittivity(frequency_hz),
                                                   p.medium.wavenumber(frequency_hz), shortest, longest,
                                                   std::asin(shortest / longest));
}

}  // namespace

FillContext::FillContext(const AntennaProblem& p, Real frequency_hz)
    : problem(p),
      geometry(*p.geometry),
      k(p.medium.wavenumber(frequency_hz)),
      vector_factor(p.medium.vector_factor(frequency_hz)),
      scalar_factor(p.medium.scalar_factor(frequency_hz)),
      ground_permittivity(p.medium.has_real_ground() ? p.medium.ground_permittivity(frequency_hz) : Complex(1.0)),
      slab(p.medium.has_slab() ? shared_slab_kernel_table(p.medium.slab(frequency_hz),
                                                          structure_extent_m(p.mesh, p.surfaces.mesh, p.medium))
                               : nullptr),
      probe_kernels(slab && !p.probes.empty() ? shared_probe_kernels(slab->slab(), slab->reach())
                                              : nullptr),
      ground_table(p.medium.near_ground_by_sommerfeld() ? ground_kernel_table(p, frequency_hz) : nullptr) {}

void assemble_system(const AntennaProblem& problem, Real frequency_hz, SystemMatrix& matrix) {
  LOBE_CHECK(matrix.size() == problem.unknowns(), "system matrix of the wrong size");
  const FillContext context(problem, frequency_hz);
  const int segments = static_cast<int>(problem.mesh.segments.size());
  const int triangles = static_cast<int>(problem.surfaces.mesh.triangles.size());
  const int elements = segments + triangles + static_cast<int>(problem.stars.size());
  const bool stars = !problem.stars.empty();
  std::exception_ptr failure;
#pragma omp parallel
  {
    std::vector<MatrixContribution> terms;
    ObserverRows rows(triangles > 0 ? matrix.size() : 0);
#pragma omp for schedule(dynamic, 4)
    for (int e = 0; e < elements; ++e) {
      try {
        terms.clear();
        if (e < segments && context.slab) {
          add_probe_terms(context, e, terms);
        } else if (e < segments) {
          add_segment_segment_terms(context, e, terms);
          add_segment_triangle_terms(context, e, terms);
        } else if (e < segments + triangles) {
          add_triangle_triangle_terms(context, e - segments, rows);
          rows.flush(problem.rwg.pieces_on(e - segments), matrix);
        }
        if (stars) add_star_source_terms(context, e, terms);
        matrix.add(terms);
      } catch (...) {
#pragma omp critical(lobe_matrix_failure)
        failure = std::current_exception();
      }
    }
  }
  if (failure) std::rethrow_exception(failure);

  matrix.add(conductor_loss_stamp(problem.mesh, problem.basis, frequency_hz));
  matrix.add(surface_loss_stamp(problem, frequency_hz));
  for (std::size_t l = 0; l < problem.model.loads.size(); ++l)
    if (problem.network.load_is_stamped(l))
      matrix.add(load_stamp(problem.load_vectors.col(static_cast<Eigen::Index>(l)),
                            load_impedance(problem.model.loads[l].values, frequency_hz)));
  // A stated ground system's loss, in series with the current into the ground at each point.
  for (Eigen::Index g = 0; g < problem.ground_system_vectors.cols(); ++g)
    matrix.add(load_stamp(problem.ground_system_vectors.col(g), *problem.model.real_ground->system_resistance));
  matrix.finish_fill();
}

}  // namespace lobe
