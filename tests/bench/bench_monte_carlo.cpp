// Benchmark (not a test): Monte Carlo cost per replicate as k grows (equal shares, N = 10 k,
// seed 3; k = 10000 at N about 1690), the case of issue 15 (k = 1000, N = 10,000, 20,000 replicates) among them. Prints one
// line per k; tests/bench/numpy_monte_carlo.py times NumPy's multinomial on the same workloads.
#include <chrono>
#include <cstdio>
#include <vector>

#include "monte_carlo.hpp"

using namespace tallyproof;

int main() {
    std::printf("%8s %8s %10s %10s %14s %10s\n", "k", "N", "replicates", "seconds", "us/replicate", "p");
    for (int k : {10, 100, 1000, 10000}) {
        const double per_cell = k == 10000 ? 0.2 : 10.0;  // k = 10000: N about 1690 (the limit is N k <= 2e7)
        MultinomialTestSpec spec;
        spec.null_shares.assign(static_cast<std::size_t>(k), 1.0);
        spec.observed.assign(static_cast<std::size_t>(k), 0.0);
        for (int j = 0; j < k; ++j) spec.observed[static_cast<std::size_t>(j)] = per_cell >= 1 ? per_cell : (j % 6 == 0 ? 1 : 0);
        spec.observed[0] = 20;  // N = 10 k - 10 (k <= 1000), a table off the centre
        spec.observed[1] = 0;
        spec.observed[2] = 0;
        double total = 0;
        for (double x : spec.observed) total += x;
        MonteCarloOptions o;
        o.replicates = k == 10000 ? 2000 : 20000;
        o.seed = 3;
        MonteCarloResult r;
        const auto t0 = std::chrono::steady_clock::now();
        const Status s = monte_carlo_p_value(spec, o, &r);
        const double sec = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
        if (!s.ok) {
            std::printf("k = %d refused: %s\n", k, s.message.c_str());
            return 1;
        }
        std::printf("%8d %8d %10llu %10.3f %14.2f %10.4f\n", k, static_cast<int>(total), static_cast<unsigned long long>(o.replicates),
                    sec, 1e6 * sec / static_cast<double>(o.replicates), r.p);
    }
    return 0;
}
