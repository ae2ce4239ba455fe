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

bool monte_carlo_step_begin(WorkProgress* pr, bool cancel_requested, std::uint64_t target, std::uint64_t done,
                            std::uint64_t budget, std::uint64_t* todo) {
    if (pr->done || pr->cancelled) return false;
    if (cancel_requested) {
        pr->cancelled = true;
        return false;
    }
    if (target == 0) {  // not started successfully
        pr->done = true;
        pr->fraction = 1;
        return false;
    }
    *todo = target - done;
    if (*todo > budget) *todo = budget;
    return true;
}

void monte_carlo_step_end(WorkProgress* pr, std::uint64_t todo, std::uint64_t target, std::uint64_t* done) {
    *done += todo;
    pr->units_done = *done;
    if (*done == target) {
        pr->done = true;
        pr->fraction = 1;
    } else {
        pr->fraction = in_flight_fraction(*done, target);
    }
}

void monte_carlo_estimate(std::uint64_t extreme, std::uint64_t replicates, MonteCarloResult* r) {
    const double B = static_cast<double>(replicates);
    r->p = (static_cast<double>(extreme) + 1.0) / (B + 1.0);
    r->standard_error = std::sqrt(r->p * (1.0 - r->p) / B);
    r->extreme = extreme;
    r->replicates = replicates;
}

WorkProgress monte_carlo_step(MonteCarloState* st, std::uint64_t budget) {
    WorkProgress& pr = st->progress;
    std::uint64_t todo = 0;
    if (!monte_carlo_step_begin(&pr, st->cancel_requested, st->target, st->done, budget, &todo)) return pr;
    const std::size_t k = st->s.shares.size();
    const double threshold = st->s.threshold;
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
    monte_carlo_step_end(&pr, todo, st->target, &st->done);
    return pr;
}

void monte_carlo_cancel(MonteCarloState* st) { st->cancel_requested = true; }

Status monte_carlo_result(const MonteCarloState& st, MonteCarloResult* r) {
    *r = MonteCarloResult{};
    if (st.progress.cancelled) return Status::failure("The Monte Carlo run was cancelled.");
    if (!st.progress.done || st.target == 0) return Status::failure("The Monte Carlo run has not finished.");
    monte_carlo_estimate(st.extreme, st.target, r);
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
