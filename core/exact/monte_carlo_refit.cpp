// Parametric bootstrap of a fitted model's goodness-of-fit statistic: draw from the fitted shares
// (core/numerics/random.hpp, bit-identical everywhere), refit by null_model's grouped maximum likelihood,
// recompute the power-divergence statistic on the fixed tested cells (Davison & Hinkley 1997,
// sect. 4.2.3). The refit uses libm (log, lgamma), so natively and in WebAssembly a replicate's
// statistic may differ in its last bits; the count b can then differ only on exact ties.
#include "monte_carlo_refit.hpp"

#include <cmath>
#include <limits>
#include <string>

#include "null_model.hpp"
#include "power_divergence.hpp"

namespace tallyproof {
namespace {

double statistic_of(const std::vector<double>& obs, const std::vector<double>& exp, double lambda) {
    double t = 0;
    for (std::size_t c = 0; c < obs.size(); ++c) t = t + power_divergence_term(obs[c], exp[c], lambda);
    return t;
}

// Tested cells of a draw and of shares over the categories as read.
void group_cells(const RefitMonteCarloState& st, const std::vector<double>& observed, const std::vector<double>& shares,
                 std::vector<double>* obs, std::vector<double>* exp) {
    obs->assign(st.groups.size(), 0.0);
    exp->assign(st.groups.size(), 0.0);
    for (std::size_t c = 0; c < st.groups.size(); ++c)
        for (std::size_t i : st.groups[c]) {
            (*obs)[c] += observed[i];
            (*exp)[c] += st.n * shares[i];
        }
}

double to_natural(int scale, double u) {
    if (scale == 1) return std::exp(u);
    if (scale == 2) return 1.0 / (1.0 + std::exp(-u));
    return u;
}

double to_search(int scale, double theta) {
    if (scale == 1) return std::log(theta);
    if (scale == 2) return std::log(theta) - std::log1p(-theta);
    return theta;
}

// Shares of the model with the estimated parameter given at u (search scale); false if refused.
bool shares_at(const RefitMonteCarloState& st, Analysis* a, double u, std::vector<double>* shares) {
    for (auto& [name, value] : a->model.parameters)
        if (name == st.table.parameter) value = to_natural(st.table.scale, u);
    NullModel m;
    if (!null_model(*a, st.n, &m).ok || m.shares.size() != st.shares.size() || m.estimated_parameters != 0) return false;
    *shares = m.shares;
    return true;
}

double log_likelihood(const std::vector<double>& y, const std::vector<double>& shares) {
    double l = 0;
    for (std::size_t i = 0; i < y.size(); ++i)
        if (y[i] > 0) l += y[i] * std::log(shares[i]);
    return l;
}

// Tabulates log p_i over +-12 standard errors of the observed estimate (standard error from the
// curvature of the observed log-likelihood), 1201 points; leaves the table unusable on any refusal.
void build_table(const Analysis& a, const Result& r, RefitMonteCarloState* st) {
    RefitTable& t = st->table;
    t = RefitTable{};
    int estimated = 0;
    const ParameterValue* first = nullptr;
    for (const ParameterValue& p : r.estimates)
        if (p.estimated && !first) first = &p;
    estimated = r.estimated_parameters - a.extra_estimated_parameters;
    if (!first || estimated != 1) return;
    t.parameter = first->name;
    const bool real = (a.model.kind == ModelKind::normal && t.parameter == "mean") ||
                      (a.model.kind == ModelKind::lognormal && t.parameter == "meanlog");
    t.scale = real ? 0 : t.parameter == "p" ? 2 : 1;
    if (t.scale == 1 && !(first->value > 0)) return;
    if (t.scale == 2 && !(first->value > 0 && first->value < 1)) return;
    Analysis probe = a;
    probe.model.parameters.push_back({t.parameter, first->value});
    t.u0 = to_search(t.scale, first->value);
    // Curvature of the observed log-likelihood by central differences.
    const double d = 1e-3 * std::max(1.0, std::fabs(t.u0));
    std::vector<double> sm, s0, sp;
    if (!shares_at(*st, &probe, t.u0 - d, &sm) || !shares_at(*st, &probe, t.u0, &s0) || !shares_at(*st, &probe, t.u0 + d, &sp))
        return;
    const double curv = (log_likelihood(a.observed, sm) - 2 * log_likelihood(a.observed, s0) + log_likelihood(a.observed, sp)) / (d * d);
    if (!(curv < 0) || !std::isfinite(curv)) return;
    const double se = 1.0 / std::sqrt(-curv);
    t.points = 1201;
    t.step = 24.0 * se / (t.points - 1);
    const std::size_t k = st->shares.size();
    t.log_p.resize(static_cast<std::size_t>(t.points) * k);
    std::vector<double> sh;
    for (int g = 0; g < t.points; ++g) {
        if (!shares_at(*st, &probe, t.u0 + (g - t.points / 2) * t.step, &sh)) return;
        for (std::size_t i = 0; i < k; ++i) t.log_p[static_cast<std::size_t>(g) * k + i] = std::log(sh[i]);
    }
    st->analysis = probe;  // parameter now given; the value is set per replicate
    t.usable = true;
}

// The replicate's estimate from the table: shares at the refined maximum; false if off the grid.
bool refit_from_table(const RefitMonteCarloState& st, const std::vector<double>& y, std::vector<double>* shares) {
    const RefitTable& t = st.table;
    const std::size_t k = st.shares.size();
    auto ll = [&](int g) {
        const double* lp = t.log_p.data() + static_cast<std::size_t>(g) * k;
        double l = 0;
        for (std::size_t i = 0; i < k; ++i)
            if (y[i] > 0) l += y[i] * lp[i];
        return l;
    };
    // Hill-climb from the centre (the likelihood is unimodal near the estimate).
    int g = t.points / 2;
    double lg = ll(g);
    const int dir = ll(g + 1) > lg ? 1 : -1;
    for (;;) {
        const int nx = g + dir;
        if (nx < 1 || nx > t.points - 3) return false;
        const double ln = ll(nx);
        if (!(ln > lg)) break;
        g = nx;
        lg = ln;
    }
    if (g < 2 || g > t.points - 3) return false;
    // Cubic through 4 points around the maximum (offsets -1..2 or -2..1 from g, by the larger side).
    const int a0 = ll(g + 1) >= ll(g - 1) ? g - 1 : g - 2;
    double f[4];
    for (int i = 0; i < 4; ++i) f[i] = ll(a0 + i);
    // Derivative of the interpolating cubic in x (points at x = 0..3), found by Newton from x = g - a0.
    auto lagrange = [](double x, double w[4]) {
        w[0] = -(x - 1) * (x - 2) * (x - 3) / 6.0;
        w[1] = x * (x - 2) * (x - 3) / 2.0;
        w[2] = -x * (x - 1) * (x - 3) / 2.0;
        w[3] = x * (x - 1) * (x - 2) / 6.0;
    };
    // Cubic coefficients from the 4 values (forward differences).
    const double d1 = f[1] - f[0], d2 = f[2] - 2 * f[1] + f[0], d3 = f[3] - 3 * f[2] + 3 * f[1] - f[0];
    // p(x) = f0 + d1 x + d2 x(x-1)/2 + d3 x(x-1)(x-2)/6; p'(x) = d1 + d2 (2x-1)/2 + d3 (3x^2 - 6x + 2)/6.
    double x = g - a0;
    for (int it = 0; it < 20; ++it) {
        const double p1 = d1 + d2 * (2 * x - 1) / 2 + d3 * (3 * x * x - 6 * x + 2) / 6;
        const double p2 = d2 + d3 * (x - 1);
        if (!(p2 < 0)) break;
        const double nx = x - p1 / p2;
        if (std::fabs(nx - x) < 1e-12) {
            x = nx;
            break;
        }
        x = nx;
    }
    if (!(x >= 0.5 && x <= 2.5)) x = g - a0;  // stay within the interpolation's accurate middle
    double w[4];
    lagrange(x, w);
    shares->assign(k, 0.0);
    double total = 0;
    for (std::size_t i = 0; i < k; ++i) {
        double l = 0;
        for (int j = 0; j < 4; ++j) l += w[j] * t.log_p[static_cast<std::size_t>(a0 + j) * k + i];
        (*shares)[i] = std::exp(l);
        total += (*shares)[i];
    }
    for (double& v : *shares) v /= total;
    return true;
}

}  // namespace

bool monte_carlo_refits(const Analysis& a, const Result& r) {
    if (!model_is_fitted(a.model.kind)) return false;
    for (const ParameterValue& p : r.estimates)
        if (p.estimated) return true;
    return false;
}

Status refit_monte_carlo_start(const Analysis& a, const Result& r, const MonteCarloOptions& options,
                               RefitMonteCarloState* st) {
    *st = RefitMonteCarloState{};
    if (options.replicates < 1 || options.replicates > 10000000000ULL)
        return Status::failure("The number of Monte Carlo replicates must lie between 1 and 1e10.");
    if (!r.status.ok || r.expected_shares.size() != a.observed.size() || r.merge_map.empty())
        return Status::failure("Internal: the refitting simulation needs an analysed fitted model.");
    if (!(r.n >= 1) || r.n > 1e7) return Status::failure("The total is too large for a refitting simulation.");
    st->analysis = a;
    st->shares = r.expected_shares;
    st->groups = r.merge_map;
    st->n = r.n;
    st->lambda = a.statistic.lambda;
    if (!make_multinomial_sampler(static_cast<int>(r.n), st->shares, &st->sampler))
        return Status::failure("The fitted shares cannot be sampled.");
    // The observed statistic computed exactly as each replicate's (no Williams correction).
    group_cells(*st, a.observed, st->shares, &st->tested_observed, &st->tested_expected);
    st->observed_statistic = statistic_of(st->tested_observed, st->tested_expected, st->lambda);
    if (!std::isfinite(st->observed_statistic)) return Status::failure("The statistic is not finite for this table.");
    st->threshold = st->observed_statistic - kTieRelativeTolerance * std::fabs(st->observed_statistic);
    st->seed = options.seed;
    st->rng = seed_xoshiro256(options.seed);
    st->target = options.replicates;
    st->draw.assign(a.observed.size(), 0);
    st->progress.units_estimate = options.replicates;
    build_table(a, r, st);
    return Status::success();
}

WorkProgress refit_monte_carlo_step(RefitMonteCarloState* st, std::uint64_t budget) {
    WorkProgress& pr = st->progress;
    std::uint64_t todo = 0;
    if (!monte_carlo_step_begin(&pr, st->cancel_requested, st->target, st->done, budget, &todo)) return pr;
    NullModel refit;
    std::vector<double> shares;
    for (std::uint64_t b = 0; b < todo; ++b) {
        sample_multinomial(&st->sampler, &st->rng, st->draw.data());
        for (std::size_t i = 0; i < st->draw.size(); ++i) st->analysis.observed[i] = st->draw[i];
        if (!st->table.usable || !refit_from_table(*st, st->analysis.observed, &shares)) {
            ++st->full_refits;
            Analysis full = st->analysis;
            if (st->table.usable) {  // the parameter was made given for the table: estimate it again
                auto& ps = full.model.parameters;
                for (std::size_t i = ps.size(); i-- > 0;)
                    if (ps[i].first == st->table.parameter) ps.erase(ps.begin() + static_cast<std::ptrdiff_t>(i));
            }
            if (!null_model(full, st->n, &refit).ok || refit.shares.size() != st->shares.size()) {
                ++st->failed;
                continue;
            }
            shares = refit.shares;
        }
        group_cells(*st, st->analysis.observed, shares, &st->tested_observed, &st->tested_expected);
        const double t = statistic_of(st->tested_observed, st->tested_expected, st->lambda);
        if (!std::isfinite(t)) {
            ++st->failed;
            continue;
        }
        st->extreme += t >= st->threshold ? 1 : 0;
    }
    monte_carlo_step_end(&pr, todo, st->target, &st->done);
    return pr;
}

void refit_monte_carlo_cancel(RefitMonteCarloState* st) { st->cancel_requested = true; }

Status refit_monte_carlo_result(const RefitMonteCarloState& st, RefitMonteCarloResult* r) {
    *r = RefitMonteCarloResult{};
    if (st.progress.cancelled) return Status::failure("The Monte Carlo run was cancelled.");
    if (!st.progress.done || st.target == 0) return Status::failure("The Monte Carlo run has not finished.");
    const std::uint64_t used = st.target - st.failed;
    if (used == 0) return Status::failure("The model could not be refitted to any simulated table.");
    monte_carlo_estimate(st.extreme, used, &r->mc);
    r->mc.seed = st.seed;
    r->mc.observed_score = st.observed_statistic;
    r->failed_refits = st.failed;
    return Status::success();
}

}  // namespace tallyproof
