// lobe bench's ceilings must be measured over tries long enough that a moment's
// disturbance (another process, BLAS threads still spinning after a zgemm) cannot set them:
// tries of a few milliseconds once gave a kernel rate a third of the machine's, and the fill
// a share of it above what the fill can reach.
#include <gtest/gtest.h>

#include "bench/machine_rates.hpp"

namespace lobe {
namespace {

TEST(MachineRates, KernelRateTriesLastAsLongAsAsked) {
  const KernelRate rate = kernel_evaluations_per_second(0.05);
  EXPECT_GE(rate.shortest_try_seconds, 0.05);
  EXPECT_GT(rate.per_second, 0.0);
}

}  // namespace
}  // namespace lobe
