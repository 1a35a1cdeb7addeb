// Must not compile: geometry code including a header of solver/, a library above it.
// Built only by the Layering tests, which expect the include to be missing.
#include "solver/antenna_problem.hpp"
