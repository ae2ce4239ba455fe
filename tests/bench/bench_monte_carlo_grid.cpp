// Benchmark (not a test): Monte Carlo p-value cost per replicate on the grid of issue #28, k in
// {2, 10, 100, 1000} x N in {10, 1e3, 1e5, 1e6}: shares proportional to 1..k; the observed table
// the counts expected under shares (j + 1)(1 + c (-1)^j), c = min(0.5, sqrt(k / N)) (X² near its
// df, so p lies inside (0, 1)), rounded by largest remainder (so N is exact); Pearson X², seed 7.
// B = 2e6 / k replicates (at least 2000), CPU time (getrusage user + system) of
// monte_carlo_p_value, start (score tables, samplers) included. tests/bench/numpy_monte_carlo_grid.py
// times NumPy's Generator.multinomial on the same cells. Usage: bench_monte_carlo_grid [k N ...]
#include <sys/resource.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <utility>
#include <vector>

#include "monte_carlo.hpp"

using namespace tallyproof;

namespace {

double cpu_seconds() {
    rusage u{};
    getrusage(RUSAGE_SELF, &u);
    return static_cast<double>(u.ru_utime.tv_sec + u.ru_stime.tv_sec) +
           1e-6 * static_cast<double>(u.ru_utime.tv_usec + u.ru_stime.tv_usec);
}

}  // namespace

int main(int argc, char** argv) {
    std::vector<std::pair<int, double>> cells;
    for (int i = 1; i + 1 < argc; i += 2) cells.push_back({std::atoi(argv[i]), std::atof(argv[i + 1])});
    if (cells.empty())
        for (int k : {2, 10, 100, 1000})
            for (double n : {10.0, 1e3, 1e5, 1e6}) cells.push_back({k, n});
    std::printf("%6s %9s %10s %10s %14s %10s\n", "k", "N", "replicates", "cpu_s", "us/replicate", "p");
    for (auto [k, nd] : cells) {
        const long n = static_cast<long>(nd);
        MultinomialTestSpec spec;
        const double c = std::min(0.5, std::sqrt(k / nd));
        double tilted_total = 0;
        for (int j = 0; j < k; ++j) tilted_total += (j + 1.0) * (1 + c * (j % 2 == 0 ? 1 : -1));
        std::vector<std::pair<double, int>> rest;
        long placed = 0;
        for (int j = 0; j < k; ++j) {
            spec.null_shares.push_back(j + 1.0);
            const double e = static_cast<double>(n) * (j + 1.0) * (1 + c * (j % 2 == 0 ? 1 : -1)) / tilted_total;
            spec.observed.push_back(std::floor(e));
            placed += static_cast<long>(std::floor(e));
            rest.push_back({e - std::floor(e), j});
        }
        std::stable_sort(rest.begin(), rest.end(), [](auto& a, auto& b) { return a.first > b.first; });
        for (long i = 0; i < n - placed; ++i) spec.observed[static_cast<std::size_t>(rest[static_cast<std::size_t>(i)].second)] += 1;
        MonteCarloOptions o;
        o.replicates = static_cast<std::uint64_t>(std::max(2000, 2000000 / k));
        o.seed = 7;
        MonteCarloResult r;
        const double t0 = cpu_seconds();
        const Status s = monte_carlo_p_value(spec, o, &r);
        const double sec = cpu_seconds() - t0;
        if (!s.ok) {
            std::printf("%6d %9ld refused: %s\n", k, n, s.message.c_str());
            continue;
        }
        std::printf("%6d %9ld %10llu %10.3f %14.3f %10.4f\n", k, n, static_cast<unsigned long long>(o.replicates), sec,
                    1e6 * sec / static_cast<double>(o.replicates), r.p);
        std::fflush(stdout);
    }
    return 0;
}
