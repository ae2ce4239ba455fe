// The decision-aimed grid bracket (issue 32): never refused for time, every returned p inside its
// certified bracket, the decision called exact only when the bracket excludes alpha and then the
// one a brute-force enumeration gives, tail p-values to a relative bracket of 1e-6 where the
// chosen method reaches it, and the words the report gives. References: a brute-force odometer
// over every outcome (brute_force_multinomial.hpp, shared with test_exact_dp.cpp), and Markov's inequality
// P(X² >= t) <= E[X²] / t with E[X²] = k - 1 exactly under the multinomial (Cramér 1946, 30.1),
// and where enumeration is infeasible (k = 10..100, N to 5000) NumPy Monte Carlo with 1e7 replicates
// a table (tests/reference/exact_monte_carlo.csv, generate_exact_monte_carlo.py).
#include <doctest/doctest.h>

#include <cmath>
#include <string>
#include <vector>

#include "brute_force_multinomial.hpp"
#include "reference_csv.hpp"
#include "exact_bracket_text.hpp"
#include "exact_choice.hpp"
#include "exact_grid_bracket.hpp"
#include "exact_multinomial.hpp"
#include "pvalue_job.hpp"
#include "report.hpp"

using namespace tallyproof;

namespace {

using Case = tallyproof_test::EnumeratedTable;
using tallyproof_test::brute_force_p;

MultinomialTestSpec spec_of(const Case& c, ExtremeOrdering ordering) {
    MultinomialTestSpec s;
    for (int v : c.observed) s.observed.push_back(v);
    s.null_shares = c.shares;
    s.ordering = ordering;
    return s;
}

ExactMultinomialResult run_grid(const MultinomialTestSpec& spec, double max_work, double alpha, double* work = nullptr) {
    OutcomeScores sc;
    REQUIRE(make_outcome_scores(spec, &sc).ok);
    GridBracketOptions o;
    o.max_work = max_work;
    o.alpha = alpha;
    GridBracketState st;
    REQUIRE(grid_bracket_start(sc, o, &st).ok);
    while (!grid_bracket_step(&st, 50000).done) {
    }
    if (work) *work = st.work;
    ExactMultinomialResult r;
    REQUIRE(grid_bracket_result(st, &r).ok);
    return r;
}

// Irrational shares (no lattice: the grid brackets), small enough to enumerate.
const std::vector<Case> kCases = {
    {{1, 4, 2, 0, 3}, {std::sqrt(2.0), 1, std::sqrt(3.0), 0.5, std::acos(-1.0) / 2}},
    {{2, 5, 1, 3}, {std::log10(2.0), std::log10(1.5), std::log10(4.0 / 3), std::log10(1.25)}},
    {{6, 0, 0, 1, 5}, {std::log10(2.0), std::log10(1.5), std::log10(4.0 / 3), std::log10(1.25), std::log10(1.2)}},
    {{0, 9, 1, 2, 0, 3}, {1, std::sqrt(2.0), std::sqrt(3.0), 2, std::sqrt(5.0), std::sqrt(6.0)}},
};

// First-two-digit law (k = 90) shares and a table of N = 300 near its expected counts.
MultinomialTestSpec benford_two(int n, int shift) {
    MultinomialTestSpec spec;
    double total = 0;
    for (int d = 10; d <= 99; ++d) {
        spec.null_shares.push_back(std::log10(1.0 + 1.0 / d));
        total += spec.null_shares.back();
    }
    const int pattern[5] = {1, -1, 2, 0, -2};
    int placed = 0;
    for (std::size_t j = 0; j < spec.null_shares.size(); ++j) {
        const int x = std::max(0, static_cast<int>(std::floor(n * spec.null_shares[j] / total + 0.5)) + shift * pattern[j % 5]);
        spec.observed.push_back(x);
        placed += x;
    }
    spec.observed.back() = std::max(0.0, spec.observed.back() + (n - placed));
    return spec;
}

double pearson_of(const MultinomialTestSpec& s) {
    double n = 0, total = 0, t = 0;
    for (double v : s.observed) n += v;
    for (double v : s.null_shares) total += v;
    for (std::size_t j = 0; j < s.observed.size(); ++j) {
        const double e = n * s.null_shares[j] / total;
        t += (s.observed[j] - e) * (s.observed[j] - e) / e;
    }
    return t;
}

}  // namespace

TEST_CASE("at any budget the grid returns a bracket holding the brute-force p and its own point") {
    for (const Case& c : kCases)
        for (ExtremeOrdering ord : {ExtremeOrdering::statistic, ExtremeOrdering::probability})
            for (double budget : {1.0, 1e4, 1e6, 5e7}) {
                CAPTURE(c.observed.size());
                CAPTURE(static_cast<int>(ord));
                CAPTURE(budget);
                const double brute = brute_force_p(c, ord);
                const ExactMultinomialResult r = run_grid(spec_of(c, ord), budget, -1);
                CAPTURE(brute);
                CAPTURE(r.p_lower);
                CAPTURE(r.p_upper);
                CHECK(r.p_lower <= brute * (1 + 1e-12));  // 1e-12: the oracle's own rounding
                CHECK(brute <= r.p_upper * (1 + 1e-12));
                CHECK(r.p_lower <= r.p.p);
                CHECK(r.p.p <= r.p_upper);
            }
}

TEST_CASE("a decision is reported exact only when the bracket excludes alpha, and it is brute force's") {
    for (const Case& c : kCases)
        for (ExtremeOrdering ord : {ExtremeOrdering::statistic, ExtremeOrdering::probability}) {
            const double brute = brute_force_p(c, ord);
            // alpha = brute: a bracket above it would contradict brute force (p <= alpha rejects).
            for (double alpha : {0.01, 0.05, 0.2, 0.5, brute, brute * (1 + 1e-3), brute * (1 - 1e-3)}) {
                if (!(alpha > 0 && alpha < 1)) continue;
                CAPTURE(c.observed.size());
                CAPTURE(static_cast<int>(ord));
                CAPTURE(alpha);
                CAPTURE(brute);
                const ExactMultinomialResult r = run_grid(spec_of(c, ord), 5e7, alpha);
                CAPTURE(r.p_lower);
                CAPTURE(r.p_upper);
                const bool decides = bracket_decides(r.p_lower, r.p_upper, alpha);
                CHECK(decides == (r.p_upper <= alpha || r.p_lower > alpha));
                if (decides) CHECK((r.p_upper <= alpha) == (brute <= alpha));
            }
        }
}

TEST_CASE("refinement stops as soon as alpha is outside the bracket") {
    // Far from alpha = 0.05 the first round's bracket already decides: no further round is run.
    const Case c = kCases[0];
    const double brute = brute_force_p(c, ExtremeOrdering::statistic);
    REQUIRE(brute > 0.2);  // the brute-force p is far above 0.05
    OutcomeScores sc;
    REQUIRE(make_outcome_scores(spec_of(c, ExtremeOrdering::statistic), &sc).ok);
    GridBracketOptions o;
    o.alpha = 0.05;
    GridBracketState st;
    REQUIRE(grid_bracket_start(sc, o, &st).ok);
    while (!grid_bracket_step(&st, 1u << 30).done) {
    }
    CHECK(st.round == 1);
    CHECK(bracket_decides(st.p_low, st.p_high, 0.05));
    double full_work = 0;
    run_grid(spec_of(c, ExtremeOrdering::statistic), 2e9, -1, &full_work);
    CHECK(st.work < full_work);
    CHECK(grid_bracket_settled(o, st.p_low, st.p_high));
    o.alpha = -1;  // without a decision to aim at, the same bracket is refined further
    CHECK_FALSE(grid_bracket_settled(o, st.p_low, st.p_high));
}

TEST_CASE("no refusal for time at k = 90, N = 300 (first-two-digit law) nor at k = 100, N = 5000") {
    for (int shift : {1, 3}) {
        const MultinomialTestSpec spec = benford_two(300, shift);
        ExactChoiceOptions o;
        o.alpha = 0.05;
        ExactMultinomialResult r;
        ExactMethod m{};
        REQUIRE(exact_p_value(spec, o, &r, &m).ok);
        CHECK(m == ExactMethod::grid_bracket);
        CHECK(r.p_lower <= r.p.p);
        CHECK(r.p.p <= r.p_upper);
        CHECK(r.work_units <= 1.25 * o.max_seconds * 1e9);  // the 1 s budget's units and one round's margin
        // Markov: P(X² >= t) <= (k - 1) / t, so the certified lower bound cannot exceed it.
        CHECK(r.p_lower <= 89.0 / pearson_of(spec));
    }
    MultinomialTestSpec big;  // shares 1..100, N = 5000: expected counts rounded, then moved by 6 a cell
    int placed = 0;
    for (int j = 1; j <= 100; ++j) {
        big.null_shares.push_back(j);
        const int x = std::max(0, static_cast<int>(std::floor(5000.0 * j / 5050 + 0.5)) + 6 * (j % 2 ? 1 : -1));
        big.observed.push_back(x);
        placed += x;
    }
    big.observed.back() += 5000 - placed;
    REQUIRE(big.observed.back() >= 0);
    ExactMultinomialResult r;
    ExactChoiceOptions o;
    o.alpha = 0.05;
    REQUIRE(exact_p_value(big, o, &r).ok);
    CHECK(r.p_lower <= r.p.p);
    CHECK(r.p.p <= r.p_upper);
    CHECK(r.p_lower <= 99.0 / pearson_of(big));  // Markov, as above
}

TEST_CASE("tail p-values at k <= 30 come with a relative bracket of at most 1e-6") {
    // Brute-force references (k = 5, N = 20 and k = 4, N = 30, irrational shares), and larger tables
    // through whichever exact method is chosen (walk, equal-shares programme, lattice).
    const std::vector<Case> tails = {
        {{16, 0, 0, 0, 4}, {std::log10(2.0), std::log10(1.5), std::log10(4.0 / 3), std::log10(1.25), std::log10(1.2)}},
        {{0, 1, 2, 27}, {std::sqrt(2.0), 1, std::sqrt(3.0), 0.5}},
    };
    for (const Case& c : tails) {
        const double brute = brute_force_p(c, ExtremeOrdering::statistic);
        CAPTURE(brute);
        REQUIRE(brute <= 1e-3);
        ExactChoiceOptions o;
        o.alpha = 0.05;
        ExactMultinomialResult r;
        REQUIRE(exact_p_value(spec_of(c, ExtremeOrdering::statistic), o, &r).ok);
        CHECK(r.p_upper - r.p_lower <= 1e-6 * r.p_lower);
        CHECK(r.p_lower <= brute * (1 + 1e-10));
        CHECK(brute <= r.p_upper * (1 + 1e-10));
    }
    MultinomialTestSpec equal20;  // k = 20, N = 100, equal shares: the programme
    equal20.observed = {15, 1, 0, 9, 4, 2, 12, 3, 5, 0, 8, 1, 6, 2, 9, 1, 3, 7, 0, 12};
    equal20.null_shares.assign(20, 1.0);
    MultinomialTestSpec ratio30;  // k = 30, N = 30, shares 1:2:1:2...: X² on its lattice
    for (int j = 0; j < 30; ++j) {
        ratio30.null_shares.push_back(j % 2 ? 2 : 1);
        ratio30.observed.push_back(j < 5 ? 6 : 0);
    }
    for (const MultinomialTestSpec& s : {equal20, ratio30}) {
        ExactChoiceOptions o;
        o.alpha = 0.05;
        ExactMultinomialResult r;
        ExactMethod m{};
        REQUIRE(exact_p_value(s, o, &r, &m).ok);
        CAPTURE(std::string(exact_method_name(m)));
        CAPTURE(r.p.p);
        CHECK(r.p_upper <= 1e-3);
        CHECK(r.p_upper - r.p_lower <= 1e-6 * r.p_lower);
        CHECK(r.p_lower <= (s.observed.size() - 1.0) / pearson_of(s));  // Markov, as above
    }
}

TEST_CASE("bracket bounds are printed rounded outwards, and the sentence says what decided") {
    // Rounding down the lower and up the upper bound keeps the printed bracket certified.
    CHECK(bracket_bound_text(0.012345, 2, false) == "0.012");
    CHECK(bracket_bound_text(0.012345, 2, true) == "0.013");
    CHECK(bracket_bound_text(0.0125, 3, true) == "0.0125");  // already on the grid: not moved a step
    CHECK(bracket_bound_text(0, 3, false) == "0");
    CHECK(bracket_bound_text(1, 3, true) == "1");
    CHECK(bracket_digits(0.0123, 0.0145) == 2);
    CHECK(bracket_digits(1.0e-4, 1.0e-4 * (1 + 1e-6)) == 7);
    Result r;
    r.alpha = 0.05;
    r.exact.computed = r.exact.bracketed = true;
    r.exact.p_lower = 0.0123;
    r.exact.p_upper = 0.0145;
    r.exact.decides_at_alpha = true;
    CHECK(exact_bracket_sentence(r).find("exact decision at α = 0.05") != std::string::npos);
    CHECK(exact_bracket_sentence(r).find("[0.012, 0.015]") != std::string::npos);
    r.exact.p_lower = 0.03;
    r.exact.p_upper = 0.08;
    r.exact.decides_at_alpha = false;
    const std::string s = exact_bracket_sentence(r);
    CAPTURE(s);
    CHECK(s.find("budget ended") != std::string::npos);
    CHECK(s.find("[0.030, 0.080]") != std::string::npos);  // two figures: the width is about the midpoint
    CHECK(s.find("Monte Carlo") != std::string::npos);
    r.exact.bracketed = false;
    CHECK(exact_bracket_sentence(r).empty());
}

TEST_CASE("the analysis records the bracket and its decision, and the report says it") {
    const MultinomialTestSpec spec = benford_two(300, 3);
    Analysis a;
    for (int d = 10; d <= 99; ++d) a.categories.push_back(std::to_string(d));
    a.observed = spec.observed;
    a.model.kind = ModelKind::shares;
    a.model.values = spec.null_shares;
    a.pvalue.method = PValueMethod::exact;
    for (double alpha : {0.05, 1e-12}) {
        a.alpha = alpha;
        const Result r = analyse_completely(a);
        REQUIRE(r.status.ok);
        REQUIRE(r.exact.computed);
        CHECK(r.exact.method == "grid-bracket");
        CHECK(r.exact.p_lower <= r.p.p);
        CHECK(r.p.p <= r.exact.p_upper);
        CHECK(r.exact.decides_at_alpha == bracket_decides(r.exact.p_lower, r.exact.p_upper, alpha));
        if (r.exact.decides_at_alpha) CHECK(r.reject == (r.exact.p_upper <= alpha));
        const std::string text = report_text(a, r);
        if (r.exact.bracketed) {
            CHECK(text.find(exact_bracket_sentence(r)) != std::string::npos);
            CHECK(text.find(r.exact.decides_at_alpha ? "exact decision at α" : "budget ended") != std::string::npos);
            // A bracket wider than a factor of ten is headed by its upper end, never its midpoint.
            if (r.exact.p_upper > 10 * r.exact.p_lower) {
                CHECK(exact_bracket_is_wide(r));
                CHECK(text.find(", p ≤ " + bracket_bound_text(r.exact.p_upper, 2, true) + " (exact, the upper end of its certified bracket)") !=
                      std::string::npos);
            } else {
                CHECK(text.find("the midpoint of its certified bracket") != std::string::npos);
            }
        }
        const std::string json = report_json(a, r);
        CHECK(json.find("\"bracket\":{\"lower\":") != std::string::npos);
        CHECK(json.find("\"decides_at_alpha\":") != std::string::npos);
    }
}

TEST_CASE("brackets past brute force agree with 1e7-replicate NumPy Monte Carlo (exact_monte_carlo.csv)") {
    // Each table through the analysis as a user runs it (exact p, 1 s budget) at alpha = 0.05 and
    // 0.01. Why 5 SE: the true p lies in the certified bracket, so p_hat falls more than 5 SE outside
    // it only if p_hat strays 5 SE from the true p: 5.7e-7 a row under the normal approximation, at
    // most 1.9e-6 for a count of 100 hits (Poisson tails, SciPy 1.10 poisson.sf; every row has >= 100),
    // so below 2.5e-5 for the family of 12 rows (the two alphas share a row's p_hat). A bracket
    // missing p by 5 SE fails: 0.05% of p at p near 0.9, 1% near alpha, half of p at p = 1e-5.
    const auto rows = tallyproof_test::reference_rows("exact_monte_carlo.csv");
    REQUIRE(rows.size() == 12);
    for (const auto& row : rows) {
        REQUIRE(row.size() == 12);
        const std::vector<double> observed = tallyproof_test::split_numbers(row[3]);
        const std::vector<double> shares = tallyproof_test::split_numbers(row[4]);
        const double x2 = std::stod(row[6]), hits = std::stod(row[8]), p_hat = std::stod(row[9]), se = std::stod(row[10]);
        CAPTURE(row[0]);
        REQUIRE(hits >= 100);
        Analysis a;
        for (std::size_t j = 0; j < observed.size(); ++j) a.categories.push_back("c" + std::to_string(j + 1));
        a.observed = observed;
        a.model.kind = ModelKind::ratio;  // the shares as given, any total (rescaled to sum 1, as NumPy's pi)
        a.model.values = shares;
        a.pvalue.method = PValueMethod::exact;
        for (double alpha : {0.05, 0.01}) {
            CAPTURE(alpha);
            a.alpha = alpha;
            const Result r = analyse_completely(a);
            CAPTURE(r.status.message);
            REQUIRE(r.status.ok);
            CAPTURE(r.exact.refusal);
            REQUIRE(r.exact.computed);  // never refused for time (k <= 100, N <= 5000)
            CHECK(r.statistic == doctest::Approx(x2).epsilon(1e-12));  // NumPy's X², float64
            CAPTURE(r.exact.method);
            CAPTURE(p_hat);
            CAPTURE(se);
            CAPTURE(r.exact.p_lower);
            CAPTURE(r.exact.p_upper);
            CHECK(r.exact.p_lower <= r.p.p);
            CHECK(r.p.p <= r.exact.p_upper);
            CHECK(r.exact.p_lower - 5 * se <= p_hat);
            CHECK(p_hat <= r.exact.p_upper + 5 * se);
            // An exact decision only when alpha lies outside the bracket, and then Monte Carlo's
            // wherever p_hat is clearly (5 SE) on one side of alpha.
            CHECK(r.exact.decides_at_alpha == (r.exact.p_upper <= alpha || r.exact.p_lower > alpha));
            if (r.exact.decides_at_alpha) {
                CHECK(r.reject == (r.exact.p_upper <= alpha));
                if (p_hat > alpha + 5 * se) CHECK_FALSE(r.reject);
                if (p_hat < alpha - 5 * se) CHECK(r.reject);
            }
        }
    }
}
