// Chooses the exact method by estimated time: work estimates of each method divided by its rate
// measured natively on one core (tests/bench/bench_exact_dp: the walk about 1e8 units a second,
// the equal-shares programme about 2e9 estimated units a second, its estimate running 2x to 10x
// above the work done). Common practice for resumable jobs: decide once, before starting.
#include "exact_choice.hpp"

#include <cmath>
#include <cstdio>
#include <limits>

namespace tallyproof {
namespace {
constexpr double kWalkUnitsPerSecond = 1e8;
constexpr double kEqualSharesUnitsPerSecond = 2e9;
}  // namespace

const char* exact_method_name(ExactMethod m) {
    switch (m) {
        case ExactMethod::walk: return "branch-and-bound";
        case ExactMethod::equal_shares_dp: return "equal-shares-dp";
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
    if (!(options.max_seconds > 0)) return Status::failure("The exact-test time limit must be positive.");
    OutcomeScores sc;
    Status s = make_outcome_scores(spec, &sc);
    if (!s.ok) return s;
    const double walk = sc.shares.size() < 2 ? 0.0 : estimate_walk_seconds(sc);
    const double dp = estimate_equal_shares_seconds(sc);
    const double best = std::min(walk, dp);
    if (best > options.max_seconds) {
        char buf[320];
        std::snprintf(buf, sizeof buf,
                      "The exact test would take about %.2g s here (over %.3g outcomes in all), above the limit of "
                      "%.2g s: use the Monte Carlo p-value instead.",
                      best, multinomial_outcome_count(sc.n, static_cast<int>(sc.shares.size())), options.max_seconds);
        return Status::failure(buf);
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
    if (job->walk) return exact_multinomial_step(job->walk.get(), budget);
    WorkProgress done;
    done.done = true;
    done.fraction = 1;
    return done;
}

void exact_job_cancel(ExactJob* job) {
    if (job->dp) equal_shares_exact_cancel(job->dp.get());
    if (job->walk) exact_multinomial_cancel(job->walk.get());
}

Status exact_job_result(const ExactJob& job, ExactMultinomialResult* result) {
    if (job.dp) return equal_shares_exact_result(*job.dp, result);
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
