// Chooses the exact method by estimated time: work estimates of each method divided by its rate
// measured natively on one core (tests/bench/bench_exact_dp: the walk about 1e8 units a second,
// the equal-shares programme about 2e9 estimated units a second, its estimate running 2x to 10x
// above the work done). Common practice for resumable jobs: decide once, before starting.
#include "exact_choice.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace tallyproof {
namespace {
constexpr double kWalkUnitsPerSecond = 1e8;
constexpr double kEqualSharesUnitsPerSecond = 2e9;
constexpr double kGridUnitsPerSecond = 1e9;  // state updates, suffix sums and binomial terms: 0.7e9 to 1.9e9 a second (bench_exact_bracket, 2026-12-05)
}  // namespace

const char* exact_method_name(ExactMethod m) {
    switch (m) {
        case ExactMethod::walk: return "branch-and-bound";
        case ExactMethod::equal_shares_dp: return "equal-shares-dp";
        case ExactMethod::grid_bracket: return "grid-bracket";
    }
    return "branch-and-bound";
}

double estimate_walk_seconds(const OutcomeScores& sc) { return estimate_exact_work(sc) / kWalkUnitsPerSecond; }

double estimate_equal_shares_seconds(const OutcomeScores& sc) {
    if (!equal_shares_dp_applies(sc)) return std::numeric_limits<double>::infinity();
    return estimate_equal_shares_work(sc) / kEqualSharesUnitsPerSecond;
}

Status exact_job_start(const MultinomialTestSpec& spec, const ExactChoiceOptions& options, ExactJob* job) {
    job->walk.reset();
    job->dp.reset();
    job->grid.reset();
    if (!(options.max_seconds > 0)) return Status::failure("The exact-test time limit must be positive.");
    OutcomeScores sc;
    Status s = make_outcome_scores(spec, &sc);
    if (!s.ok) return s;
    const double walk = sc.shares.size() < 2 ? 0.0 : estimate_walk_seconds(sc);
    const double dp = estimate_equal_shares_seconds(sc);
    const double best = std::min(walk, dp);
    if (best > options.max_seconds) {
        // The walk and the equal-shares programme would take too long: bracket p within the time.
        job->method = ExactMethod::grid_bracket;
        job->estimated_seconds = options.max_seconds;
        GridBracketOptions go;
        go.error_bound = options.error_bound;
        go.max_work = options.max_seconds * kGridUnitsPerSecond;
        go.alpha = options.alpha;
        job->grid = std::make_unique<GridBracketState>();
        return grid_bracket_start(sc, go, job->grid.get());
    }
    job->estimated_seconds = best;
    if (dp < walk) {
        job->method = ExactMethod::equal_shares_dp;
        job->dp = std::make_unique<EqualSharesExactState>();
        return equal_shares_exact_start(sc, job->dp.get());
    }
    job->method = ExactMethod::walk;
    job->walk = std::make_unique<ExactMultinomialState>();
    ExactMultinomialOptions wo;
    wo.max_work = std::numeric_limits<double>::max();  // the time limit above decided
    return exact_multinomial_start(spec, wo, job->walk.get());
}

WorkProgress exact_job_step(ExactJob* job, std::uint64_t budget) {
    if (job->dp) return equal_shares_exact_step(job->dp.get(), budget);
    if (job->grid) return grid_bracket_step(job->grid.get(), budget);
    if (job->walk) return exact_multinomial_step(job->walk.get(), budget);
    WorkProgress done;
    done.done = true;
    done.fraction = 1;
    return done;
}

void exact_job_cancel(ExactJob* job) {
    if (job->dp) equal_shares_exact_cancel(job->dp.get());
    if (job->grid) grid_bracket_cancel(job->grid.get());
    if (job->walk) exact_multinomial_cancel(job->walk.get());
}

Status exact_job_result(const ExactJob& job, ExactMultinomialResult* result) {
    if (job.dp) return equal_shares_exact_result(*job.dp, result);
    if (job.grid) return grid_bracket_result(*job.grid, result);  // however wide: the bracket reached, with its bounds
    if (job.walk) return exact_multinomial_result(*job.walk, result);
    *result = ExactMultinomialResult{};
    return Status::failure("The exact computation was not started.");
}

Status exact_p_value(const MultinomialTestSpec& spec, const ExactChoiceOptions& options, ExactMultinomialResult* result,
                     ExactMethod* method) {
    *result = ExactMultinomialResult{};
    ExactJob job;
    Status s = exact_job_start(spec, options, &job);
    if (!s.ok) return s;
    if (method) *method = job.method;
    while (!exact_job_step(&job, std::uint64_t(1) << 20).done) {
    }
    return exact_job_result(job, result);
}

}  // namespace tallyproof
