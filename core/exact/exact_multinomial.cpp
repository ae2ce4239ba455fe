// Exact multinomial p-value by branch and bound over count prefixes. Scores are separable and
// discrete-convex, so the least score over a prefix's completions is an infimal convolution
// (merge of sorted increments: Ibaraki & Katoh 1988, Resource Allocation Problems, MIT Press) and
// the non-extreme children form one interval; wholly extreme children add a binomial tail summed
// outward with a geometric remainder bound. p is a sum of positive terms; bound stated per run.
#include "exact_multinomial.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>

#include <boost/math/special_functions/gamma.hpp>

#include "math_policy.hpp"
#include "power_divergence.hpp"

namespace tallyproof {
namespace {

constexpr double kEps = std::numeric_limits<double>::epsilon();
constexpr double kTailDelta = 8.673617379884035e-19;  // 2^-60: relative remainder left in a tail
constexpr double kNegligibleLog = 60.0;  // prefixes below P(observed) e^-60 are bounded, not walked
constexpr double kLn10 = 2.302585092994045684;

double log_binomial_pmf(const ExactMultinomialState& st, int level, int m, int x) {
    const auto& lf = st.s.log_factorial;
    return lf[m] - lf[x] - lf[m - x] + x * st.log_pi_cond[level] + (m - x) * st.log_rest_cond[level];
}

double abs_log_binomial(const ExactMultinomialState& st, int level, int m, int x) {
    const auto& lf = st.s.log_factorial;
    return lf[m] + lf[x] + lf[m - x] + x * std::fabs(st.log_pi_cond[level]) +
           (m - x) * std::fabs(st.log_rest_cond[level]);
}

void add_term(ExactMultinomialState* st, double v) {  // Neumaier compensated summation
    const double t = st->sum + v;
    if (std::fabs(st->sum) >= std::fabs(v)) st->compensation += (st->sum - t) + v;
    else st->compensation += (v - t) + st->sum;
    st->sum = t;
}

void note_log_error(ExactMultinomialState* st, int level, double abs_log) {
    // A sum of n terms carries at most n eps sum|terms| (Higham 2002, eq. 4.4); n <= 6 level + 8.
    const double e = (6.0 * level + 8.0) * kEps * (abs_log + std::fabs(st->log_scale));
    if (e > st->worst_log_error) st->worst_log_error = e;
}

// Score of the best completion when the next count is x.
inline double h_value(const ExactMultinomialState& st, const ExactMultinomialState::Frame& f, int x) {
    return f.partial + st.s.score[f.level][x] + st.min_rest[f.level + 1][f.m - x];
}

// Sum of the binomial tail of a node from x0 outward (dir = +1 up, -1 down), scaled by e^-log_scale.
void add_tail(ExactMultinomialState* st, const ExactMultinomialState::Frame& f, int x0, int dir) {
    const int m = f.m;
    if (x0 < 0 || x0 > m) return;
    const double lt = f.log_mass + log_binomial_pmf(*st, f.level, m, x0);
    note_log_error(st, f.level, f.abs_log + abs_log_binomial(*st, f.level, m, x0));
    double t = std::exp(lt - st->log_scale);
    const double odds = st->odds[f.level];
    double tail = 0;
    int x = x0, len = 0;
    for (;;) {
        tail += t;
        ++len;
        const int nx = x + dir;
        if (nx < 0 || nx > m) break;
        const double rho = dir > 0 ? (static_cast<double>(m - x) / (x + 1.0)) * odds
                                   : static_cast<double>(x) / ((m - x + 1.0) * odds);
        if (rho < 1.0) {
            const double rest = t * rho / (1.0 - rho);  // later ratios are smaller still
            if (rest <= kTailDelta * tail) {
                st->truncated += rest;
                break;
            }
        }
        t *= rho;
        x = nx;
    }
    st->progress.units_done += static_cast<std::uint64_t>(len);
    if (len > st->longest_tail) st->longest_tail = len;
    add_term(st, tail);
}

// Finds the non-extreme children of a freshly pushed frame, banks the extreme tails, and sets the
// range of children still to walk (none at the last free level, whose children are leaves).
void open_frame(ExactMultinomialState* st) {
    ExactMultinomialState::Frame& f = st->stack.back();
    ++st->nodes;
    ++st->progress.units_done;
    const int k = static_cast<int>(st->s.shares.size());
    const bool last = f.level == k - 2;
    const double thr = last ? st->s.threshold : st->s.threshold + st->margin;
    const int xs = st->argmin[f.level][f.m];
    ++st->progress.units_done;
    if (!(h_value(*st, f, xs) < thr)) {  // every completion extreme: bank the whole mass
        note_log_error(st, f.level, f.abs_log);
        add_term(st, std::exp(f.log_mass - st->log_scale));
        f.next = 1;
        f.end = 0;
        return;
    }
    // h is convex in x with its minimum at xs: binary searches for the interval where h < thr.
    int a = xs, b = xs;
    if (h_value(*st, f, 0) < thr) a = 0;
    else {
        int lo = 0, hi = xs;
        while (hi - lo > 1) {
            const int mid = lo + (hi - lo) / 2;
            (h_value(*st, f, mid) < thr ? hi : lo) = mid;
            ++st->progress.units_done;
        }
        a = hi;
    }
    if (h_value(*st, f, f.m) < thr) b = f.m;
    else {
        int lo = xs, hi = f.m;
        while (hi - lo > 1) {
            const int mid = lo + (hi - lo) / 2;
            (h_value(*st, f, mid) < thr ? lo : hi) = mid;
            ++st->progress.units_done;
        }
        b = lo;
    }
    st->progress.units_done += 2;
    add_tail(st, f, a - 1, -1);
    add_tail(st, f, b + 1, +1);
    if (last) {
        f.next = 1;
        f.end = 0;
    } else {
        f.next = a;
        f.end = b;
    }
}

void finish(ExactMultinomialState* st) {
    st->progress.done = true;
    st->progress.fraction = 1.0;
    st->progress.units_estimate = st->progress.units_done;
}

double unit_ball_volume(int d) { return std::pow(3.14159265358979323846, d / 2.0) / std::tgamma(d / 2.0 + 1.0); }

}  // namespace

double multinomial_outcome_count(int n, int k) {
    if (n < 0 || k < 1) return 0;
    double c = 1;
    for (int i = 1; i < k; ++i) c = c * (n + i) / i;  // C(n+i, i) from C(n+i-1, i-1)
    return c < 9e15 ? std::round(c) : c;
}

double outcome_score(const OutcomeScores& sc, std::size_t j, int x) {
    const double pi = sc.shares[j];
    if (sc.ordering == ExtremeOrdering::statistic) return power_divergence_term(x, sc.n * pi, sc.lambda);
    const double lf = sc.log_factorial.empty() ? boost::math::lgamma(x + 1.0, quiet_policy())
                                               : sc.log_factorial[static_cast<std::size_t>(x)];
    return lf - x * std::log(pi);
}

Status make_outcome_scores(const MultinomialTestSpec& spec, OutcomeScores* sc, bool windowed) {
    *sc = OutcomeScores{};
    const std::size_t k = spec.observed.size();
    char buf[320];
    if (k < 2) return Status::failure("A multinomial test needs at least two categories.");
    if (spec.null_shares.size() != k) {
        std::snprintf(buf, sizeof buf, "There are %zu observed counts but %zu null shares.", k, spec.null_shares.size());
        return Status::failure(buf);
    }
    if (spec.ordering == ExtremeOrdering::statistic) {
        if (!std::isfinite(spec.lambda))
            return Status::failure("The power-divergence parameter lambda must be a finite number.");
        if (spec.lambda <= -1.0)
            return Status::failure("An exact or Monte Carlo p-value needs lambda > -1: for lambda <= -1 the statistic "
                                   "is infinite for every outcome with an empty category. Choose lambda > -1 or "
                                   "order outcomes by probability.");
    }
    double n = 0, share_total = 0;
    for (std::size_t i = 0; i < k; ++i) {
        const double o = spec.observed[i], p = spec.null_shares[i];
        if (!std::isfinite(o) || o < 0 || o != std::floor(o)) {
            std::snprintf(buf, sizeof buf, "The count %g for category %zu must be a non-negative whole number.", o, i + 1);
            return Status::failure(buf);
        }
        if (!std::isfinite(p) || p < 0) {
            std::snprintf(buf, sizeof buf, "The null share %g for category %zu must be a non-negative number.", p, i + 1);
            return Status::failure(buf);
        }
        if (p == 0 && o > 0) {
            std::snprintf(buf, sizeof buf,
                          "Category %zu has a null share of zero but was observed %g times: the stated mix rules it out.",
                          i + 1, o);
            return Status::failure(buf);
        }
        n += o;
        share_total += p;
    }
    if (!(share_total > 0)) return Status::failure("The null shares are all zero.");
    if (n < 1) return Status::failure("All counts are zero: there is nothing to test.");
    std::size_t kept = 0;
    for (double p : spec.null_shares) kept += p > 0 ? 1 : 0;
    if (!windowed && (n > 1e7 || n * static_cast<double>(kept) > 2e7)) {
        std::snprintf(buf, sizeof buf,
                      "A total of %.10g over %zu categories is too large for exact p-values "
                      "(limit: total x categories <= 2e7); use a simulated p-value or the chi-square approximation.",
                      n, kept);
        return Status::failure(buf);
    }
    if (windowed) {
        // Simulation keeps only the windows (about 80 sqrt(N pi_j) entries a row, so about 80 sqrt(N k) in
        // all); their total is what bounds its memory, not N k.
        double entries = 0;
        for (double p : spec.null_shares) {
            if (p == 0) continue;
            const double pi = p / share_total, mean = n * pi;
            entries += std::min(n + 1, 2 * (40 * std::sqrt(mean * (1 - pi)) + 2) + 2);
        }
        if (n > kMaxSimulatedTotal || entries > kMaxWindowedScoreEntries) {
            std::snprintf(buf, sizeof buf,
                          "A total of %.10g over %zu categories is too large for simulated p-values "
                          "(limits: a total of at most 1e9, and score windows of at most 4e6 entries, about "
                          "total x categories <= 2.5e9); use the chi-square approximation.", n, kept);
            return Status::failure(buf);
        }
    }
    sc->ordering = spec.ordering;
    sc->lambda = spec.lambda;
    sc->n = static_cast<int>(n);
    const int N = sc->n;
    if (!windowed) {
        sc->log_factorial.resize(static_cast<std::size_t>(N) + 1);
        for (int x = 0; x <= N; ++x) sc->log_factorial[x] = boost::math::lgamma(x + 1.0, quiet_policy());
    }
    for (std::size_t i = 0; i < k; ++i) {
        if (spec.null_shares[i] == 0) continue;
        sc->kept.push_back(i);
        sc->shares.push_back(spec.null_shares[i] / share_total);
        sc->observed.push_back(static_cast<int>(spec.observed[i]));
    }
    for (std::size_t j = 0; j < sc->shares.size(); ++j) {
        int lo = 0, hi = N;
        if (windowed) {  // N pi_j +- 40 sd (probability below 1e-300 outside); the rest by outcome_score
            const double mean = N * sc->shares[j], reach = 40 * std::sqrt(mean * (1 - sc->shares[j])) + 2;
            if (mean - reach > 0) lo = static_cast<int>(mean - reach);
            if (mean + reach < N) hi = static_cast<int>(mean + reach);
        }
        std::vector<double> row(static_cast<std::size_t>(hi - lo) + 1);
        for (int x = lo; x <= hi; ++x) row[static_cast<std::size_t>(x - lo)] = outcome_score(*sc, j, x);
        // The term is convex in x, so the ends of 0..N bound a windowed row.
        const double ends[2] = {outcome_score(*sc, j, 0), outcome_score(*sc, j, N)};
        bool finite = std::isfinite(ends[0]) && std::isfinite(ends[1]);
        for (double v : row) finite = finite && std::isfinite(v);
        if (!finite) {
            std::snprintf(buf, sizeof buf, "The statistic overflows for category %zu at lambda = %g.",
                          sc->kept[j] + 1, spec.lambda);
            return Status::failure(buf);
        }
        sc->score.push_back(std::move(row));
        sc->score_lo.push_back(lo);
    }
    double t = 0;
    for (std::size_t j = 0; j < sc->shares.size(); ++j) t = t + outcome_score(*sc, j, sc->observed[j]);
    sc->observed_score = t;
    sc->threshold = spec.ordering == ExtremeOrdering::statistic ? t - kTieRelativeTolerance * std::fabs(t)
                                                                : t - kTieRelativeTolerance;
    return Status::success();
}

std::vector<std::vector<double>> least_completion_scores(const OutcomeScores& sc, std::vector<std::vector<int>>* argmin) {
    const int k = static_cast<int>(sc.shares.size());
    const int N = sc.n;
    std::vector<std::vector<double>> min_rest(static_cast<std::size_t>(k));
    if (argmin) argmin->assign(static_cast<std::size_t>(k), {});
    if (k == 0) return min_rest;
    min_rest[k - 1] = sc.score[k - 1];
    for (int j = k - 2; j >= 0; --j) {
        const std::vector<double>& g = sc.score[j];
        const std::vector<double>& v = min_rest[j + 1];
        std::vector<double> w(N + 1);
        std::vector<int> split(N + 1);
        int ig = 0, iv = 0;
        for (int m = 0; m <= N; ++m) {
            split[m] = ig;
            w[m] = g[ig] + v[iv];
            if (m == N) break;
            const double dg = ig < N ? g[ig + 1] - g[ig] : HUGE_VAL;
            const double dv = iv < N ? v[iv + 1] - v[iv] : HUGE_VAL;
            (dg <= dv ? ig : iv) += 1;
        }
        if (argmin) (*argmin)[j] = std::move(split);
        if (j >= 1) min_rest[j] = std::move(w);
    }
    return min_rest;
}

double estimate_exact_work(const OutcomeScores& sc) {
    const int k = static_cast<int>(sc.shares.size());
    const int N = sc.n;
    if (k < 2) return 1;
    // Chi-square-equivalent radius: the statistic itself, or -2 log(P / P_mode) for the
    // probability ordering (both ~ X^2 near the centre).
    double least = 0;
    {
        // The smallest score (mode) via the same merge as the run, cheaply recomputed here.
        std::vector<double> v = sc.score[k - 1];
        for (int j = k - 2; j >= 0; --j) {
            std::vector<double> w(N + 1);
            int ig = 0, iv = 0;
            for (int m = 0; m <= N; ++m) {
                w[m] = sc.score[j][ig] + v[iv];
                if (m == N) break;
                const double dg = ig < N ? sc.score[j][ig + 1] - sc.score[j][ig] : HUGE_VAL;
                const double dv = iv < N ? v[iv + 1] - v[iv] : HUGE_VAL;
                (dg <= dv ? ig : iv) += 1;
            }
            v.swap(w);
        }
        least = v[N];
    }
    // Power-divergence scores are on the X^2 scale already; for the probability ordering the
    // score difference is a log-likelihood ratio, and -2 log(P / P_mode) ~ X^2.
    double t_star = sc.observed_score - least;
    if (sc.ordering == ExtremeOrdering::probability) t_star *= 2;
    if (t_star < 1) t_star = 1;
    double units = 0, rest = 1.0, prod_e = 1.0;
    for (int d = 0; d <= k - 2; ++d) {
        // Nodes with d counts fixed: lattice points of the projected chi-square ellipsoid.
        const double e_rest = N * rest;
        double nodes = d == 0 ? 1.0 : unit_ball_volume(d) * prod_e * std::sqrt(e_rest / N);
        nodes = std::min(nodes, multinomial_outcome_count(N, d + 1));
        const double q = sc.shares[d] / rest;
        const double sd = std::sqrt(e_rest * q * (1 - q));
        const double per_node = 4 + 2 * std::log2(e_rest + 2) + 2 * (2 + 7 * sd);
        units += nodes * per_node;
        prod_e *= std::sqrt(t_star * N * sc.shares[d]) + 1.0;
        rest -= sc.shares[d];
        if (rest < 0) rest = 0;
    }
    // Lattice counts of the ellipsoid overstate the walk by about 2 (measured: actual / estimate
    // 0.3 to 0.6 for N = 100..145, k = 6, p from 1e-7 to 0.1), hence the factor 1/2.
    return std::min(0.5 * units, 8.0 * multinomial_outcome_count(N, k));
}

Status exact_multinomial_start(const MultinomialTestSpec& spec, const ExactMultinomialOptions& options,
                               ExactMultinomialState* st) {
    *st = ExactMultinomialState{};
    if (!(options.max_work > 0)) return Status::failure("The exact-test work limit must be positive.");
    Status s = make_outcome_scores(spec, &st->s);
    if (!s.ok) return s;
    const OutcomeScores& sc = st->s;
    const int k = static_cast<int>(sc.shares.size());
    const int N = sc.n;
    st->estimated_work = estimate_exact_work(sc);
    if (st->estimated_work > options.max_work) {
        char buf[320];
        std::snprintf(buf, sizeof buf,
                      "The exact test would take about %.3g steps (over %.3g outcomes in all), above the limit of "
                      "%.3g: use the Monte Carlo p-value instead.",
                      st->estimated_work, multinomial_outcome_count(N, k), options.max_work);
        Status r = Status::failure(buf);
        *st = ExactMultinomialState{};
        return r;
    }
    st->progress.units_estimate = static_cast<std::uint64_t>(st->estimated_work) + 1;
    // Conditional shares from suffix sums, never 1 - sum.
    std::vector<double> rest(k + 1, 0.0);
    for (int j = k - 1; j >= 0; --j) rest[j] = rest[j + 1] + sc.shares[j];
    st->log_pi_cond.assign(k, 0.0);
    st->log_rest_cond.assign(k, 0.0);
    st->odds.assign(k, 0.0);
    for (int j = 0; j + 1 < k; ++j) {
        st->log_pi_cond[j] = std::log(sc.shares[j]) - std::log(rest[j]);
        st->log_rest_cond[j] = std::log(rest[j + 1]) - std::log(rest[j]);
        st->odds[j] = sc.shares[j] / rest[j + 1];
    }
    st->min_rest = least_completion_scores(sc, &st->argmin);
    // Pruning of inner prefixes allows for rounding in V; leaves are classified exactly.
    double big = std::fabs(sc.threshold);
    for (int j = 0; j < k; ++j) big = std::max(big, std::fabs(sc.score[j][N]));
    st->margin = 1e-10 * (1.0 + big);
    // log P(observed), and a scale halfway to it so neither p nor any term leaves the double range.
    double lo = sc.log_factorial[N];
    for (int j = 0; j < k; ++j)
        lo += -sc.log_factorial[sc.observed[j]] + sc.observed[j] * std::log(sc.shares[j]);
    st->log_observed = lo;
    st->log_scale = std::min(0.0, lo / 2);
    return Status::success();
}

WorkProgress exact_multinomial_step(ExactMultinomialState* st, std::uint64_t budget) {
    WorkProgress& pr = st->progress;
    if (pr.done || pr.cancelled) return pr;
    if (st->cancel_requested) {
        pr.cancelled = true;
        st->stack.clear();
        return pr;
    }
    const int k = static_cast<int>(st->s.shares.size());
    if (st->s.shares.empty()) {
        finish(st);  // not started successfully: nothing to do
        return pr;
    }
    const std::uint64_t stop = pr.units_done + budget;
    if (!st->started) {
        st->started = true;
        if (k == 1) {  // only one category left after dropping zero shares: p = 1
            add_term(st, std::exp(-st->log_scale));
            finish(st);
            return pr;
        }
        st->stack.push_back({0, st->s.n, 0, 0, 0.0, 0.0, 0.0});
        open_frame(st);
    }
    while (!st->stack.empty() && pr.units_done < stop) {
        ExactMultinomialState::Frame& f = st->stack.back();
        if (f.next > f.end) {
            st->stack.pop_back();
            continue;
        }
        const int x = f.next++;
        ExactMultinomialState::Frame c;
        c.level = f.level + 1;
        c.m = f.m - x;
        c.next = c.end = 0;
        c.log_mass = f.log_mass + log_binomial_pmf(*st, f.level, f.m, x);
        c.abs_log = f.abs_log + abs_log_binomial(*st, f.level, f.m, x);
        c.partial = f.partial + st->s.score[f.level][x];
        if (c.log_mass < st->log_observed - kNegligibleLog) {
            // Too light to matter next to p >= P(observed): bound it instead of walking it.
            st->truncated += std::exp(c.log_mass - st->log_scale);
            ++pr.units_done;
            continue;
        }
        st->stack.push_back(c);
        open_frame(st);
    }
    if (st->stack.empty()) finish(st);
    else pr.fraction = in_flight_fraction(pr.units_done, pr.units_estimate);
    return pr;
}

void exact_multinomial_cancel(ExactMultinomialState* st) { st->cancel_requested = true; }

Status exact_multinomial_result(const ExactMultinomialState& st, ExactMultinomialResult* r) {
    *r = ExactMultinomialResult{};
    if (st.progress.cancelled) return Status::failure("The exact computation was cancelled.");
    if (!st.progress.done || st.s.shares.empty()) return Status::failure("The exact computation has not finished.");
    const double scaled = st.sum + st.compensation;
    // The observed table itself is extreme, so the sum is positive in exact arithmetic; if it is
    // not here (every term underflowed against the scale), no honest p-value can be given.
    if (!(scaled > 0) || !std::isfinite(scaled))
        return Status::failure("The exact p-value could not be computed to a stated accuracy for this table; "
                               "use the Monte Carlo p-value instead.");
    const double log_p = std::log(scaled) + st.log_scale;
    double p = std::exp(log_p);
    if (p > 1) p = 1;  // rounding can only overshoot by the stated bound
    r->p.p = p;
    r->p.log10_p = std::min(0.0, log_p / kLn10);
    // Relative rounding: log-terms, exp, tail recurrences (4 roundings a step) and naive tail sums,
    // the compensated total; plus the banked truncation remainders.
    r->relative_error_bound = st.worst_log_error + 2 * kEps + 5.0 * st.longest_tail * kEps + 2 * kEps;
    const double trunc = st.truncated / scaled;  // relative
    r->relative_error_bound += trunc;
    r->error_bound = r->relative_error_bound * p;
    r->p_lower = std::max(0.0, p - r->error_bound);
    r->p_upper = std::min(1.0, p + r->error_bound);
    r->work_units = st.progress.units_done;
    r->nodes = st.nodes;
    r->estimated_work = st.estimated_work;
    r->total_outcomes = multinomial_outcome_count(st.s.n, static_cast<int>(st.s.shares.size()));
    r->observed_score = st.s.observed_score;
    return Status::success();
}

Status exact_multinomial_p_value(const MultinomialTestSpec& spec, const ExactMultinomialOptions& options,
                                 ExactMultinomialResult* result) {
    *result = ExactMultinomialResult{};
    ExactMultinomialState st;
    Status s = exact_multinomial_start(spec, options, &st);
    if (!s.ok) return s;
    while (!exact_multinomial_step(&st, std::uint64_t(1) << 20).done) {
    }
    return exact_multinomial_result(st, result);
}

}  // namespace tallyproof
