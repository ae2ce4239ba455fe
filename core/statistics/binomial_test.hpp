// Exact two-sided binomial test of one category's count x out of n against its expected share
// p, by the "sum of the probabilities no larger than that observed" rule with R's relative
// tolerance 1 + 1e-7 (as R 4.2's binom.test). Boost.Math binomial pdf/cdf (complement form for
// upper tails); below the double range the log10 p-value comes from a log-space tail sum.
#pragma once
#include "chi_square_tail.hpp"

namespace tallyproof {

// Two-sided exact p-value with its log10. x and n must be whole numbers with 0 <= x <= n and
// 0 <= p <= 1; anything else gives NaN in both fields.
TailProbability binomial_test_two_sided(double x, double n, double p);

}  // namespace tallyproof
