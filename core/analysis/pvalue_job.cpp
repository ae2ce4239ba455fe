// Runs exact_multinomial (branch and bound after Resin 2023) or monte_carlo (Davison and
// Hinkley 1997, eq. 4.11) on the tested cells of a Result; the decision then uses that p-value.
#include "pvalue_job.hpp"

#include <cmath>

#include "goodness_of_fit.hpp"
#include "number_format.hpp"

namespace tallyproof {
namespace {

MultinomialTestSpec spec_of(const Analysis& a, const Result& r) {
    MultinomialTestSpec spec;
    spec.observed = r.tested_observed;
    spec.null_shares.resize(r.tested_expected.size());
    for (std::size_t i = 0; i < r.tested_expected.size(); ++i) spec.null_shares[i] = r.tested_expected[i] / r.n;
    spec.ordering = a.pvalue.ordering == ExactOrdering::probability ? ExtremeOrdering::probability : ExtremeOrdering::statistic;
    spec.lambda = a.statistic.lambda;
    return spec;
}

}  // namespace

void start_pvalue_job(const Analysis& a, const Result& r, PValueJob* job) {
    job->method = a.pvalue.method;
    job->exact.reset();
    job->monte_carlo.reset();
    job->refit.reset();
    job->progress = WorkProgress{};
    job->status = Status::success();
    // A comparison with a previous sample computes its own conditional p-values (reference_sample_analysis).
    if (!r.status.ok || a.pvalue.method == PValueMethod::asymptotic || r.reference) {
        job->progress.done = true;
        job->progress.fraction = 1;
        return;
    }
    const MultinomialTestSpec spec = spec_of(a, r);
    if (a.pvalue.method == PValueMethod::exact) {
        job->exact = std::make_unique<ExactJob>();
        ExactChoiceOptions eo;
        eo.alpha = r.alpha;  // the grid bracket refines until it decides the test at alpha
        job->status = exact_job_start(spec, eo, job->exact.get());
    } else {
        MonteCarloOptions mo;
        mo.replicates = a.pvalue.replicates;
        mo.seed = a.pvalue.seed;
        const double k = static_cast<double>(spec.observed.size());
        job->status = monte_carlo_within_budget(static_cast<double>(mo.replicates), k,
                                                "tables of " + format_grouped(static_cast<std::uint64_t>(k)) + " categories", job->draws_left);
        if (!job->status.ok) {
            // over the budget: refused before any draw
        } else if (monte_carlo_refits(a, r)) {
            job->refit = std::make_unique<RefitMonteCarloState>();
            job->status = refit_monte_carlo_start(a, r, mo, job->refit.get());
        } else {
            job->monte_carlo = std::make_unique<MonteCarloState>();
            job->status = monte_carlo_start(spec, mo, job->monte_carlo.get());
        }
    }
    if (!job->status.ok) {
        job->progress.done = true;
        job->progress.fraction = 1;
    }
}

WorkProgress step_pvalue_job(PValueJob* job, std::uint64_t budget) {
    if (job->progress.done || job->progress.cancelled) return job->progress;
    if (job->exact) job->progress = exact_job_step(job->exact.get(), budget);
    else if (job->monte_carlo) job->progress = monte_carlo_step(job->monte_carlo.get(), budget);
    else if (job->refit) job->progress = refit_monte_carlo_step(job->refit.get(), budget);
    else { job->progress.done = true; job->progress.fraction = 1; }
    return job->progress;
}

void cancel_pvalue_job(PValueJob* job) {
    if (job->exact) exact_job_cancel(job->exact.get());
    if (job->monte_carlo) monte_carlo_cancel(job->monte_carlo.get());
    if (job->refit) refit_monte_carlo_cancel(job->refit.get());
    step_pvalue_job(job, 0);
    job->progress.cancelled = true;
}

void finish_pvalue_job(const PValueJob& job, Result* r) {
    if (!r->status.ok || r->reference) return;
    if (job.method == PValueMethod::exact) {
        r->exact.requested = true;
        ExactMultinomialResult er;
        const Status s = job.status.ok ? (job.exact ? exact_job_result(*job.exact, &er) : Status::failure("not started"))
                                       : job.status;
        if (!s.ok || job.progress.cancelled) {
            r->exact.refusal = job.progress.cancelled ? "The exact computation was cancelled." : s.message;
            r->warnings.push_back("Exact p-value not available: " + r->exact.refusal + " The asymptotic p-value is shown.");
            return;
        }
        r->exact.computed = true;
        r->exact.method = exact_method_name(job.exact->method);
        r->exact.p_lower = er.p_lower;
        r->exact.p_upper = er.p_upper;
        r->exact.bracketed = er.relative_error_bound > 1e-9;
        r->exact.decides_at_alpha = bracket_decides(er.p_lower, er.p_upper, r->alpha);
        if (r->estimated_parameters > 0)
            r->warnings.push_back("The exact p-value is conditional on the fitted shares (it treats them as known); with "
                                  "estimated parameters it is conservative (closer to the p at df " +
                                  std::to_string(static_cast<long long>(r->df_range.upper_df)) + "). The Monte Carlo "
                                  "p-value refits the model on every simulated table.");
        r->exact.p = er.p;
        r->exact.error_bound = er.error_bound;
        r->exact.work_units = static_cast<double>(er.work_units);
        r->method = PValueMethod::exact;
        r->p = er.p;
    } else if (job.method == PValueMethod::monte_carlo) {
        r->monte_carlo.requested = true;
        MonteCarloResult mr;
        RefitMonteCarloResult rr;
        Status s = job.status;
        if (s.ok && job.refit) {
            s = refit_monte_carlo_result(*job.refit, &rr);
            mr = rr.mc;
        } else if (s.ok) {
            s = job.monte_carlo ? monte_carlo_result(*job.monte_carlo, &mr) : Status::failure("not started");
        }
        if (!s.ok || job.progress.cancelled) {
            r->monte_carlo.refusal = job.progress.cancelled ? "The simulation was cancelled." : s.message;
            r->warnings.push_back("Monte Carlo p-value not available: " + r->monte_carlo.refusal + " The asymptotic p-value is shown.");
            return;
        }
        r->monte_carlo.computed = true;
        r->monte_carlo.refit = job.refit != nullptr;
        if (!job.refit && r->estimated_parameters > 0)
            r->warnings.push_back("The Monte Carlo p-value treats the fitted shares as known; with estimated parameters it is "
                                  "conservative (closer to the p at df " + std::to_string(static_cast<long long>(r->df_range.upper_df)) + ").");
        if (job.refit && rr.failed_refits > 0)
            r->warnings.push_back("The model could not be refitted to " + std::to_string(rr.failed_refits) +
                                  " simulated tables (a parameter at the edge of its range); they are left out of the "
                                  "Monte Carlo p-value.");
        record_monte_carlo(mr, r);
    } else {
        return;
    }
    r->reject = r->p.p <= r->alpha;
}

Result analyse_completely(const Analysis& a) {
    Result r = analyse(a);
    if (!r.status.ok) return r;
    PValueJob job;
    start_pvalue_job(a, r, &job);
    while (!job.progress.done && !job.progress.cancelled) step_pvalue_job(&job, 1u << 20);
    finish_pvalue_job(job, &r);
    return r;
}

void record_monte_carlo(const MonteCarloResult& mr, Result* r) {
    r->monte_carlo.p = mr.p;
    r->monte_carlo.standard_error = mr.standard_error;
    r->monte_carlo.replicates = mr.replicates;
    r->monte_carlo.hits = mr.extreme;
    r->monte_carlo.seed = mr.seed;
    r->method = PValueMethod::monte_carlo;
    r->p = TailProbability{mr.p, std::log10(mr.p)};
}

}  // namespace tallyproof
