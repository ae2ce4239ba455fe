// Benchmark (not a test): times the Monte Carlo and exact p-values against their targets.
// Build by hand: g++ -std=c++17 -O2 -I core tests/bench/bench_pvalues.cpp core/exact/monte_carlo.cpp
//   core/numerics/random.cpp core/exact/exact_multinomial.cpp core/statistics/power_divergence.cpp -o bench_pvalues
// Run `bench_pvalues --verify` to also enumerate all 96.5 million N = 100, k = 6 outcomes plainly.
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <ctime>
#include <vector>

#include "exact_multinomial.hpp"
#include "monte_carlo.hpp"
#include "power_divergence.hpp"

using namespace tallyproof;

namespace {

double seconds_since(std::chrono::steady_clock::time_point t0) {
    return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

// Plain enumeration of every outcome (k = 6), for comparison only.
double plain_enumeration(const OutcomeScores& sc, double* seconds) {
    const auto t0 = std::chrono::steady_clock::now();
    const int n = sc.n;
    std::vector<std::vector<double>> lw(6, std::vector<double>(n + 1));
    for (int j = 0; j < 6; ++j)
        for (int x = 0; x <= n; ++x) lw[j][x] = -sc.log_factorial[x] + x * std::log(sc.shares[j]);
    long double p = 0;  // 64-bit mantissa so 96 million small terms are not rounded away
    for (int a = 0; a <= n; ++a)
        for (int b = 0; a + b <= n; ++b)
            for (int c = 0; a + b + c <= n; ++c)
                for (int d = 0; a + b + c + d <= n; ++d)
                    for (int e = 0; a + b + c + d + e <= n; ++e) {
                        const int f = n - a - b - c - d - e;
                        const double t = sc.score[0][a] + sc.score[1][b] + sc.score[2][c] + sc.score[3][d] +
                                         sc.score[4][e] + sc.score[5][f];
                        if (t >= sc.threshold)
                            p += std::exp(sc.log_factorial[n] + lw[0][a] + lw[1][b] + lw[2][c] + lw[3][d] + lw[4][e] +
                                          lw[5][f]);
                    }
    *seconds = seconds_since(t0);
    return static_cast<double>(p);
}

}  // namespace

int main(int argc, char** argv) {
    const bool verify = argc > 1 && std::strcmp(argv[1], "--verify") == 0;
    const double target = 0.3;

    MultinomialTestSpec mc_spec;
    mc_spec.observed = {95, 110, 98, 102, 88, 105, 97, 101, 99, 105};  // N = 1000, k = 10
    mc_spec.null_shares.assign(10, 1.0);
    MonteCarloOptions mo;
    mo.replicates = 1000000;
    mo.seed = 42;
    for (int rep = 0; rep < 3; ++rep) {
        const auto t0 = std::chrono::steady_clock::now();
        const std::clock_t c0 = std::clock();
        MonteCarloResult r;
        const Status s = monte_carlo_p_value(mc_spec, mo, &r);
        const double dt = seconds_since(t0);
        const double cpu = static_cast<double>(std::clock() - c0) / CLOCKS_PER_SEC;
        if (!s.ok) { std::printf("Monte Carlo refused: %s\n", s.message.c_str()); return 1; }
        std::printf("Monte Carlo B=1e6, N=1000, k=10 (Pearson): %.3f s wall, %.3f s CPU (target %.1f s), "
                    "%.3g replicates/s (CPU), p=%.6f se=%.6f b=%llu\n", dt, cpu, target, 1e6 / cpu, r.p, r.standard_error,
                    static_cast<unsigned long long>(r.extreme));
    }

    {  // large total: N = 1e6 over the nine first-digit shares, B = 1e5 (table-free BTRD path)
        MultinomialTestSpec big;
        big.observed = {301500, 175800, 124700, 97000, 79300, 66800, 58200, 51300, 45400};
        big.null_shares.clear();
        for (int d = 1; d <= 9; ++d) big.null_shares.push_back(std::log10(1.0 + 1.0 / d));
        MonteCarloOptions bo;
        bo.replicates = 100000;
        bo.seed = 42;
        const auto t0 = std::chrono::steady_clock::now();
        MonteCarloResult r;
        const Status s = monte_carlo_p_value(big, bo, &r);
        if (!s.ok) { std::printf("Monte Carlo refused: %s\n", s.message.c_str()); return 1; }
        std::printf("Monte Carlo B=1e5, N=1e6, k=9 (Pearson): %.3f s wall, p=%.6f se=%.6f b=%llu\n", seconds_since(t0),
                    r.p, r.standard_error, static_cast<unsigned long long>(r.extreme));
    }

    for (int ord = 0; ord < 2; ++ord) {
        MultinomialTestSpec ex_spec;
        ex_spec.observed = {20, 15, 12, 18, 25, 10};  // N = 100, k = 6 equal shares
        ex_spec.null_shares.assign(6, 1.0);
        ex_spec.ordering = ord ? ExtremeOrdering::probability : ExtremeOrdering::statistic;
        ExactMultinomialResult r;
        for (int rep = 0; rep < 3; ++rep) {
            const auto t0 = std::chrono::steady_clock::now();
            const std::clock_t c0 = std::clock();
            const Status s = exact_multinomial_p_value(ex_spec, ExactMultinomialOptions{}, &r);
            const double dt = seconds_since(t0);
            const double cpu = static_cast<double>(std::clock() - c0) / CLOCKS_PER_SEC;
            if (!s.ok) { std::printf("exact refused: %s\n", s.message.c_str()); return 1; }
            std::printf("exact N=100, k=6, %s: %.4f s wall, %.4f s CPU (target %.1f s), %llu outcome evaluations (estimate %.3g), "
                        "%llu prefixes, of %.4g outcomes; p=%.17g +- %.2g\n",
                        ord ? "probability ordering" : "Pearson", dt, cpu, target,
                        static_cast<unsigned long long>(r.work_units), r.estimated_work,
                        static_cast<unsigned long long>(r.nodes), r.total_outcomes, r.p.p, r.error_bound);
        }
        if (verify) {
            OutcomeScores sc;
            make_outcome_scores(ex_spec, &sc);
            double dt = 0;
            const double p = plain_enumeration(sc, &dt);
            std::printf("  plain enumeration of all outcomes: %.3f s, p=%.17g, relative difference %.2g\n", dt, p,
                        (r.p.p - p) / p);
        }
    }
    return 0;
}
