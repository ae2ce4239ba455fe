// Benchmark (not a test): the polynomial exact methods against the speed targets of issue 13:
// equal shares for k <= 100 at expected counts averaging 5 (N = 5 k), beside the branch-and-bound
// walk where it runs; tests/bench/numpy_exact_dp.py is the independent NumPy reference.
#include <chrono>
#include <cmath>
#include <cstdio>
#include <vector>

#include "exact_equal_shares.hpp"
#include "exact_multinomial.hpp"
#include "exact_grid_bracket.hpp"

using namespace tallyproof;

namespace {

double seconds_since(std::chrono::steady_clock::time_point t0) {
    return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

// A table of k cells, mean 5, off the centre by a fixed pattern (deterministic, no RNG).
std::vector<double> sparse_table(int k) {
    std::vector<double> x(static_cast<std::size_t>(k));
    const int pattern[10] = {5, 8, 2, 6, 4, 9, 3, 5, 1, 7};
    for (int j = 0; j < k; ++j) x[static_cast<std::size_t>(j)] = pattern[j % 10];
    return x;
}

}  // namespace

int main() {
    std::printf("equal shares, X^2, mean 5 per cell (target: 1 s natively)\n");
    std::printf("%5s %6s %20s %10s %12s %10s %20s %10s\n", "k", "N", "p (DP)", "DP s", "bound", "estimate", "p (walk)", "walk s");
    for (int k : {10, 20, 30, 50, 70, 100}) {
        MultinomialTestSpec spec;
        spec.observed = sparse_table(k);
        spec.null_shares.assign(static_cast<std::size_t>(k), 1.0);
        OutcomeScores sc;
        if (!make_outcome_scores(spec, &sc).ok) return 1;
        EqualSharesExactState st;
        auto t0 = std::chrono::steady_clock::now();
        equal_shares_exact_start(sc, &st);
        while (!equal_shares_exact_step(&st, 1u << 30).done) {
        }
        ExactMultinomialResult r;
        const Status s = equal_shares_exact_result(st, &r);
        const double sec = seconds_since(t0);
        double walk_p = -1, walk_sec = 0;
        if (k <= 10) {
            ExactMultinomialOptions o;
            o.max_work = 1e12;
            ExactMultinomialResult w;
            t0 = std::chrono::steady_clock::now();
            if (exact_multinomial_p_value(spec, o, &w).ok) walk_p = w.p.p;
            walk_sec = seconds_since(t0);
        }
        std::printf("%5d %6d %20.15g %10.3f %12.3g %10.3g %20.15g %10.3f%s\n", k, sc.n, r.p.p, sec, r.error_bound,
                    st.estimated_work, walk_p, walk_sec, s.ok ? "" : " (failed)");
    }
    std::printf("\nany shares, grid bracket (targets: k <= 30 at bound 1e-6, first-two-digit law k = 90 at N <= 300, 1e-4)\n");
    std::printf("%5s %6s %10s %12s %10s %12s %10s %12s %10s\n", "k", "N", "bound asked", "p", "seconds", "bound", "estimate",
                "p (walk)", "walk s");
    struct Case { int k, n; double bound; bool benford; };
    const Case cases[] = {{6, 30, 1e-6, false}, {10, 50, 1e-6, false}, {20, 100, 1e-6, false}, {30, 150, 1e-6, false},
                          {30, 150, 1e-4, false}, {90, 300, 1e-4, true}};
    for (const Case& c : cases) {
        MultinomialTestSpec spec;
        spec.null_shares.resize(static_cast<std::size_t>(c.k));
        for (int j = 0; j < c.k; ++j)  // shares 1..k (unequal), or the first-two-digit law
            spec.null_shares[static_cast<std::size_t>(j)] = c.benford ? std::log10(1.0 + 1.0 / (10 + j)) : 1.0 + j;
        double total = 0;
        for (double v : spec.null_shares) total += v;
        // Observed: expected counts rounded, then moved off the centre by a fixed pattern.
        spec.observed.resize(static_cast<std::size_t>(c.k));
        int placed = 0;
        for (int j = 0; j < c.k; ++j) {
            const int pattern[5] = {1, -1, 2, 0, -2};
            int x = static_cast<int>(std::floor(c.n * spec.null_shares[static_cast<std::size_t>(j)] / total + 0.5)) + pattern[j % 5];
            if (x < 0) x = 0;
            spec.observed[static_cast<std::size_t>(j)] = x;
            placed += x;
        }
        spec.observed[0] += c.n - placed > -spec.observed[0] ? c.n - placed : 0;
        OutcomeScores sc;
        if (!make_outcome_scores(spec, &sc).ok) return 1;
        GridBracketOptions go;
        go.error_bound = c.bound;
        GridBracketState st;
        auto t0 = std::chrono::steady_clock::now();
        grid_bracket_start(sc, go, &st);
        while (!grid_bracket_step(&st, 1u << 30).done) {
        }
        ExactMultinomialResult r;
        grid_bracket_result(st, &r);
        const double sec = seconds_since(t0);
        double walk_p = -1, walk_sec = 0;
        if (estimate_exact_work(sc) < 3e8) {
            ExactMultinomialOptions o;
            o.max_work = 1e12;
            ExactMultinomialResult w;
            t0 = std::chrono::steady_clock::now();
            if (exact_multinomial_p_value(spec, o, &w).ok) walk_p = w.p.p;
            walk_sec = seconds_since(t0);
        }
        std::printf("%5d %6d %10.0e %12.8f %10.3f %12.3g %10.3g %12.8f %10.3f\n", c.k, sc.n, c.bound, r.p.p, sec, r.error_bound,
                    st.estimated_work, walk_p, walk_sec);
    }
    return 0;
}
