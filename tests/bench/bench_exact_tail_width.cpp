// Benchmark (not a test): how narrow the certified grid bracket (exact_grid_bracket) gets for tail
// p-values (about 1e-4 to 1e-8) with irrational shares (sqrt(j): no lattice), k = 10, 20, 30, at
// work budgets of 1e9 units (the 1 s of exact_choice) and 1e10 (10 s). The bracket's width is about
// the density at the threshold times k h (h the grid step) and h shrinks as 1/work, so the work a
// relative width of 1e-6 would need is extrapolated as work x (relative width / 1e-6). walk_est_s:
// exact_choice's estimate of the branch-and-bound walk's seconds (exact to about 1e-12) for the table.
// work: the units spent (a round that would not fit the budget left, or the 6e6-cell memory cap, is not started).
// Usage: bench_exact_tail_width [quick]   ("quick": the 1e9 budget only)
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

// Shares sqrt(1..k); observed = expected counts rounded, moved by shift x (1, -1, 2, 0, -2) (the
// pattern of bench_exact_bracket), the difference put on the last cell.
MultinomialTestSpec sqrt_table(int k, int n, int shift) {
    MultinomialTestSpec spec;
    double total = 0;
    for (int j = 1; j <= k; ++j) {
        spec.null_shares.push_back(std::sqrt(static_cast<double>(j)));
        total += spec.null_shares.back();
    }
    const int pattern[5] = {1, -1, 2, 0, -2};
    int placed = 0;
    for (int j = 0; j < k; ++j) {
        const int x = std::max(0, static_cast<int>(std::floor(n * spec.null_shares[static_cast<std::size_t>(j)] / total + 0.5)) + shift * pattern[j % 5]);
        spec.observed.push_back(x);
        placed += x;
    }
    spec.observed.back() = std::max(0.0, spec.observed.back() + (n - placed));
    return spec;
}

}  // namespace

int main(int argc, char** argv) {
    const bool quick = argc > 1 && std::strcmp(argv[1], "quick") == 0;
    struct Case { int k, n, shift; };
    const Case cases[] = {
        {10, 100, 4}, {10, 100, 5}, {10, 100, 6}, {20, 200, 4}, {20, 400, 5}, {30, 300, 3}, {30, 300, 4},
    };
    std::printf("certified grid bracket for tail p, shares sqrt(1..k) (no lattice), no alpha aimed at\n");
    std::printf("%4s %5s %5s %8s %9s %9s %8s %6s %13s %13s %10s %11s %11s\n", "k", "N", "shift", "X2", "budget", "work", "seconds", "rounds", "p_lower",
                "p_upper", "rel_width", "work_1e-6", "walk_est_s");
    for (const Case& c : cases)
        for (double budget : {1e9, 1e10}) {
            if (quick && budget > 1e9) continue;
            OutcomeScores sc;
            if (!make_outcome_scores(sqrt_table(c.k, c.n, c.shift), &sc).ok) return 1;
            GridBracketOptions o;
            o.max_work = budget;
            o.max_rounds = 40;
            GridBracketState st;
            const auto t0 = std::chrono::steady_clock::now();
            if (!grid_bracket_start(sc, o, &st).ok) return 1;
            while (!grid_bracket_step(&st, 1u << 24).done) {
            }
            const double sec = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
            ExactMultinomialResult r;
            grid_bracket_result(st, &r);
            const double rel = r.p_lower > 0 ? (r.p_upper - r.p_lower) / r.p_lower : INFINITY;
            std::printf("%4d %5d %5d %8.3f %9.0e %9.2e %8.2f %6d %13.7g %13.7g %10.3g %11.2g %11.2g\n", c.k, c.n, c.shift, sc.observed_score, budget, st.work, sec,
                        st.round, r.p_lower, r.p_upper, rel, st.work * rel / 1e-6, estimate_walk_seconds(sc));
            std::fflush(stdout);
        }
    return 0;
}
