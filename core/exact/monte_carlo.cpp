// Monte Carlo p-value: replicate tables drawn by sequential conditional binomials (alias tables,
// core/numerics/random.hpp), each scored with the same separable score as the exact test (rows kept only
// near each expected count, the rare rest computed) and compared with the same tie threshold;
// p = (b + 1)/(B + 1) (Davison & Hinkley 1997, eq. 4.11), which never reports an impossible p = 0.
#include "monte_carlo.hpp"

#include <cmath>
#include <cstdio>

#include "number_format.hpp"

namespace tallyproof {

Status monte_carlo_start(const MultinomialTestSpec& spec, const MonteCarloOptions& options, MonteCarloState* st) {
    *st = MonteCarloState{};
    if (options.replicates < 1 || options.replicates > 10000000000ULL)
        return Status::failure("The number of Monte Carlo replicates must lie between 1 and 1e10.");
    Status s = make_outcome_scores(spec, &st->s, /*windowed=*/true);
    if (!s.ok) {
        *st = MonteCarloState{};
        return s;
    }
    if (!make_multinomial_sampler(st->s.n, st->s.shares, &st->sampler)) {
        *st = MonteCarloState{};
        return Status::failure("The null shares cannot be sampled.");
    }
    st->seed = options.seed;
    st->rng = seed_xoshiro256(options.seed);
    st->target = options.replicates;
    st->counts.assign(st->s.shares.size(), 0);
    st->progress.units_estimate = options.replicates;
    return Status::success();
}

Status monte_carlo_within_budget(double replicates, double draws_per_table, const std::string& table_words, double budget_left) {
    const double draws = replicates * draws_per_table;
    if (draws <= budget_left) return Status::success();
    auto grouped = [](double x) { return x < 1.8e19 ? format_grouped(static_cast<std::uint64_t>(x)) : format_significant(x, 2); };
    const double most = draws_per_table > 0 ? std::floor(budget_left / draws_per_table) : 0;
    const bool shared = budget_left < kMonteCarloDrawBudget;
    return Status::failure("Monte Carlo would make " + grouped(draws) + " random draws (" + grouped(replicates) + " replicate " +
                           table_words + "), beyond the budget of " + grouped(kMonteCarloDrawBudget) + " draws for one analysis" +
                           (shared ? " (" + grouped(kMonteCarloDrawBudget - budget_left) + " already used by this screen)" : "") +
                           ". Ask for fewer replicates" + (most >= 1 ? " (at most " + grouped(most) + " here)" : "") +
                           ", or use the asymptotic or exact p-value.");
}

WorkProgress monte_carlo_step(MonteCarloState* st, std::uint64_t budget) {
    WorkProgress& pr = st->progress;
    if (pr.done || pr.cancelled) return pr;
    if (st->cancel_requested) {
        pr.cancelled = true;
        return pr;
    }
    if (st->target == 0) {  // not started successfully
        pr.done = true;
        pr.fraction = 1;
        return pr;
    }
    const std::size_t k = st->s.shares.size();
    const double threshold = st->s.threshold;
    std::uint64_t todo = st->target - st->done;
    if (todo > budget) todo = budget;
    std::uint64_t extreme = 0;
    int* x = st->counts.data();
    const std::vector<double>* rows = st->s.score.data();
    const int* row_lo = st->s.score_lo.data();
    for (std::uint64_t r = 0; r < todo; ++r) {
        sample_multinomial(&st->sampler, &st->rng, x);
        double t = 0;  // summed left to right, exactly as OutcomeScores::observed_score
        for (std::size_t j = 0; j < k; ++j) {
            const std::size_t i = static_cast<std::size_t>(x[j] - row_lo[j]);  // wraps when below the row
            t = t + (i < rows[j].size() ? rows[j][i] : outcome_score(st->s, j, x[j]));
        }
        extreme += t >= threshold ? 1 : 0;
    }
    st->extreme += extreme;
    st->done += todo;
    pr.units_done = st->done;
    if (st->done == st->target) {
        pr.done = true;
        pr.fraction = 1;
    } else {
        pr.fraction = in_flight_fraction(st->done, st->target);
    }
    return pr;
}

void monte_carlo_cancel(MonteCarloState* st) { st->cancel_requested = true; }

Status monte_carlo_result(const MonteCarloState& st, MonteCarloResult* r) {
    *r = MonteCarloResult{};
    if (st.progress.cancelled) return Status::failure("The Monte Carlo run was cancelled.");
    if (!st.progress.done || st.target == 0) return Status::failure("The Monte Carlo run has not finished.");
    const double B = static_cast<double>(st.target);
    r->p = (static_cast<double>(st.extreme) + 1.0) / (B + 1.0);
    r->standard_error = std::sqrt(r->p * (1.0 - r->p) / B);
    r->extreme = st.extreme;
    r->replicates = st.target;
    r->seed = st.seed;
    r->observed_score = st.s.observed_score;
    return Status::success();
}

Status monte_carlo_p_value(const MultinomialTestSpec& spec, const MonteCarloOptions& options,
                           MonteCarloResult* result) {
    *result = MonteCarloResult{};
    MonteCarloState st;
    Status s = monte_carlo_start(spec, options, &st);
    if (!s.ok) return s;
    while (!monte_carlo_step(&st, 65536).done) {
    }
    return monte_carlo_result(st, result);
}

}  // namespace tallyproof
