// Exact and Monte Carlo conditional p-values of the 2 x k homogeneity test (multivariate
// hypergeometric tables; Agresti 2013, sec. 3.5; Davison and Hinkley 1997, eq. 4.11).
#include "exact_homogeneity.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <string>
#include <vector>

#include "exact_multinomial.hpp"  // kTieRelativeTolerance
#include "monte_carlo.hpp"        // the one Monte Carlo budget
#include "number_format.hpp"
#include "power_divergence.hpp"
#include "random.hpp"

namespace tallyproof {
namespace {

// The row that is enumerated or drawn: the smaller one (its total m), with column totals c.
struct Margins {
    bool current_is_small = true;
    int m = 0, n = 0;
    std::vector<int> c;
};

Margins margins_of(const HomogeneityTable& t) {
    Margins g;
    g.current_is_small = t.n_current <= t.n_reference;
    g.m = static_cast<int>(std::min(t.n_current, t.n_reference));
    g.n = static_cast<int>(t.n_current + t.n_reference);
    for (std::size_t j = 0; j < t.current.size(); ++j) g.c.push_back(static_cast<int>(t.current[j] + t.reference[j]));
    return g;
}

// Score of column j when the small row holds x of its c_j.
double column_term(const HomogeneityTable& t, const Margins& g, std::size_t j, int x, double lambda) {
    const int y = g.c[j] - x;
    const int cur = g.current_is_small ? x : y, ref = g.current_is_small ? y : x;
    return power_divergence_term(cur, t.expected_current[j], lambda) + power_divergence_term(ref, t.expected_reference[j], lambda);
}

struct Enumeration {
    const HomogeneityTable* t;
    const Margins* g;
    std::vector<std::vector<double>> term, log_weight;  // [j][x]: score and -log x! - log (c_j - x)!
    std::vector<int> rest_capacity;                     // sum over columns >= j of min(c_j, m)
    double threshold = 0, log_max = -HUGE_VAL, sum = 0, tables = 0;
    bool by_probability = false;
    double log_p_threshold = 0;  // by probability: log of the observed table's probability times 1 + 1e-7

    void add(double log_p) {
        if (log_p > log_max) { sum = sum * std::exp(log_max - log_p) + 1; log_max = log_p; }
        else sum += std::exp(log_p - log_max);
    }
    void walk(std::size_t j, int rem, double score, double log_w) {
        const std::size_t k = g->c.size();
        if (j + 1 == k) {
            ++tables;
            const double log_p = log_w + log_weight[j][rem];
            if (by_probability ? log_p <= log_p_threshold : score + term[j][rem] >= threshold) add(log_p);
            return;
        }
        const int lo = std::max(0, rem - rest_capacity[j + 1]), hi = std::min(g->c[j], rem);
        for (int x = lo; x <= hi; ++x) walk(j + 1, rem - x, score + term[j][x], log_w + log_weight[j][x]);
    }
};

double log_factorial(int x) { return std::lgamma(x + 1.0); }

}  // namespace

double homogeneity_table_count(const HomogeneityTable& t) {
    const Margins g = margins_of(t);
    if (static_cast<double>(g.m) * static_cast<double>(g.c.size()) > 5e7) return NAN;
    std::vector<double> ways(static_cast<std::size_t>(g.m) + 1, 0.0), next(ways.size());
    ways[0] = 1;
    for (int c : g.c) {
        double window = 0;  // sum of ways[s - c .. s]
        for (int s = 0; s <= g.m; ++s) {
            window += ways[static_cast<std::size_t>(s)];
            if (s - c - 1 >= 0) window -= ways[static_cast<std::size_t>(s - c - 1)];
            next[static_cast<std::size_t>(s)] = window;
        }
        std::swap(ways, next);
    }
    return ways[static_cast<std::size_t>(g.m)];
}

Status homogeneity_exact_p(const HomogeneityTable& t, double lambda, double max_tables, HomogeneityExactResult* out,
                           bool by_probability) {
    *out = HomogeneityExactResult{};
    const double count = homogeneity_table_count(t);
    if (!(count <= max_tables))
        return Status::failure("The exact p-value would enumerate " +
                               (std::isnan(count) ? std::string("too many") : "about " + format_significant(count, 2)) +
                               " tables with these margins (the limit is " + format_significant(max_tables, 2) +
                               "); use Monte Carlo instead.");
    const Margins g = margins_of(t);
    Enumeration e;
    e.t = &t;
    e.g = &g;
    const std::size_t k = g.c.size();
    e.term.resize(k);
    e.log_weight.resize(k);
    e.rest_capacity.assign(k + 1, 0);
    std::vector<int> observed(k);
    double observed_score = 0, log_constant = log_factorial(g.m) + log_factorial(g.n - g.m) - log_factorial(g.n);
    for (std::size_t j = k; j-- > 0;) e.rest_capacity[j] = e.rest_capacity[j + 1] + std::min(g.c[j], g.m);
    for (std::size_t j = 0; j < k; ++j) {
        const int hi = std::min(g.c[j], g.m);
        log_constant += log_factorial(g.c[j]);
        for (int x = 0; x <= hi; ++x) {
            e.term[j].push_back(column_term(t, g, j, x, lambda));
            e.log_weight[j].push_back(-log_factorial(x) - log_factorial(g.c[j] - x));
        }
        observed[j] = static_cast<int>(g.current_is_small ? t.current[j] : t.reference[j]);
        observed_score += e.term[j][static_cast<std::size_t>(observed[j])];
    }
    e.threshold = observed_score - kTieRelativeTolerance * std::fabs(observed_score);
    e.by_probability = by_probability;
    double observed_log_p = log_constant;
    for (std::size_t j = 0; j < k; ++j) observed_log_p += e.log_weight[j][static_cast<std::size_t>(observed[j])];
    e.log_p_threshold = observed_log_p + std::log1p(1e-7);
    e.walk(0, g.m, 0.0, log_constant);
    const double ln_p = std::min(0.0, e.log_max + std::log(e.sum));
    out->p = TailProbability{std::exp(ln_p), ln_p / std::log(10.0)};
    out->tables = e.tables;
    return Status::success();
}

Status homogeneity_monte_carlo_p(const HomogeneityTable& t, double lambda, std::uint64_t replicates, std::uint64_t seed,
                                 double max_work, MonteCarloResult* out, bool by_probability) {
    *out = MonteCarloResult{};
    if (replicates < 1) return Status::failure("Monte Carlo needs at least one replicate.");
    const Margins g = margins_of(t);
    // One budget for every Monte Carlo p-value (monte_carlo.hpp): each table places the smaller sample's m observations.
    if (Status s = monte_carlo_within_budget(static_cast<double>(replicates), g.m,
                                             "tables placing " + format_grouped(static_cast<std::uint64_t>(g.m)) + " observations of the smaller sample", max_work);
        !s.ok)
        return s;
    if (g.n > 50000000)
        return Status::failure("Monte Carlo would hold all " + format_count(g.n) + " observations of both samples, more than 50,000,000; "
                               "samples this large are where the asymptotic p-value holds (see its validity).");
    const std::size_t k = g.c.size();
    // Score per column: the statistic's term, or by probability minus log x! (c_j - x)!, so that a
    // higher score is always the more extreme table (the constant of the probability cancels).
    std::vector<std::vector<double>> term(k);
    double observed_score = 0;
    for (std::size_t j = 0; j < k; ++j) {
        const int hi = std::min(g.c[j], g.m);
        for (int x = 0; x <= hi; ++x)
            term[j].push_back(by_probability ? log_factorial(x) + log_factorial(g.c[j] - x) : column_term(t, g, j, x, lambda));
        observed_score += term[j][static_cast<std::size_t>(g.current_is_small ? t.current[j] : t.reference[j])];
    }
    const double threshold = by_probability ? observed_score - 1e-7
                                            : observed_score - kTieRelativeTolerance * std::fabs(observed_score);
    std::vector<std::uint32_t> pool;  // every observation, by its column
    pool.reserve(static_cast<std::size_t>(g.n));
    for (std::size_t j = 0; j < k; ++j) pool.insert(pool.end(), static_cast<std::size_t>(g.c[j]), static_cast<std::uint32_t>(j));
    Xoshiro256 rng = seed_xoshiro256(seed);
    std::vector<int> x(k);
    std::uint64_t extreme = 0;
    const std::uint32_t n = static_cast<std::uint32_t>(g.n);
    for (std::uint64_t b = 0; b < replicates; ++b) {
        std::fill(x.begin(), x.end(), 0);
        // The first m places of a uniformly shuffled pool are a uniform m-subset; the pool's
        // order left by the previous replicate does not matter.
        for (std::uint32_t i = 0; i < static_cast<std::uint32_t>(g.m); ++i) {
            const std::uint32_t r = i + next_below(&rng, n - i);
            std::swap(pool[i], pool[r]);
            ++x[pool[i]];
        }
        double score = 0;
        for (std::size_t j = 0; j < k; ++j) score += term[j][static_cast<std::size_t>(x[j])];
        if (score >= threshold) ++extreme;
    }
    out->replicates = replicates;
    out->extreme = extreme;
    out->seed = seed;
    out->p = (static_cast<double>(extreme) + 1) / (static_cast<double>(replicates) + 1);
    out->standard_error = std::sqrt(out->p * (1 - out->p) / static_cast<double>(replicates));
    return Status::success();
}

}  // namespace tallyproof
