#pragma once
/// How long a dense solve will take on this machine, told before a long run starts.

namespace lobe {

/// This machine's complex matrix-multiply rate, GFLOP/s (8 n³ real flops per n × n
/// product; the median of three): the practical peak the factorisation is measured against.
double measured_zgemm_gflops(int n);

/// Seconds that `frequencies` dense solves of `unknowns` will take here: the LU's
/// (8/3) N³ flops at the measured zgemm rate (a factorisation reaches about three quarters of
/// it), and the fill about a third on top, as the benchmark finds. Measures only when the
/// answer could exceed `threshold_seconds` at a slow 1 GFLOP/s; returns 0 otherwise.
double estimated_solve_seconds(double unknowns, double frequencies, double threshold_seconds);

}  // namespace lobe
