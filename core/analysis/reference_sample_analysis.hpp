// The comparison of the counts with a previous sample (model kind reference-sample): chi-square
// test of homogeneity on the 2 x k table (df k - 1; Pearson 1900, Cressie and Read 1984),
// thin categories merged in both rows together, exact conditional or Monte Carlo p-values
// (core/exact/exact_homogeneity), effect size w = sqrt(X² / N) over both samples (Cramér's V for
// 2 x k; Cohen 1988, ch. 7) and validity of every cell (Cochran 1954).
#pragma once
#include "analysis.hpp"
#include "monte_carlo.hpp"
#include "result.hpp"

namespace tallyproof {

constexpr double kMaxExactHomogeneityTables = 2e6;  // about 0.1 s natively
constexpr double kMaxMonteCarloHomogeneityDraws = kMonteCarloDrawBudget;  // monte_carlo.hpp: one budget for every Monte Carlo p

// Completes `r`, which analyse() has filled with the checked current counts (categories,
// observed, n, alpha). On a refusal, `r` holds only the status.
void analyse_reference_sample(const Analysis& a, Result* r);

}  // namespace tallyproof
