// libFuzzer target: any bytes given to the measured-CSV reader either give a curve of
// finite reflections no larger than 1 at ascending positive frequencies, or an InputError.
// Build and run: see fuzz_model_parser.cpp; corpus tests/fuzz/corpus/measured_csv.
#include <unistd.h>

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <fstream>
#include <string>

#include "core/input_error.hpp"
#include "post/measured_csv.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string path = "/tmp/lobe-fuzz-" + std::to_string(::getpid()) + ".csv";
  std::ofstream(path, std::ios::binary).write(reinterpret_cast<const char*>(data), static_cast<std::streamsize>(size));
  try {
    const lobe::MeasuredCurve m = lobe::read_measured_csv(path, 50.0);
    const auto& f = m.curve.frequency_hz;
    for (std::size_t k = 0; k < f.size(); ++k)
      if (!(f[k] > 0.0) || (k > 0 && !(f[k] > f[k - 1])) || !(std::abs(m.curve.reflection[k]) <= 1.0 + 1e-9))
        __builtin_trap();  // the reader promised all of this
  } catch (const lobe::InputError&) {
  }
  ::unlink(path.c_str());
  return 0;
}
