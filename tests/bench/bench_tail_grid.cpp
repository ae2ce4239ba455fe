// Benchmark helper (not a test): prints Tallyproof's chi-square upper tail p and log10 p for every
// (df, x) row of a grid file, for tests/bench/tail_accuracy.py to compare with mpmath (50 digits),
// R and SciPy. Build: g++ -std=c++17 -O2 -I core tests/bench/bench_tail_grid.cpp
//   core/numerics/chi_square_tail.cpp core/numerics/log_incomplete_gamma.cpp -o bench_tail_grid
// Usage: bench_tail_grid GRID.csv   (rows "df,x,..."; lines starting with # or "df" are skipped)
#include <chrono>
#include <cstdio>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "chi_square_tail.hpp"

int main(int argc, char** argv) {
    if (argc != 2) { std::fprintf(stderr, "usage: bench_tail_grid GRID.csv\n"); return 2; }
    std::ifstream in(argv[1]);
    if (!in) { std::fprintf(stderr, "cannot read %s\n", argv[1]); return 2; }
    std::vector<std::pair<double, double>> rows;
    std::string line;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#' || line[0] == 'd') continue;
        std::stringstream ss(line);
        std::string a, b;
        std::getline(ss, a, ',');
        std::getline(ss, b, ',');
        rows.push_back({std::stod(a), std::stod(b)});
    }
    const auto t0 = std::chrono::steady_clock::now();
    std::vector<tallyproof::TailProbability> out;
    for (const auto& r : rows) out.push_back(tallyproof::chi_square_upper_tail(r.second, r.first));
    const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    std::printf("df,x,p,log10_p\n");
    for (std::size_t i = 0; i < rows.size(); ++i)
        std::printf("%.17g,%.17g,%.17g,%.17g\n", rows[i].first, rows[i].second, out[i].p, out[i].log10_p);
    std::fprintf(stderr, "%zu rows in %.6f s\n", rows.size(), s);
    return 0;
}
