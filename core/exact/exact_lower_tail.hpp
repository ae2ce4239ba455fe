// Exact lower tail of a power-divergence statistic under the multinomial null: P(T <= t_obs), the
// probability of a fit at least as close as the observed one, by enumerating every outcome
// (C(N + k - 1, k - 1) of them) for small totals. Terms are positive and summed with a running
// scale, so the value keeps ~1e-14 relative accuracy; ties within 1e-9 relative count as close.
#pragma once
#include <vector>

#include "chi_square_tail.hpp"
#include "status.hpp"

namespace tallyproof {

constexpr double kMaxLowerTailOutcomes = 1e6;  // outcomes enumerated at most (~50 ms natively)

// observed: whole counts; expected: positive counts (rescaled to shares); lambda > -1. Refuses
// (with a message) more than kMaxLowerTailOutcomes outcomes, so callers fall back to chi2(df).
Status exact_lower_tail(const std::vector<double>& observed, const std::vector<double>& expected, double lambda,
                        TailProbability* out);

}  // namespace tallyproof
