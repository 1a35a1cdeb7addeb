#pragma once
/// Programmer-error checks: LOBE_CHECK is always on (cheap, at module boundaries),
/// LOBE_ASSERT only in debug builds.
#include <cassert>
#include <stdexcept>
#include <string>

#define LOBE_CHECK(condition, message)                                             \
  do {                                                                             \
    if (!(condition))                                                              \
      throw std::logic_error(std::string(__FILE__) + ":" + std::to_string(__LINE__) + \
                             ": check failed: " + (message));                      \
  } while (0)

#define LOBE_ASSERT(condition) \
  do {                         \
    assert(condition);         \
  } while (0)
