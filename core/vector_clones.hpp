#pragma once
/// The instruction sets a hot loop is compiled for besides the generic x86-64 build (which
/// has only SSE2's two lanes), the best chosen by the CPU's features at start-up: AVX-512,
/// and x86-64-v3 (AVX2 with FMA, the vector width of most desktop and laptop CPUs). A clone
/// for plain "avx2" has no FMA, and ran the pair kernel 1.4× slower than x86-64-v3's.
#define LOBE_VECTOR_CLONES __attribute__((target_clones("avx512f", "arch=x86-64-v3", "default")))
