#include "cli/interrupt.hpp"

#include <csignal>

namespace lobe::cli {
namespace {

CancelToken interrupted;
extern "C" void on_interrupt(int) { interrupted.request(); }

}  // namespace

const CancelToken& cancel_on_interrupt() {
  std::signal(SIGINT, on_interrupt);
  std::signal(SIGTERM, on_interrupt);
  return interrupted;
}

}  // namespace lobe::cli
