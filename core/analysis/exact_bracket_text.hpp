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
// A bracket whose upper end is over ten times its lower end: its midpoint says little about p, so
// the headline says "p ≤ upper" (exact_p_text) rather than the midpoint.
bool exact_bracket_is_wide(const Result& r);
// The headline p of a result: "p ≤ 7.6 × 10⁻¹⁴" for a wide exact bracket, else "p = " and the p.
std::string headline_p_text(const Result& r);
// One sentence about r.exact's bracket at r.alpha; empty when the exact p is not a bracket.
std::string exact_bracket_sentence(const Result& r);

}  // namespace tallyproof
