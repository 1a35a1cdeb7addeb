// Must not compile: post code including a private header of solver/ (the pair integrators
// are solver's own business). Built only by the Layering tests.
#include "solver/pair_integrators.hpp"
