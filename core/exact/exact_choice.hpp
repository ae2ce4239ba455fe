// The exact p-value by whichever exact method is estimated fastest for the table: the
// branch-and-bound walk (exact_multinomial) or, under equal shares with X², the dynamic
// programme over sums of squares (equal_shares_exact). The choice is made on estimated time
// (work estimates over rates measured natively on one core, tests/bench/bench_exact_dp). A table
// neither finishes within the limit gets the certified grid bracket (grid_bracket_exact), refined
// until it decides the test at alpha (a tail p: to six significant figures) or the time limit
// ends; the bracket reached is returned, never refused for time (result.p_lower, p_upper).
#pragma once
#include <cstdint>
#include <memory>
#include <string>

#include "exact_equal_shares.hpp"
#include "exact_multinomial.hpp"
#include "exact_grid_bracket.hpp"
#include "status.hpp"
#include "work_slice.hpp"

namespace tallyproof {

enum class ExactMethod { walk, equal_shares_dp, grid_bracket };
const char* exact_method_name(ExactMethod m);  // "branch-and-bound", "equal-shares-dp", "grid-bracket"

struct ExactChoiceOptions {
    double max_seconds = 1.0;   // the time limit, natively (the page takes up to about twice as long)
    double error_bound = 1e-6;  // wanted bound of the grid bracket (the other methods do far better)
    double alpha = -1;          // the test's alpha: the grid stops refining once its bracket excludes it (none if outside (0, 1))
};

struct ExactJob {
    ExactMethod method = ExactMethod::walk;
    double estimated_seconds = 0;  // of the chosen method, natively
    std::unique_ptr<ExactMultinomialState> walk;
    std::unique_ptr<EqualSharesExactState> dp;
    std::unique_ptr<GridBracketState> grid;
};

// Estimated native seconds of each method for the scored table (infinity where it does not apply).
double estimate_walk_seconds(const OutcomeScores& scores);
double estimate_equal_shares_seconds(const OutcomeScores& scores);

Status exact_job_start(const MultinomialTestSpec& spec, const ExactChoiceOptions& options, ExactJob* job);
WorkProgress exact_job_step(ExactJob* job, std::uint64_t budget);
void exact_job_cancel(ExactJob* job);
Status exact_job_result(const ExactJob& job, ExactMultinomialResult* result);

// One-call form.
Status exact_p_value(const MultinomialTestSpec& spec, const ExactChoiceOptions& options, ExactMultinomialResult* result,
                     ExactMethod* method = nullptr);

}  // namespace tallyproof
