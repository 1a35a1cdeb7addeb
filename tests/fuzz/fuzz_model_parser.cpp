// libFuzzer target: any bytes given to the model reader and mesher either give a model or
// an InputError; nothing else may escape, crash or hang.
// Build: CC=clang CXX=clang++ cmake -S . -B build-fuzz -DLOBE_FUZZ=ON -DLOBE_OPENMP=OFF -DLOBE_BENCH=OFF
//        cmake --build build-fuzz --target fuzz_model_parser
// Run:   build-fuzz/tests/fuzz_model_parser -max_total_time=600 /tmp/corpus tests/fuzz/corpus/model_parser models tests/bad_models
#include <cstddef>
#include <cstdint>
#include <string>

#include "geometry/model_parser.hpp"
#include "geometry/wire_mesh.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  try {
    const lobe::Model model = lobe::parse_model(text, "fuzz");
    lobe::mesh_wires(model);
  } catch (const lobe::InputError&) {
  }
  return 0;
}
