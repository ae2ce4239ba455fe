// p-value jobs: the exact multinomial or Monte Carlo p-value of an analysed Result, run in
// slices (a frame at a time in the browser) with progress and cancel, or in one call. Monte
// Carlo for a model fitted to these counts refits on every replicate (refit_monte_carlo).
#pragma once
#include <cstdint>
#include <memory>

#include "analysis.hpp"
#include "exact_choice.hpp"
#include "exact_multinomial.hpp"
#include "monte_carlo.hpp"
#include "monte_carlo_refit.hpp"
#include "result.hpp"
#include "work_slice.hpp"

namespace tallyproof {

struct PValueJob {
    PValueMethod method = PValueMethod::asymptotic;
    std::unique_ptr<ExactJob> exact;                 // the fastest exact method, chosen by estimated time
    std::unique_ptr<MonteCarloState> monte_carlo;    // stated or digit-law shares
    std::unique_ptr<RefitMonteCarloState> refit;     // fitted models: parametric bootstrap
    WorkProgress progress;
    Status status;  // a refusal at start (too costly, over the Monte Carlo budget, unsupported statistic)
    double draws_left = kMonteCarloDrawBudget;  // Monte Carlo draws allowed (a screen sets what its groups left)
};

// Starts the job the analysis asks for (nothing to do for asymptotic: progress.done at once).
// A refusal is recorded in job->status and, by finish_pvalue_job, in the result.
void start_pvalue_job(const Analysis& a, const Result& r, PValueJob* job);
WorkProgress step_pvalue_job(PValueJob* job, std::uint64_t budget);
void cancel_pvalue_job(PValueJob* job);
// Folds a finished (or refused) job into the result: exact / monte_carlo, p, method, reject.
void finish_pvalue_job(const PValueJob& job, Result* r);
// A finished Monte Carlo p-value into the Result: its fields, the method and the p used.
void record_monte_carlo(const MonteCarloResult& mr, Result* r);

// analyse() followed by the whole p-value job, for the command-line tool and tests.
Result analyse_completely(const Analysis& a);

}  // namespace tallyproof
