// WorkProgress: what one slice of a long computation (exact enumeration, Monte Carlo) reports,
// so a browser can run a bounded amount of work per animation frame and stay responsive.
// Slicing never changes a result: a sliced run performs the same operations in the same order
// as the one-call run, so both give bit-identical numbers (common practice for resumable work).
#pragma once
#include <cstdint>

namespace tallyproof {

// Returned by every `*_step(state, budget)` call. A step does roughly `budget` units of work
// (the unit is named by each computation) and returns; call it again until `done` or
// `cancelled`. `fraction` is monotone, in [0, 1], and exactly 1 only when done.
struct WorkProgress {
    double fraction = 0.0;            // share of the work finished (an estimate before done)
    bool done = false;                // the result can be read
    bool cancelled = false;           // cancel() was called; no result will come
    std::uint64_t units_done = 0;     // work units performed so far
    std::uint64_t units_estimate = 0; // expected total units (exact when done)
};

// Clamps an in-flight progress estimate so it never reaches 1 before the work is done.
inline double in_flight_fraction(std::uint64_t done, std::uint64_t estimate) {
    if (estimate == 0) return 0.0;
    const double f = static_cast<double>(done) / static_cast<double>(estimate);
    return f < 0.99 ? f : 0.99;
}

}  // namespace tallyproof
