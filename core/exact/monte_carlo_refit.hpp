// Monte Carlo p-value for a fitted model by the parametric bootstrap: each replicate is drawn
// from the fitted model, its parameters are re-estimated by the same grouped maximum likelihood
// (null_model), and the statistic is recomputed against the refitted expected counts on the same
// tested cells (merge groups fixed at the observed table's); p = (b + 1)/(B + 1) over the
// replicates whose refit succeeded (Davison & Hinkley 1997, Bootstrap Methods, sect. 4.2.3;
// Stute, Gonzalez Manteiga & Presedo Quindimil 1993, JASA 88:1185 for its validity in fit tests).
#pragma once
#include <cstdint>
#include <vector>

#include "analysis.hpp"
#include "monte_carlo.hpp"
#include "random.hpp"
#include "result.hpp"
#include "status.hpp"
#include "work_slice.hpp"

namespace tallyproof {

// Whether a Monte Carlo run for this analysis and result refits (a fitted model with at least
// one parameter estimated from these counts).
bool monte_carlo_refits(const Analysis& a, const Result& r);

struct RefitMonteCarloResult {
    MonteCarloResult mc;             // p, standard error, b and B over the successful refits
    std::uint64_t failed_refits = 0; // replicates whose refit was refused (left out of B)
};

// One estimated parameter: the grouped log-likelihood of any table is sum y_i log p_i(theta),
// linear in the counts, so log p_i is tabulated once (by null_model with the parameter given) on
// a fine grid of the search scale around the observed estimate, and each replicate's maximum is
// found on the grid and refined by 4-point Lagrange interpolation (cell probabilities likewise).
// Replicates whose maximum leaves the grid are refitted in full.
struct RefitTable {
    bool usable = false;
    std::string parameter;             // the estimated parameter, passed to null_model as given
    int scale = 0;                     // 0 real, 1 log, 2 logit
    double u0 = 0, step = 0;           // grid point g is u0 + (g - points / 2) step on the search scale
    int points = 0;
    std::vector<double> log_p;         // [g * k + i]
};

struct RefitMonteCarloState {
    RefitTable table;
    std::uint64_t full_refits = 0;                  // replicates refitted in full (off the table)
    Analysis analysis;                              // observed replaced by each replicate
    std::vector<double> shares;                     // the fitted shares replicates are drawn from
    std::vector<std::vector<std::size_t>> groups;   // tested cell -> categories as read
    double n = 0, lambda = 1, observed_statistic = 0, threshold = 0;
    MultinomialSampler sampler;
    Xoshiro256 rng;
    std::uint64_t seed = 0, target = 0, done = 0, extreme = 0, failed = 0;
    std::vector<int> draw;
    std::vector<double> tested_observed, tested_expected;
    WorkProgress progress;
    bool cancel_requested = false;
};

Status refit_monte_carlo_start(const Analysis& a, const Result& r, const MonteCarloOptions& options,
                               RefitMonteCarloState* state);
WorkProgress refit_monte_carlo_step(RefitMonteCarloState* state, std::uint64_t budget);  // replicates
void refit_monte_carlo_cancel(RefitMonteCarloState* state);
Status refit_monte_carlo_result(const RefitMonteCarloState& state, RefitMonteCarloResult* result);

}  // namespace tallyproof
