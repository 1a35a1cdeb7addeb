#pragma once
/// Adaptive frequency sweeps: solve a few frequencies of a long range in full and fill the
/// rest from a rational interpolant of the solved ones, adding solves where the interpolant
/// is least certain until it settles (model-based parameter estimation: the solution is a
/// rational function of frequency to within the fit, after Miller and Burke, "Using
/// model-based parameter estimation to increase the physical interpretability and
/// numerical efficiency of computational electromagnetics", Comput. Phys. Commun. 68
/// (1991) 43–75; the fit is the AAA algorithm, study/rational_interpolant).
#include <functional>

#include "solver/antenna_problem.hpp"
#include "study/study_control.hpp"

namespace lobe {

/// Solves the model's frequencies adaptively and hands every one to `use` (see
/// solve_each_frequency): the solved ones as solved, the others interpolated from them
/// (port admittances, basis and segment currents, by one barycentric combination), marked
/// FrequencySolution::interpolated. Solved always: both ends of the range, the frequencies
/// nearest each band's edges and centre, and seven spread evenly. Then, round by round, the
/// frequencies where successive interpolants' S-parameters differ most are solved, until
/// they differ by less than adaptive_s_tolerance everywhere and the round's solves met
/// their predictions to that tolerance. Returns false when cancelled.
bool solve_adaptively(const AntennaProblem& problem, const StudyControl& control,
                      const std::function<void(std::size_t, FrequencySolution&&)>& use);

}  // namespace lobe
