// Benchmark (not a test): the exact p-value as an analysis runs it (exact_choice, 1 s budget) on the
// tables of tests/reference/exact_monte_carlo.csv, beside their 1e7-replicate NumPy Monte Carlo
// p_hat (generate_exact_monte_carlo.py): time, method, certified bracket at alpha = 0.05 and 0.01,
// whether it decides, and how far p_hat lies outside the bracket in standard errors (0 inside).
// tests/unit/test_exact_bracket.cpp checks the same rows against a 5 SE band.
#include <chrono>
#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

#include "../unit/reference_csv.hpp"
#include "exact_choice.hpp"
#include "exact_grid_bracket.hpp"

using namespace tallyproof;

int main() {
    const auto rows = tallyproof_test::reference_rows("exact_monte_carlo.csv");
    if (rows.empty()) {
        std::printf("tests/reference/exact_monte_carlo.csv not found\n");
        return 1;
    }
    std::printf("exact p (exact_choice, 1 s budget) against 1e7-replicate NumPy Monte Carlo (exact_monte_carlo.csv)\n");
    std::printf("%4s %5s %6s %11s %10s %8s %8s %12s %12s %10s %7s %7s  %s\n", "k", "N", "alpha", "p_hat", "se", "seconds", "rounds",
                "p_lower", "p_upper", "rel_width", "decides", "z_out", "table");
    for (const auto& row : rows) {
        MultinomialTestSpec spec;
        spec.observed = tallyproof_test::split_numbers(row[3]);
        spec.null_shares = tallyproof_test::split_numbers(row[4]);
        const double p_hat = std::stod(row[9]), se = std::stod(row[10]);
        for (double alpha : {0.05, 0.01}) {
            ExactChoiceOptions o;
            o.alpha = alpha;
            ExactJob job;
            const auto t0 = std::chrono::steady_clock::now();
            if (!exact_job_start(spec, o, &job).ok) return 1;
            while (!exact_job_step(&job, 1u << 20).done) {
            }
            ExactMultinomialResult r;
            const bool ok = exact_job_result(job, &r).ok;
            const double sec = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
            // Distance of p_hat outside [p_lower, p_upper] in standard errors (0 when inside).
            const double out = p_hat < r.p_lower ? (r.p_lower - p_hat) / se : p_hat > r.p_upper ? (p_hat - r.p_upper) / se : 0.0;
            std::printf("%4zu %5.0f %6.2f %11.6g %10.3g %8.3f %8d %12.6g %12.6g %10.3g %7d %7.2f  %s%s (%s)\n", spec.observed.size(),
                        std::stod(row[2]), alpha, p_hat, se, sec, job.grid ? job.grid->round : 0, r.p_lower, r.p_upper,
                        r.p_lower > 0 ? (r.p_upper - r.p_lower) / r.p_lower : INFINITY, bracket_decides(r.p_lower, r.p_upper, alpha) ? 1 : 0,
                        out, row[0].c_str(), ok ? "" : " FAILED", exact_method_name(job.method));
            std::fflush(stdout);
        }
    }
    return 0;
}
