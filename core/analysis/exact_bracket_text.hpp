// How an exact p-value's certified bracket is said (report, write-up, page): "exact decision at
// α = …" when the bracket lies wholly on one side of α, else "bracket […, …], budget ended" with
// the Monte Carlo offer. Bounds are rounded outwards (lower down, upper up), so the printed
// bracket still contains p; digits follow the bracket's relative width (six or seven for a tail p).
#pragma once
#include <string>

#include "result.hpp"

namespace tallyproof {

std::string bracket_bound_text(double x, int digits, bool upper);  // x rounded down (upper: up) to `digits` figures
int bracket_digits(double p_lower, double p_upper);                  // significant figures the bracket supports, 2..7
std::string exact_bracket_interval(const ExactOutcome& e);            // "[0.0123, 0.0145]"
// One sentence about r.exact's bracket at r.alpha; empty when the exact p is not a bracket.
std::string exact_bracket_sentence(const Result& r);

}  // namespace tallyproof
