// Benchmark (not a test): worst relative error of the chi-square tails against the 50-digit
// mpmath grid tests/reference/chi_square_tails.csv, next to Boost 1.74's gamma_q / gamma_p, and
// evaluation speed. Build: g++ -std=c++17 -O2 -Icore -DTALLYPROOF_REFERENCE_DIR=\"$PWD/tests/reference\"
//   tests/bench/bench_tails.cpp core/numerics/chi_square_tail.cpp core/numerics/log_incomplete_gamma.cpp -o /tmp/bench_tails
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <limits>
#include <sstream>
#include <string>
#include <vector>

#include <boost/math/special_functions/gamma.hpp>

#include "chi_square_tail.hpp"
#include "math_policy.hpp"

using namespace tallyproof;

struct Row { double df, x, lu, ll, u, l; };

int main() {
    std::ifstream in(std::string(TALLYPROOF_REFERENCE_DIR) + "/chi_square_tails.csv");
    std::vector<Row> rows;
    std::string line;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#' || line[0] == 'd') continue;
        std::stringstream ss(line);
        std::string c[6];
        for (auto& s : c) std::getline(ss, s, ',');
        rows.push_back({std::strtod(c[0].c_str(), nullptr), std::strtod(c[1].c_str(), nullptr), std::strtod(c[2].c_str(), nullptr),
                        std::strtod(c[3].c_str(), nullptr), std::strtod(c[4].c_str(), nullptr), std::strtod(c[5].c_str(), nullptr)});
    }
    double worst_p = 0, worst_boost = 0, worst_log = 0, worst_p_small_e = 0;
    Row at_p{}, at_boost{};
    for (const Row& r : rows) {
        const TailProbability u = chi_square_upper_tail(r.x, r.df), l = chi_square_lower_tail(r.x, r.df);
        const double bu = boost::math::gamma_q(r.df / 2, r.x / 2, quiet_policy());
        const double bl = boost::math::gamma_p(r.df / 2, r.x / 2, quiet_policy());
        const double pairs[2][4] = {{u.p, bu, r.u, u.log10_p - r.lu}, {l.p, bl, r.l, l.log10_p - r.ll}};
        const double refs_log[2] = {r.lu, r.ll};
        for (int k = 0; k < 2; ++k) {
            const double ref = pairs[k][2];
            if (ref >= std::numeric_limits<double>::min()) {  // a normal double
                const double e = std::fabs(pairs[k][0] - ref) / ref, eb = std::fabs(pairs[k][1] - ref) / ref;
                if (e > worst_p) { worst_p = e; at_p = r; }
                if (eb > worst_boost) { worst_boost = eb; at_boost = r; }
                if (std::fabs(std::log(ref)) < 11.5) worst_p_small_e = std::max(worst_p_small_e, e);
            } else {
                worst_log = std::max(worst_log, std::fabs(pairs[k][3]) / std::fabs(refs_log[k]));
            }
        }
    }
    std::printf("grid rows: %zu (both tails each)\n", rows.size());
    std::printf("worst relative error of p (p a normal double): %.3g at df=%g x=%g\n", worst_p, at_p.df, at_p.x);
    std::printf("  same, only where p > 1e-5 (|ln p| < 11.5):    %.3g\n", worst_p_small_e);
    std::printf("  Boost 1.74 gamma_q/gamma_p on the same rows:  %.3g at df=%g x=%g\n", worst_boost, at_boost.df, at_boost.x);
    std::printf("worst relative error of log10 p (p below):     %.3g\n", worst_log);

    // Speed: whole grid, both tails, repeated; then three fixed regions.
    auto time_it = [](const char* what, auto&& f, int reps) {
        const auto t0 = std::chrono::steady_clock::now();
        double sink = 0;
        long calls = 0;
        for (int i = 0; i < reps; ++i) calls += f(&sink);
        const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
        std::printf("%-46s %8.3f us/call (%ld calls, checksum %.3g)\n", what, 1e6 * s / calls, calls, sink);
    };
    time_it("grid, upper + lower tail", [&](double* sink) {
        for (const Row& r : rows) *sink += chi_square_upper_tail(r.x, r.df).log10_p + chi_square_lower_tail(r.x, r.df).log10_p;
        return static_cast<long>(2 * rows.size());
    }, 20);
    time_it("df 1..30, x near the 5% point (fraction)", [&](double* sink) {
        for (int df = 1; df <= 30; ++df) *sink += chi_square_upper_tail(df + 2 * std::sqrt(2.0 * df), df).p;
        return 30L;
    }, 2000);
    time_it("df 1e6, x = df + 1 sd (continued fraction)", [&](double* sink) {
        *sink += chi_square_upper_tail(1e6 + 1414, 1e6).p;
        return 1L;
    }, 2000);
    time_it("df 1e6, x = df + 4 (continued fraction)", [&](double* sink) {
        *sink += chi_square_upper_tail(1e6 + 4, 1e6).p;
        return 1L;
    }, 1000);
    time_it("df 1e6, x = df - 1 sd (power series)", [&](double* sink) {
        *sink += chi_square_lower_tail(1e6 - 1414, 1e6).p;
        return 1L;
    }, 1000);
    time_it("df 1e6, x = df (power series)", [&](double* sink) {
        *sink += chi_square_lower_tail(1e6, 1e6).p;
        return 1L;
    }, 1000);
    time_it("df 10, x = 1e5 (underflow, continued fraction)", [&](double* sink) {
        *sink += chi_square_upper_tail(1e5, 10).log10_p;
        return 1L;
    }, 20000);
    return 0;
}
