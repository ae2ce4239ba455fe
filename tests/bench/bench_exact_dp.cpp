// Benchmark (not a test): the polynomial exact methods against the speed targets of issue 13:
// equal shares for k <= 100 at expected counts averaging 5 (N = 5 k), beside the branch-and-bound
// walk where it runs; tests/bench/numpy_exact_dp.py is the independent NumPy reference.
#include <chrono>
#include <cstdio>
#include <vector>

#include "equal_shares_exact.hpp"
#include "exact_multinomial.hpp"

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
    std::printf("%5s %6s %12s %10s %12s %10s %12s %14s\n", "k", "N", "p (DP)", "DP s", "bound", "estimate", "p (walk)", "walk s");
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
        std::printf("%5d %6d %12.6g %10.3f %12.3g %10.3g %12.6g %14.3f%s\n", k, sc.n, r.p.p, sec, r.error_bound,
                    st.estimated_work, walk_p, walk_sec, s.ok ? "" : " (failed)");
    }
    return 0;
}
