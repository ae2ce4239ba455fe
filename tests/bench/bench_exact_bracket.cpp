// Benchmark (not a test): the decision-aimed grid bracket (exact_grid_bracket, refinement after
// Keich & Nagarajan 2006, J. Comput. Graph. Stat. 15:779-802) through exact_choice's 1 s budget,
// for unequal shares at k = 10..100, N = 50..5000: time, bracket, its width, whether it decides the
// test at alpha = 0.05, and for tail p (<= 1e-3) the relative width reached. Where the branch-and-
// bound walk (exact, Resin 2023) is estimated under 30 s it runs too, as the reference p.
// Usage: bench_exact_bracket [walk]   (with "walk": also run the reference walk where it fits;
// -1 marks a figure not measured)
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <vector>

#include "exact_choice.hpp"
#include "exact_grid_bracket.hpp"
#include "exact_multinomial.hpp"

using namespace tallyproof;

namespace {

double seconds_since(std::chrono::steady_clock::time_point t0) {
    return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

enum class Shares { linear, benford_two };

// Shares 1..k, or the first-two-digit law (k = 90); observed = expected counts rounded, then
// moved off the centre by `shift` times a fixed pattern (deterministic, no RNG).
MultinomialTestSpec table(int k, int n, Shares kind, int shift) {
    MultinomialTestSpec spec;
    spec.null_shares.resize(static_cast<std::size_t>(k));
    double total = 0;
    for (int j = 0; j < k; ++j) {
        const double v = kind == Shares::benford_two ? std::log10(1.0 + 1.0 / (10 + j)) : 1.0 + j;
        spec.null_shares[static_cast<std::size_t>(j)] = v;
        total += v;
    }
    spec.observed.resize(static_cast<std::size_t>(k));
    int placed = 0;
    const int pattern[5] = {1, -1, 2, 0, -2};
    for (int j = 0; j < k; ++j) {
        int x = static_cast<int>(std::floor(n * spec.null_shares[static_cast<std::size_t>(j)] / total + 0.5)) + shift * pattern[j % 5];
        if (x < 0) x = 0;
        spec.observed[static_cast<std::size_t>(j)] = x;
        placed += x;
    }
    // Put the difference on the largest cell (the last), keeping every count whole and >= 0.
    double& last = spec.observed[static_cast<std::size_t>(k - 1)];
    last = std::max(0.0, last + (n - placed));
    return spec;
}

}  // namespace

int main(int argc, char** argv) {
    const bool walk = argc > 1 && std::strcmp(argv[1], "walk") == 0;
    struct Case { int k, n; Shares kind; int shift; };
    const Case cases[] = {
        {10, 50, Shares::linear, 1},    {10, 50, Shares::linear, 3},    {10, 300, Shares::linear, 6},
        {20, 100, Shares::linear, 1},   {20, 100, Shares::linear, 3},   {30, 150, Shares::linear, 1},
        {30, 150, Shares::linear, 3},   {30, 1000, Shares::linear, 6},  {40, 200, Shares::linear, 2},
        {60, 300, Shares::linear, 2},   {90, 300, Shares::benford_two, 1}, {90, 300, Shares::benford_two, 3},
        {100, 1000, Shares::linear, 3}, {100, 5000, Shares::linear, 6},
    };
    // aimed: exact_choice at alpha = 0.05 (what the analysis runs); plain: the same grid and budget
    // without a decision to aim at (refined toward the 1e-6 bound only). decides: 1 when the
    // bracket lies wholly at or below 0.05 or above it. rel width: (p_upper - p_lower) / p_lower.
    std::printf("decision-aimed bracket, alpha = 0.05, budget 1 s natively (shares 1..k; k = 90: first-two-digit law)\n");
    std::printf("%4s %5s %5s %8s %12s %12s %10s %10s %7s %8s %10s %7s %11s %8s  %s\n", "k", "N", "shift", "seconds", "p_lower",
                "p_upper", "width", "rel_width", "decides", "plain_s", "plain_wid", "plain_d", "walk_p", "walk_s", "method");
    for (const Case& c : cases) {
        const MultinomialTestSpec spec = table(c.k, c.n, c.kind, c.shift);
        ExactChoiceOptions o;
        o.alpha = 0.05;
        ExactMultinomialResult r;
        ExactMethod m{};
        auto t0 = std::chrono::steady_clock::now();
        const Status s = exact_p_value(spec, o, &r, &m);
        const double sec = seconds_since(t0);
        double plain_s = -1, plain_w = -1;
        int plain_d = -1;
        if (m == ExactMethod::grid_bracket) {
            ExactChoiceOptions plain;  // no alpha
            ExactMultinomialResult pr;
            t0 = std::chrono::steady_clock::now();
            exact_p_value(spec, plain, &pr);
            plain_s = seconds_since(t0);
            plain_w = pr.p_upper - pr.p_lower;
            plain_d = bracket_decides(pr.p_lower, pr.p_upper, 0.05) ? 1 : 0;
        }
        double wp = -1, ws = -1;
        OutcomeScores sc;
        if (walk && make_outcome_scores(spec, &sc).ok && estimate_walk_seconds(sc) < 30 && m == ExactMethod::grid_bracket) {
            ExactMultinomialOptions wo;
            wo.max_work = 1e13;
            ExactMultinomialResult w;
            t0 = std::chrono::steady_clock::now();
            if (exact_multinomial_p_value(spec, wo, &w).ok) wp = w.p.p;
            ws = seconds_since(t0);
        }
        const double width = r.p_upper - r.p_lower;
        std::printf("%4d %5d %5d %8.3f %12.6g %12.6g %10.3g %10.3g %7d %8.3f %10.3g %7d %11.6g %8.3f  %s%s\n", c.k, c.n, c.shift, sec,
                    r.p_lower, r.p_upper, width, r.p_lower > 0 ? width / r.p_lower : INFINITY,
                    bracket_decides(r.p_lower, r.p_upper, o.alpha) ? 1 : 0, plain_s, plain_w, plain_d, wp, ws, exact_method_name(m),
                    s.ok ? "" : " (failed)");
        std::fflush(stdout);
    }
    return 0;
}
