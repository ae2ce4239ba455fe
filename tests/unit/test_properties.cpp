// Property tests of analyse(): several hundred seeded random analyses across the stated-mix
// kinds, the Poisson fit and two digit laws, with various power-divergence lambdas and merge rules.
// Each property is a mathematical identity of the goodness-of-fit test (its source is named
// beside each check), not a value computed by this code; the generator is a fixed-seed SplitMix64
// (Steele, Lea and Flood 2014), so every run tests the same analyses.
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <string>
#include <vector>

#include <doctest/doctest.h>
#include "goodness_of_fit.hpp"

namespace {
using namespace tallyproof;

struct SplitMix64 {
    std::uint64_t s;
    std::uint64_t next() {
        std::uint64_t z = (s += 0x9E3779B97F4A7C15ull);
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ull;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBull;
        return z ^ (z >> 31);
    }
    double uniform() { return static_cast<double>(next() >> 11) * 0x1.0p-53; }  // [0, 1)
    std::size_t below(std::size_t n) { return static_cast<std::size_t>(next() % n); }
};

const double kLambdas[] = {1.0, 0.0, 2.0 / 3.0, -0.5, 0.5, 2.0, -2.0, -1.0};
const MergeRule kRules[] = {MergeRule::none, MergeRule::all_at_least_5, MergeRule::cochran, MergeRule::custom_minimum};
const ModelKind kKinds[] = {ModelKind::equal, ModelKind::shares, ModelKind::ratio, ModelKind::counts,
                            ModelKind::poisson, ModelKind::benford_first, ModelKind::last_digit};

bool is_probability(double p) { return p >= 0 && p <= 1; }  // false for NaN

bool close_rel(double a, double b, double rel) {
    return std::fabs(a - b) <= rel * std::max({std::fabs(a), std::fabs(b), 1e-300});
}

// A random analysis of the given kind; counts are whole numbers, possibly with zeros.
Analysis random_analysis(SplitMix64& g, ModelKind kind) {
    Analysis a;
    a.model.kind = kind;
    std::size_t k = 2 + g.below(11);
    if (kind == ModelKind::benford_first) k = 9;
    if (kind == ModelKind::last_digit) k = 10;
    const double scale = std::pow(10.0, 1 + 3 * g.uniform());  // typical counts 10 .. 10^4
    for (std::size_t i = 0; i < k; ++i) {
        if (kind == ModelKind::benford_first) a.categories.push_back(std::to_string(i + 1));
        else if (kind == ModelKind::last_digit || kind == ModelKind::poisson) a.categories.push_back(std::to_string(i));
        else a.categories.push_back("cat " + std::to_string(i));
        const double o = g.below(8) == 0 ? 0 : std::floor(scale * g.uniform());
        a.observed.push_back(o);
    }
    if (kind == ModelKind::poisson) {
        // Counts shaped like a Poisson sample with mean about 1.5 (zero counts allowed in the tail).
        const double m = 0.5 + 2 * g.uniform();
        double pk = std::exp(-m);
        for (std::size_t i = 0; i < k; ++i) {
            a.observed[i] = std::floor(scale * pk * (0.7 + 0.6 * g.uniform()));
            pk *= m / static_cast<double>(i + 1);
        }
        a.observed[1] += 1;  // the mean estimate is then positive
    }
    if (kind == ModelKind::shares || kind == ModelKind::ratio) {
        for (std::size_t i = 0; i < k; ++i) a.model.values.push_back(0.05 + g.uniform());
        if (kind == ModelKind::shares) {
            double t = 0;
            for (double v : a.model.values) t += v;
            for (double& v : a.model.values) v /= t;
        }
    }
    if (kind == ModelKind::counts) {
        double n = 0;
        for (double o : a.observed) n += o;
        if (n == 0) a.observed[0] = n = 1;
        std::vector<double> w;
        double t = 0;
        for (std::size_t i = 0; i < k; ++i) { w.push_back(0.05 + g.uniform()); t += w.back(); }
        for (double x : w) a.model.values.push_back(x * n / t);
    }
    a.statistic.lambda = kLambdas[g.below(8)];
    a.merge.rule = kRules[g.below(4)];
    a.merge.minimum = 1 + 9 * g.uniform();
    a.ordered = g.below(2) == 0;
    a.alpha = 0.001 + 0.2 * g.uniform();
    return a;
}

// The invariants every accepted analysis must satisfy; returns false (after a failed CHECK) if not.
void check_invariants(const Analysis& a, const Result& r) {
    const std::size_t k = a.observed.size();
    REQUIRE(r.status.ok);
    // Totals: merging sums whole counts exactly and expected counts to N (merge_categories.hpp).
    double n = 0;
    for (double o : a.observed) n += o;
    CHECK(r.n == n);  // closed form: N is the sum of the counts
    const std::size_t t = r.tested_observed.size();
    REQUIRE(r.tested_expected.size() == t);
    REQUIRE(r.contributions.size() == t);
    REQUIRE(r.merge_map.size() == t);
    double to = 0, te = 0, cs = 0;
    std::vector<int> seen(k, 0);
    for (std::size_t j = 0; j < t; ++j) {
        double group = 0;
        for (std::size_t i : r.merge_map[j]) {
            REQUIRE(i < k);
            ++seen[i];
            group += a.observed[i];
        }
        CHECK(group == r.tested_observed[j]);  // common practice: a merged cell holds the sum of its counts
        to += r.tested_observed[j];
        te += r.tested_expected[j];
        cs += r.contributions[j];
        CHECK(r.contributions[j] >= 0);  // Cressie and Read (1984): each centred term is non-negative
        CHECK(!std::isnan(r.tested_expected[j]));
    }
    for (std::size_t i = 0; i < k; ++i) {
        const int want = r.expected_counts[i] > 0 ? 1 : 0;  // zero-share unobserved categories are dropped
        CHECK(seen[i] == want);  // the merge map covers every kept index exactly once
    }
    CHECK(to == n);                      // closed form: merging preserves the observed total exactly
    CHECK(close_rel(te, n, 1e-12));      // expected counts total N (compensated sums, merge_categories.hpp)
    CHECK(close_rel(cs, r.statistic, 1e-9));  // closed form: the statistic is the sum of its terms
    // Probabilities and numbers promised finite.
    for (const TailProbability* p : {&r.upper, &r.lower, &r.p}) {
        CHECK(is_probability(p->p));  // definition of a probability
        CHECK(!std::isnan(p->log10_p));
        CHECK(p->log10_p <= 0);
    }
    CHECK(close_rel(r.upper.p + r.lower.p, 1.0, 1e-9));  // closed form: the two tails of a continuous law sum to 1
    for (double s : r.expected_shares) CHECK(is_probability(s));
    CHECK(std::isfinite(r.statistic));
    CHECK(std::isfinite(r.df));
    CHECK(std::isfinite(r.critical_value));
    CHECK(std::isfinite(r.effect.w));
    CHECK(r.reject == (r.p.p <= r.alpha));  // definition of the decision
    for (const auto& d : r.diagnostics.categories) {
        CHECK(is_probability(d.binomial.p));
        CHECK(is_probability(d.adjusted.p));
        CHECK(d.adjusted.p >= d.binomial.p);  // Holm (1979): adjusted p-values are never smaller
        CHECK(!std::isnan(d.pearson_residual));
        CHECK(!std::isnan(d.adjusted_residual));
    }
}

// Log10 of p compared on the log scale, where a far-tail p keeps its accuracy.
bool same_p(const TailProbability& x, const TailProbability& y) {
    return std::fabs(x.log10_p - y.log10_p) <= 1e-9 * std::max(1.0, std::fabs(y.log10_p));
}

}  // namespace

TEST_CASE("properties: random analyses meet every invariant") {
    SplitMix64 g{20261201};
    int accepted = 0, refused = 0;
    for (int trial = 0; trial < 700; ++trial) {
        const Analysis a = random_analysis(g, kKinds[trial % 7]);
        const Result r = analyse(a);
        if (!r.status.ok) {
            // The refusals these analyses can meet (null_model, merge_categories, goodness_of_fit):
            // lambda <= -1 with an empty category, a merge that leaves fewer than two cells, a
            // Poisson fit on too few cells, no df left, or no observations at all.
            const std::string& m = r.status.message;
            CAPTURE(m);
            CHECK((m.find("has an observed count of 0: with λ = −") != std::string::npos ||
                   m.find("Merging cannot satisfy") != std::string::npos ||
                   m.find("estimates 1 parameter(s)") != std::string::npos ||
                   m.find("No degrees of freedom are left") != std::string::npos ||
                   m.find("All counts are zero") != std::string::npos));
            ++refused;
            continue;
        }
        ++accepted;
        CAPTURE(trial);
        check_invariants(a, r);
    }
    CHECK(accepted >= 500);  // common practice: a property test must mostly test accepted inputs
    MESSAGE("accepted " << accepted << ", refused " << refused);
}

TEST_CASE("properties: reordering categories leaves the statistic and p unchanged") {
    // Invariance of the power-divergence statistic under permutation of cells (a sum over cells,
    // Cressie and Read 1984); stated-mix kinds only, where the order carries no meaning.
    SplitMix64 g{7};
    int compared = 0;
    for (int trial = 0; trial < 300; ++trial) {
        Analysis a = random_analysis(g, kKinds[trial % 4]);
        a.merge.rule = MergeRule::none;
        const Result r = analyse(a);
        if (!r.status.ok) continue;
        Analysis b = a;
        std::vector<std::size_t> perm(a.observed.size());
        for (std::size_t i = 0; i < perm.size(); ++i) perm[i] = i;
        for (std::size_t i = perm.size() - 1; i > 0; --i) std::swap(perm[i], perm[g.below(i + 1)]);  // Fisher-Yates
        for (std::size_t i = 0; i < perm.size(); ++i) {
            b.categories[i] = a.categories[perm[i]];
            b.observed[i] = a.observed[perm[i]];
            if (!a.model.values.empty()) b.model.values[i] = a.model.values[perm[i]];
        }
        const Result s = analyse(b);
        REQUIRE(s.status.ok);
        CAPTURE(trial);
        CHECK(close_rel(s.statistic, r.statistic, 1e-11));
        CHECK(s.df == r.df);
        CHECK(same_p(s.p, r.p));
        ++compared;
    }
    CHECK(compared >= 250);
}

TEST_CASE("properties: scaling the stated mix is rescaled away") {
    // Shares and ratios are normalised to sum 1, so multiplying every term by c > 0 changes
    // nothing (definition of the ratio model, docs/analysis-document.md).
    SplitMix64 g{11};
    for (int trial = 0; trial < 200; ++trial) {
        Analysis a = random_analysis(g, ModelKind::ratio);
        a.merge.rule = MergeRule::none;
        a.statistic.lambda = 1;
        const Result r = analyse(a);
        if (!r.status.ok) continue;
        Analysis b = a;
        const double c = std::pow(10.0, -3 + 6 * g.uniform());
        for (double& v : b.model.values) v *= c;
        const Result s = analyse(b);
        REQUIRE(s.status.ok);
        CAPTURE(c);
        CHECK(close_rel(s.statistic, r.statistic, 1e-11));
        CHECK(same_p(s.p, r.p));
    }
    // Expected counts (kind "counts") off by rounding (a total within 0.5 per category of N,
    // expected_counts.cpp) are rescaled to N: the same test as the exact counts. Further off is refused.
    for (int trial = 0; trial < 200; ++trial) {
        Analysis a = random_analysis(g, ModelKind::counts);
        a.merge.rule = MergeRule::none;
        const Result r = analyse(a);
        if (!r.status.ok) continue;
        double n = 0;
        for (double o : a.observed) n += o;
        const double k = static_cast<double>(a.observed.size());
        Analysis b = a;
        const double c = 1 + (g.uniform() - 0.5) * 0.9 * k / n;  // total moves by less than 0.45 k
        for (double& v : b.model.values) v *= c;
        const Result s = analyse(b);
        REQUIRE(s.status.ok);
        CAPTURE(c);
        CHECK(close_rel(s.statistic, r.statistic, 1e-11));
        CHECK(same_p(s.p, r.p));
        Analysis far = a;
        for (double& v : far.model.values) v *= 1 + 0.6 * k / n + 0.5;  // more than 0.5 k away
        const Result refused = analyse(far);
        CHECK_FALSE(refused.status.ok);
        CHECK(refused.status.message.find("they must agree") != std::string::npos);
    }
}

TEST_CASE("properties: the p-value falls as one count moves away from its expected count") {
    // Moving a unit into a cell already at or above its expectation, out of one at or below it,
    // makes both deviations larger; each power-divergence term is convex in O with its minimum at
    // E (Cressie and Read 1984), so the statistic rises and the upper tail, monotone in x, falls.
    SplitMix64 g{13};
    for (int trial = 0; trial < 100; ++trial) {
        Analysis a;
        const std::size_t k = 2 + g.below(8);
        for (std::size_t i = 0; i < k; ++i) {
            a.categories.push_back("c" + std::to_string(i));
            a.observed.push_back(20 + static_cast<double>(g.below(10)));
        }
        a.statistic.lambda = kLambdas[g.below(7)];  // not -1 ... with cells emptied, lambda <= -1 is refused
        if (a.statistic.lambda <= -1) a.statistic.lambda = -0.5;
        const std::size_t up = g.below(k);
        std::size_t down = g.below(k);
        if (down == up) down = (up + 1) % k;
        Result prev = analyse(a);
        REQUIRE(prev.status.ok);
        // Start from the point where `up` is at or above and `down` at or below the mean count.
        double mean = 0;
        for (double o : a.observed) mean += o;
        mean /= static_cast<double>(k);
        while (a.observed[up] < mean && a.observed[down] > 0) { a.observed[up] += 1; a.observed[down] -= 1; }
        while (a.observed[down] > mean && a.observed[up] > 0) { a.observed[down] -= 1; a.observed[up] += 1; }
        prev = analyse(a);
        REQUIRE(prev.status.ok);
        CAPTURE(trial);
        CAPTURE(a.statistic.lambda);
        while (a.observed[down] > 0) {
            a.observed[up] += 1;
            a.observed[down] -= 1;
            const Result next = analyse(a);
            REQUIRE(next.status.ok);
            CHECK(next.statistic > prev.statistic);
            CHECK(next.p.log10_p <= prev.p.log10_p);  // weakly: the tail may sit at p = 1 or underflow together
            CHECK(next.p.p <= prev.p.p);
            prev = next;
        }
    }
}
