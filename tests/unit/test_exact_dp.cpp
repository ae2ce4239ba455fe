// The polynomial exact methods (equal_shares_exact, grid_bracket_exact, exact_choice) against a
// brute-force enumeration (brute_force_multinomial.hpp: every outcome visited by an odometer,
// probabilities as N! prod pi^x / x!, statistic from the Cressie-Read definition), against the branch-and-bound
// walk where both run, and the bracket containing the brute-force p for every ordering.
#include <doctest/doctest.h>

#include <cmath>
#include <string>
#include <vector>

#include "brute_force_multinomial.hpp"
#include "exact_equal_shares.hpp"
#include "exact_choice.hpp"
#include "exact_multinomial.hpp"
#include "exact_grid_bracket.hpp"

using namespace tallyproof;

namespace {

using Case = tallyproof_test::EnumeratedTable;

using tallyproof_test::brute_force_p;

MultinomialTestSpec spec_of(const Case& c, ExtremeOrdering ordering, double lambda) {
    MultinomialTestSpec s;
    for (int v : c.observed) s.observed.push_back(v);
    s.null_shares = c.shares;
    s.ordering = ordering;
    s.lambda = lambda;
    return s;
}

ExactMultinomialResult run_equal_shares(const MultinomialTestSpec& spec) {
    OutcomeScores sc;
    REQUIRE(make_outcome_scores(spec, &sc).ok);
    REQUIRE(equal_shares_dp_applies(sc));
    EqualSharesExactState st;
    REQUIRE(equal_shares_exact_start(sc, &st).ok);
    while (!equal_shares_exact_step(&st, 1000).done) {
    }
    ExactMultinomialResult r;
    REQUIRE(equal_shares_exact_result(st, &r).ok);
    return r;
}

ExactMultinomialResult run_bracket(const MultinomialTestSpec& spec, double bound) {
    OutcomeScores sc;
    REQUIRE(make_outcome_scores(spec, &sc).ok);
    GridBracketOptions o;
    o.error_bound = bound;
    o.max_work = 2e7;
    GridBracketState st;
    REQUIRE(grid_bracket_start(sc, o, &st).ok);
    while (!grid_bracket_step(&st, 100000).done) {
    }
    ExactMultinomialResult r;
    REQUIRE(grid_bracket_result(st, &r).ok);
    return r;
}

const std::vector<Case> kEqualCases = {
    {{3, 0, 1, 4}, {1, 1, 1, 1}},     {{6, 1, 1}, {1, 1, 1}},        {{2, 2, 2, 2, 2}, {1, 1, 1, 1, 1}},
    {{0, 0, 9}, {1, 1, 1}},           {{5, 0, 0, 0, 1}, {1, 1, 1, 1, 1}}, {{1, 2, 3, 4, 0, 2}, {2, 2, 2, 2, 2, 2}},
};
const std::vector<Case> kUnequalCases = {
    {{3, 0, 1, 4}, {0.1, 0.2, 0.3, 0.4}},             {{6, 1, 1}, {0.5, 0.25, 0.25}},
    {{1, 4, 2, 0, 3}, {std::sqrt(2.0), 1, std::sqrt(3.0), 0.5, std::acos(-1.0) / 2}},  // irrational: no lattice
    {{0, 0, 9}, {0.6, 0.3, 0.1}},                     {{2, 5, 1, 3}, {std::log10(2.0), std::log10(1.5), std::log10(4.0 / 3), std::log10(1.25)}},
};

}  // namespace

TEST_CASE("the brute-force oracle visits every outcome once") {
    const Case centre{{1, 1, 2, 3}, {1, 1, 2, 3}};  // X² = 0 at the expected counts: every outcome is extreme
    CHECK(brute_force_p(centre, ExtremeOrdering::statistic, 1.0) == doctest::Approx(1.0).epsilon(1e-12));
    // Closed form: under shares 1/2, 1/4, 1/4 only (0, 7, 0) and (0, 0, 7) reach X² = 21: p = 2 4^-7.
    CHECK(brute_force_p(Case{{0, 7, 0}, {2, 1, 1}}, ExtremeOrdering::statistic, 1.0) == doctest::Approx(2 * std::pow(0.25, 7)).epsilon(1e-12));
}

TEST_CASE("equal-shares programme: brute force and the walk agree") {
    for (const Case& c : kEqualCases) {
        CAPTURE(c.observed.size());
        const MultinomialTestSpec spec = spec_of(c, ExtremeOrdering::statistic, 1.0);
        const double brute = brute_force_p(c, ExtremeOrdering::statistic, 1.0);
        const ExactMultinomialResult dp = run_equal_shares(spec);
        ExactMultinomialResult walk;
        REQUIRE(exact_multinomial_p_value(spec, ExactMultinomialOptions{}, &walk).ok);
        CHECK(dp.p.p == doctest::Approx(brute).epsilon(1e-11));
        CHECK(std::fabs(dp.p.p - brute) <= dp.error_bound + 1e-13 * brute);
        CHECK(dp.p.p == doctest::Approx(walk.p.p).epsilon(1e-11));
    }
}

TEST_CASE("equal-shares programme matches the walk on larger sparse tables") {
    // k = 8, N = 40 (the walk takes about a second at k = 10, N = 50).
    const std::vector<std::vector<int>> tables = {{5, 8, 2, 6, 4, 9, 3, 3}, {0, 0, 0, 0, 0, 0, 0, 40}, {5, 5, 5, 5, 5, 5, 5, 5}};
    for (const auto& t : tables) {
        Case c{t, std::vector<double>(8, 1.0)};
        const MultinomialTestSpec spec = spec_of(c, ExtremeOrdering::statistic, 1.0);
        const ExactMultinomialResult dp = run_equal_shares(spec);
        ExactMultinomialOptions wide;
        wide.max_work = 1e10;
        ExactMultinomialResult walk;
        REQUIRE(exact_multinomial_p_value(spec, wide, &walk).ok);
        CAPTURE(walk.p.p);
        CHECK(dp.p.p == doctest::Approx(walk.p.p).epsilon(1e-10));
    }
}

TEST_CASE("the bracket contains the brute-force p for every ordering and lambda") {
    std::vector<Case> all = kUnequalCases;
    all.insert(all.end(), kEqualCases.begin(), kEqualCases.end());
    for (const Case& c : all)
        for (ExtremeOrdering ord : {ExtremeOrdering::statistic, ExtremeOrdering::probability})
            for (double lambda : {1.0, 0.0, 2.0 / 3, -0.5, 2.0}) {
                if (ord == ExtremeOrdering::probability && lambda != 1.0) continue;
                CAPTURE(c.observed.size());
                CAPTURE(lambda);
                CAPTURE(static_cast<int>(ord));
                const double brute = brute_force_p(c, ord, lambda);
                const ExactMultinomialResult r = run_bracket(spec_of(c, ord, lambda), 1e-4);
                CAPTURE(brute);
                CAPTURE(r.p.p);
                CAPTURE(r.error_bound);
                CHECK(std::fabs(r.p.p - brute) <= r.error_bound * (1 + 1e-9) + 1e-12 * brute);  // 1e-12: the oracle's own rounding
                CHECK(r.error_bound <= 0.05);  // and it says something
            }
}

TEST_CASE("X² with rational shares is exact on the lattice; the choice picks the fastest method") {
    const Case c{{3, 0, 1, 4}, {0.1, 0.2, 0.3, 0.4}};
    const ExactMultinomialResult r = run_bracket(spec_of(c, ExtremeOrdering::statistic, 1.0), 1e-6);
    CHECK(r.error_bound < 1e-12);
    CHECK(r.p.p == doctest::Approx(brute_force_p(c, ExtremeOrdering::statistic, 1.0)).epsilon(1e-11));

    ExactMethod m = ExactMethod::walk;
    ExactMultinomialResult e;
    MultinomialTestSpec last_digits;  // 50 readings over 10 last digits (the example): the programme
    last_digits.observed = {5, 8, 2, 6, 4, 9, 3, 5, 1, 7};
    last_digits.null_shares.assign(10, 0.1);
    REQUIRE(exact_p_value(last_digits, ExactChoiceOptions{}, &e, &m).ok);
    CHECK(m == ExactMethod::equal_shares_dp);
    // Value: the walk's 0.220686 (tests/bench/bench_exact_dp; 2 s there, too slow for a unit test).
    CHECK(e.p.p == doctest::Approx(0.2206862537834898).epsilon(1e-9));
    MultinomialTestSpec small = spec_of(c, ExtremeOrdering::probability, 1.0);
    REQUIRE(exact_p_value(small, ExactChoiceOptions{}, &e, &m).ok);
    CHECK(m == ExactMethod::walk);  // tiny tables: the walk is fastest
}

TEST_CASE("a table past the time limit gets the bracket reached, not a refusal; cancel stops the programmes") {
    MultinomialTestSpec far;  // p about 1e-300: the equal-shares programme would take too long
    far.observed = {100, 200, 300, 400, 500, 600, 700, 800, 900, 1000};
    far.null_shares.assign(10, 1.0);
    ExactChoiceOptions o;
    o.max_seconds = 0.05;
    o.alpha = 0.05;
    ExactMultinomialResult e;
    ExactMethod m{};
    const Status s = exact_p_value(far, o, &e, &m);
    REQUIRE(s.ok);
    CHECK(m == ExactMethod::grid_bracket);
    CHECK(e.p_lower <= e.p.p);
    CHECK(e.p.p <= e.p_upper);
    // Markov's inequality, P(X² >= t) <= E[X²] / t = (k - 1) / t (X² = 1500 here), bounds the
    // certified lower end; the bracket decides the test at 0.05 (the whole bracket below it).
    CHECK(e.p_lower <= 9.0 / 1500);
    CHECK(e.p_upper <= 0.05);

    OutcomeScores sc;
    REQUIRE(make_outcome_scores(spec_of(kEqualCases[0], ExtremeOrdering::statistic, 1.0), &sc).ok);
    EqualSharesExactState st;
    REQUIRE(equal_shares_exact_start(sc, &st).ok);
    equal_shares_exact_step(&st, 1);
    equal_shares_exact_cancel(&st);
    CHECK(equal_shares_exact_step(&st, 1).cancelled);
    ExactMultinomialResult r;
    CHECK_FALSE(equal_shares_exact_result(st, &r).ok);
    GridBracketState g;
    REQUIRE(grid_bracket_start(sc, GridBracketOptions{}, &g).ok);
    grid_bracket_cancel(&g);
    CHECK(grid_bracket_step(&g, 1).cancelled);
    CHECK_FALSE(grid_bracket_result(g, &r).ok);
}

TEST_CASE("the chosen exact method matches brute force for every ordering and lambda") {
    // Whatever exact_choice picks (walk, programme or bracket), the p it gives lies within its
    // stated error bound of the brute-force enumeration above; the programme is chosen only where
    // it applies (the statistic ordering with X² under equal shares).
    std::vector<Case> all = kUnequalCases;
    all.insert(all.end(), kEqualCases.begin(), kEqualCases.end());
    all.push_back({{5, 1, 0, 2, 3, 0, 1}, std::vector<double>(7, 1.0)});  // N = 12 over 7 categories
    for (const Case& c : all)
        for (ExtremeOrdering ord : {ExtremeOrdering::statistic, ExtremeOrdering::probability})
            for (double lambda : {1.0, 0.0, 2.0 / 3, -0.5, 2.0}) {
                if (ord == ExtremeOrdering::probability && lambda != 1.0) continue;
                CAPTURE(c.observed.size());
                CAPTURE(lambda);
                CAPTURE(static_cast<int>(ord));
                const MultinomialTestSpec spec = spec_of(c, ord, lambda);
                ExactMultinomialResult e;
                ExactMethod m = ExactMethod::walk;
                REQUIRE(exact_p_value(spec, ExactChoiceOptions{}, &e, &m).ok);
                const double brute = brute_force_p(c, ord, lambda);
                CAPTURE(brute);
                CAPTURE(e.p.p);
                CAPTURE(exact_method_name(m));
                CHECK(std::fabs(e.p.p - brute) <= e.error_bound * (1 + 1e-9) + 1e-10 * brute);
                OutcomeScores sc;
                REQUIRE(make_outcome_scores(spec, &sc).ok);
                bool equal = true;
                for (double s : c.shares) equal = equal && s == c.shares[0];
                CHECK(equal_shares_dp_applies(sc) == (equal && ord == ExtremeOrdering::statistic && lambda == 1.0));
                if (m == ExactMethod::equal_shares_dp) CHECK(equal_shares_dp_applies(sc));
            }
}

TEST_CASE("equal-shares programme against brute force with N = 12 over 7 categories") {
    // The odometer visits 13^6 = 4.8 million tuples (18,564 outcomes): about a tenth of a second.
    const Case c{{5, 1, 0, 2, 3, 0, 1}, std::vector<double>(7, 1.0)};
    const double brute = brute_force_p(c, ExtremeOrdering::statistic, 1.0);
    const ExactMultinomialResult dp = run_equal_shares(spec_of(c, ExtremeOrdering::statistic, 1.0));
    CAPTURE(brute);
    CHECK(dp.p.p == doctest::Approx(brute).epsilon(1e-10));
    CHECK(std::fabs(dp.p.p - brute) <= dp.error_bound + 1e-10 * brute);
}

TEST_CASE("the choice keeps to its time budget where the shares' lattice would need far more work") {
    // Shares 1..10 (ratio), table 5,8,2,6,4,9,3,5,1,7 (N = 50): the lattice of X² terms is too fine
    // to finish within the budget (measured: 3.7e9 state updates, 6 s natively, when it was taken
    // regardless), so the grid brackets p instead. A property of the method, no reference value:
    // the work stays within the budget's units and the bracket is a usable p-value.
    MultinomialTestSpec spec;
    spec.observed = {5, 8, 2, 6, 4, 9, 3, 5, 1, 7};
    for (int j = 1; j <= 10; ++j) spec.null_shares.push_back(j);
    ExactMultinomialResult r;
    ExactMethod method{};
    REQUIRE(exact_p_value(spec, ExactChoiceOptions{}, &r, &method).ok);
    CHECK(method == ExactMethod::grid_bracket);
    CHECK(r.work_units <= 2.5e9);  // the 1 s budget's units, with one refinement's overrun
    CHECK(r.error_bound <= 0.1 * r.p.p);
    CHECK(r.p.p > 0);
}
