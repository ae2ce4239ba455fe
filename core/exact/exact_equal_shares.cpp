// Equal-shares exact X² p-value: a dynamic programme over categories on the state (count so far
// m, sum of squares so far s), masses carried as probabilities of the prefix by the conditional
// binomials Bin(N - m, 1/(k - j)) (Good, Gover & Mitchell 1970, JASA 65:267, for the lattice of
// X² under equal shares). Extreme iff sum x² >= S (integers: no rounding in the comparison).
// p is a sum of positive terms; the bound is the dropped mass plus the rounding of every product.
#include "exact_equal_shares.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>

#include <boost/math/special_functions/gamma.hpp>

#include "binomial_terms.hpp"
#include "math_policy.hpp"

namespace tallyproof {
namespace {

constexpr double kEps = std::numeric_limits<double>::epsilon();

// Least sum of squares of M counts over r categories (as even as possible), and the greatest.
double least_squares_sum(std::int64_t m, std::int64_t r) {
    if (r <= 0) return m == 0 ? 0.0 : std::numeric_limits<double>::infinity();
    const std::int64_t q = m / r, rem = m % r;
    return static_cast<double>(r * q * q + rem * (2 * q + 1));
}

void add_tail(EqualSharesExactState* st, double v) { st->tail.add(v); }

std::int64_t integer_threshold(const OutcomeScores& sc) {
    // X² = (k/N) S - N, so the statistic threshold (observed less the tie tolerance) is S >= this.
    const double k = static_cast<double>(sc.shares.size()), n = sc.n;
    std::int64_t s_obs = 0;
    for (int x : sc.observed) s_obs += static_cast<std::int64_t>(x) * x;
    const double tolerance = kTieRelativeTolerance * std::fabs(sc.observed_score) * n / k;
    return s_obs - static_cast<std::int64_t>(std::floor(tolerance));
}

}  // namespace

bool equal_shares_dp_applies(const OutcomeScores& sc) {
    if (sc.ordering != ExtremeOrdering::statistic || sc.lambda != 1.0 || sc.shares.size() < 2) return false;
    const double first = sc.shares.front();
    for (double p : sc.shares)
        if (std::fabs(p - first) > 1e-12 * first) return false;
    return true;
}

double estimate_equal_shares_work(const OutcomeScores& sc) {
    // States within 8 sd of the bulk in m, each a band of s no wider than S - least S of the rest,
    // times the binomial terms used per state (measured: actual / estimate 0.1 to 0.5, k = 10..100).
    const double n = sc.n, k = static_cast<double>(sc.shares.size());
    const double s_thr = static_cast<double>(integer_threshold(sc));
    // Rows are dense in s up to min(S, m²): refuse (infinite work) past 256 MB for two levels.
    double cells = 0;
    for (int m = 0; m <= sc.n; ++m) cells += std::min(s_thr, static_cast<double>(m) * m) + 1;
    if (2 * 8 * cells > 268435456.0) return std::numeric_limits<double>::infinity();
    double units = 0;
    for (int j = 0; j < static_cast<int>(k); ++j) {
        const double f = j / k, sd_m = std::sqrt(n * f * (1 - f));
        const double m = n * f, rest = n - m, q = 1.0 / (k - j);
        const double band = std::max(1.0, std::min(s_thr, s_thr - least_squares_sum(static_cast<std::int64_t>(m), j) -
                                                            least_squares_sum(static_cast<std::int64_t>(rest), static_cast<std::int64_t>(k) - j)));
        const double xs = 2 * 9 * std::sqrt(rest * q * (1 - q)) + 2;
        units += std::min(n + 1, 16 * sd_m + 1) * xs * std::min(band, s_thr + 1);
    }
    return units;
}

Status equal_shares_exact_start(const OutcomeScores& sc, EqualSharesExactState* st) {
    *st = EqualSharesExactState{};
    if (!equal_shares_dp_applies(sc)) return Status::failure("Internal: the equal-shares programme needs equal shares and X².");
    st->n = sc.n;
    st->k = static_cast<int>(sc.shares.size());
    st->s_threshold = integer_threshold(sc);
    st->observed_score = sc.observed_score;
    st->estimated_work = estimate_equal_shares_work(sc);
    st->progress.units_estimate = static_cast<std::uint64_t>(st->k);
    st->log_factorial.resize(static_cast<std::size_t>(st->n) + 1);
    for (int x = 0; x <= st->n; ++x) st->log_factorial[static_cast<std::size_t>(x)] = boost::math::lgamma(x + 1.0, quiet_policy());
    // Mass cut: far below the asymptotic p (itself a fair guide to the size of p here).
    const double p_asym = chi_square_upper_tail(sc.observed_score, st->k - 1.0).p;
    st->mass_cut = 1e-22 * std::max(std::min(1.0, p_asym), 1e-250);
    st->rows.assign(static_cast<std::size_t>(st->n) + 1, {});
    st->rows[0].assign(1, 1.0);  // nothing placed yet: m = 0, s = 0 with probability 1
    if (st->s_threshold <= 0) {  // every outcome is extreme
        st->rows[0].clear();
        add_tail(st, 1.0);
    }
    return Status::success();
}

WorkProgress equal_shares_exact_step(EqualSharesExactState* st, std::uint64_t budget) {
    WorkProgress& pr = st->progress;
    if (pr.done || pr.cancelled) return pr;
    if (st->cancel_requested) {
        pr.cancelled = true;
        st->rows.clear();
        st->next.clear();
        return pr;
    }
    if (st->k == 0) {
        pr.done = true;
        pr.fraction = 1;
        return pr;
    }
    const int n = st->n, k = st->k;
    const std::int64_t S = st->s_threshold;
    std::uint64_t spent = 0;
    std::vector<double> suffix, pmf;
    while (st->level < k && spent < budget) {
        const int j = st->level;
        const std::int64_t r_after = k - j - 1;
        const double q = 1.0 / (k - j), odds = 1.0 / (k - j - 1.0);  // q / (1 - q)
        st->next.assign(static_cast<std::size_t>(n) + 1, {});
        for (int m = 0; m <= n; ++m) {
            const std::vector<double>& row = st->rows[static_cast<std::size_t>(m)];
            if (row.empty()) continue;
            const int M = n - m;
            const std::size_t len = row.size();
            suffix.assign(len + 1, 0.0);
            for (std::size_t s = len; s-- > 0;) suffix[s] = suffix[s + 1] + row[s];
            const double total = suffix[0];
            if (!(total > 0)) continue;
            if (r_after == 0) {  // the last category takes the rest: x = M
                const std::int64_t from = S - static_cast<std::int64_t>(M) * M;
                if (from <= 0) add_tail(st, total);
                else if (from < static_cast<std::int64_t>(len)) add_tail(st, suffix[static_cast<std::size_t>(from)]);
                continue;
            }
            int lo = 0, hi = 0;
            const double bounded = binomial_terms(M, q, odds, st->log_factorial, &pmf, &lo, &hi);
            st->dropped += total * bounded;
            std::size_t a = 0, b = len;  // the nonzero span of the row
            while (a < b && row[a] == 0) ++a;
            while (b > a && row[b - 1] == 0) --b;
            for (int x = lo; x <= hi; ++x) {
                const double px = pmf[static_cast<std::size_t>(x)];
                const std::int64_t d = static_cast<std::int64_t>(x) * x;
                const int m2 = m + x, M2 = M - x;
                const double cap_at_d = static_cast<double>(S) - least_squares_sum(M2, r_after);
                const std::int64_t cap_at = cap_at_d <= 0 ? 0 : static_cast<std::int64_t>(std::ceil(cap_at_d));
                const std::int64_t dead_below = S - static_cast<std::int64_t>(M2) * M2;
                // Source s >= cap_at - d: every completion extreme.
                const std::int64_t c0 = std::max<std::int64_t>(static_cast<std::int64_t>(a), cap_at - d);
                if (c0 < static_cast<std::int64_t>(b)) add_tail(st, px * suffix[static_cast<std::size_t>(c0)]);
                // Source s in [dead_below - d, cap_at - d): still open.
                const std::int64_t l0 = std::max<std::int64_t>(static_cast<std::int64_t>(a), dead_below - d);
                const std::int64_t l1 = std::min<std::int64_t>(static_cast<std::int64_t>(b), cap_at - d);
                if (l0 >= l1) continue;
                std::vector<double>& dst = st->next[static_cast<std::size_t>(m2)];
                const std::size_t need = static_cast<std::size_t>(l1 + d);
                if (dst.size() < need) dst.resize(need, 0.0);
                double* out = dst.data() + d;
                for (std::int64_t s = l0; s < l1; ++s) out[s] += px * row[static_cast<std::size_t>(s)];
                spent += static_cast<std::uint64_t>(l1 - l0);
            }
        }
        // Drop light states into the bound.
        for (auto& row : st->next) {
            double light = 0;
            bool any = false;
            for (double& v : row) {
                if (v < st->mass_cut) {
                    light += v;
                    v = 0;
                } else {
                    any = true;
                }
            }
            st->dropped += light;
            if (!any) std::vector<double>().swap(row);
        }
        st->rows.swap(st->next);
        st->next.clear();
        ++st->level;
        pr.units_done = static_cast<std::uint64_t>(st->level);
        pr.fraction = in_flight_fraction(pr.units_done, pr.units_estimate);
    }
    if (st->level == k) {
        pr.done = true;
        pr.fraction = 1;
        st->rows.clear();
    }
    return pr;
}

void equal_shares_exact_cancel(EqualSharesExactState* st) { st->cancel_requested = true; }

Status equal_shares_exact_result(const EqualSharesExactState& st, ExactMultinomialResult* r) {
    *r = ExactMultinomialResult{};
    if (st.progress.cancelled) return Status::failure("The exact computation was cancelled.");
    if (!st.progress.done || st.k == 0) return Status::failure("The exact computation has not finished.");
    const double p = std::min(1.0, st.tail.value());
    if (!(p > 0) || !std::isfinite(p))
        return Status::failure("The exact p-value could not be computed to a stated accuracy for this table; "
                               "use the Monte Carlo p-value instead.");
    r->p.p = p;
    r->p.log10_p = std::min(0.0, std::log10(p));
    // Rounding: each term is a product of k binomial terms (log-factorial differences of size up
    // to log N!, exp, up to N ratio steps) and sums of up to N k values.
    const double log_size = st.log_factorial.empty() ? 1.0 : st.log_factorial.back() + 1.0;
    const double rel = st.k * (4 * log_size + 3.0 * st.n + 8) * kEps + (st.n + 2.0 * st.k) * kEps;
    r->error_bound = rel * p + st.dropped;
    r->relative_error_bound = r->error_bound / p;
    r->p_lower = std::max(0.0, p - r->error_bound);
    r->p_upper = std::min(1.0, p + r->error_bound);
    r->work_units = static_cast<std::uint64_t>(st.k);
    r->nodes = 0;
    r->estimated_work = st.estimated_work;
    r->total_outcomes = multinomial_outcome_count(st.n, st.k);
    r->observed_score = st.observed_score;
    return Status::success();
}

}  // namespace tallyproof
