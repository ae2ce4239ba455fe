// Exact p-value of Pearson's X² under equal shares by dynamic programming: with pi_j = 1/k,
// X² = (k/N) sum x_j² - N depends on the counts only through S = sum x_j², so the probability
// mass over (categories so far, count so far, S so far) carries everything (a lattice recursion
// in the manner of Good, Gover & Mitchell 1970, JASA 65:267; Read & Cressie 1988, ch. 7). Partial
// sums only grow: a prefix whose least completion reaches S_obs joins the tail at once, one whose
// greatest cannot is dropped as non-extreme; states below a mass cut are dropped into the bound.
#pragma once
#include <cstdint>
#include <vector>

#include "chi_square_tail.hpp"
#include "compensated_sum.hpp"
#include "exact_multinomial.hpp"
#include "status.hpp"
#include "work_slice.hpp"

namespace tallyproof {

// Whether the DP applies: the statistic ordering with lambda = 1 and every kept share equal.
bool equal_shares_dp_applies(const OutcomeScores& scores);
// Estimated work units (state updates, about 1e9 a second natively) of the run; infinity when its
// rows would pass 256 MB.
double estimate_equal_shares_work(const OutcomeScores& scores);

struct EqualSharesExactState {
    int n = 0, k = 0, level = 0;          // categories done so far
    std::int64_t s_threshold = 0;         // extreme iff sum x² >= s_threshold
    double observed_score = 0;
    std::vector<double> log_factorial;
    std::vector<std::vector<double>> rows, next;  // rows[m][s]: P(prefix with count m, sum of squares s)
    CompensatedSum tail;                  // mass already known extreme
    double dropped = 0;                   // mass of dropped light states (an upper bound on the loss)
    double mass_cut = 0;                  // states lighter than this are dropped
    double estimated_work = 0;
    WorkProgress progress;
    bool cancel_requested = false;
};

// Starts a run (the spec must satisfy equal_shares_dp_applies once scored).
Status equal_shares_exact_start(const OutcomeScores& scores, EqualSharesExactState* state);
WorkProgress equal_shares_exact_step(EqualSharesExactState* state, std::uint64_t budget);  // a category at a time
void equal_shares_exact_cancel(EqualSharesExactState* state);
Status equal_shares_exact_result(const EqualSharesExactState& state, ExactMultinomialResult* result);

}  // namespace tallyproof
