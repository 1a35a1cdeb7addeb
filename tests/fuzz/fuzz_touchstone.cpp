// libFuzzer target: any bytes given to the Touchstone reader, under any of the names an
// analyser file may have, either give network data or an InputError; nothing else may
// escape, crash, hang or allocate without bound.
// Build and run: see fuzz_model_parser.cpp; corpus tests/fuzz/corpus/touchstone.
#include <unistd.h>

#include <cstddef>
#include <cstdint>
#include <fstream>
#include <string>

#include "core/input_error.hpp"
#include "post/touchstone.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size == 0) return 0;
  // The first byte picks the file name: the port count may come from the extension.
  static const char* const names[] = {"m.s1p", "m.s2p", "m.s4p", "m.ts", "m.txt", "m.s0p", "m.s99p", "m.S3P"};
  const std::string path = "/tmp/lobe-fuzz-" + std::to_string(::getpid()) + "-" + names[data[0] % 8];
  std::ofstream(path, std::ios::binary).write(reinterpret_cast<const char*>(data + 1), static_cast<std::streamsize>(size - 1));
  try {
    const lobe::NetworkData network = lobe::read_touchstone(path, data[0] % 2);
    for (const auto& s : network.s)
      if (!s.allFinite()) __builtin_trap();  // the reader promised finite data
  } catch (const lobe::InputError&) {
  }
  ::unlink(path.c_str());
  return 0;
}
