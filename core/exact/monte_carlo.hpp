// Monte Carlo p-value of the multinomial goodness-of-fit test: B seeded replicates under the
// null, p = (b + 1)/(B + 1) with b the replicates at least as extreme as the observed table
// (Davison & Hinkley 1997, Bootstrap Methods, eq. 4.11; North, Curtis & Sham 2002, AJHG 71:439),
// standard error sqrt(p(1-p)/B). Same seed, same spec: the same b, natively and in WebAssembly.
#pragma once
#include <cstdint>
#include <string>
#include <vector>

#include "exact_multinomial.hpp"
#include "random.hpp"
#include "status.hpp"
#include "work_slice.hpp"

namespace tallyproof {

struct MonteCarloOptions {
    std::uint64_t replicates = 100000;  // B, 1 .. 1e10
    std::uint64_t seed = 20240101;      // any value; reported back so a run can be repeated
};

struct MonteCarloResult {
    double p = 1;                  // (b + 1) / (B + 1)
    double standard_error = 0;     // sqrt(p (1 - p) / B)
    std::uint64_t extreme = 0;     // b: replicates with score >= threshold (ties included)
    std::uint64_t replicates = 0;  // B
    std::uint64_t seed = 0;
    double observed_score = 0;     // T(observed), see OutcomeScores
};

// What every stepped Monte Carlo run shares (this one and monte_carlo_refit.hpp's).
// At the start of a step: false when the step ends at once (finished, cancelled, or never
// started: `pr` says which); else `todo` receives the replicates this step draws (at most `budget`).
bool monte_carlo_step_begin(WorkProgress* pr, bool cancel_requested, std::uint64_t target, std::uint64_t done,
                            std::uint64_t budget, std::uint64_t* todo);
// At the end of a step that drew `todo` more replicates: `done` and the progress of `target`.
void monte_carlo_step_end(WorkProgress* pr, std::uint64_t todo, std::uint64_t target, std::uint64_t* done);
// p = (b + 1) / (B + 1) of `extreme` replicates b out of `replicates` B, and its standard error
// sqrt(p (1 - p) / B), into `r` (Davison & Hinkley 1997, eq. 4.11).
void monte_carlo_estimate(std::uint64_t extreme, std::uint64_t replicates, MonteCarloResult* r);

// Resumable run; the work unit is one replicate.
struct MonteCarloState {
    OutcomeScores s;
    MultinomialSampler sampler;
    Xoshiro256 rng;
    std::uint64_t seed = 0, target = 0, done = 0, extreme = 0;
    std::vector<int> counts;
    WorkProgress progress;
    bool cancel_requested = false;
};

Status monte_carlo_start(const MultinomialTestSpec& spec, const MonteCarloOptions& options, MonteCarloState* state);
WorkProgress monte_carlo_step(MonteCarloState* state, std::uint64_t budget);  // at most `budget` replicates
void monte_carlo_cancel(MonteCarloState* state);  // the next step reports cancelled
Status monte_carlo_result(const MonteCarloState& state, MonteCarloResult* result);  // once done

// The one Monte Carlo budget (docs/methods.md, "Monte Carlo budget"): the random draws one analysis
// may make in all, whatever its kind. A draw is one count of a simulated table of a sample (k per
// replicate table of k categories; refitted models count the same) or one observation placed in a
// simulated comparison with a previous sample (the smaller sample's m per table); a screen's groups
// share one budget. Measured natively (docs/methods.md): a single sample's 10^8 draws about 6 s on a
// loaded two-core machine, a previous sample's 0.6 s; so no request runs for minutes (the issue-26 case,
// 10^9 replicates of 10 categories, ran 157 s), and the previous sample's limit (10^8) is kept.
inline constexpr double kMonteCarloDrawBudget = 1e8;
// Success when `replicates` tables of `draws_per_table` draws each (described by `table_words`, such
// as "tables of 10 categories") fit in `budget_left`; else a refusal naming the budget and the most
// replicates that fit (a screen passes what its earlier groups left).
Status monte_carlo_within_budget(double replicates, double draws_per_table, const std::string& table_words,
                                 double budget_left = kMonteCarloDrawBudget);

// One-call form: start, then step until done.
Status monte_carlo_p_value(const MultinomialTestSpec& spec, const MonteCarloOptions& options,
                           MonteCarloResult* result);

}  // namespace tallyproof
