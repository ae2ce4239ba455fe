// Chi-square goodness-of-fit power (Cohen 1988, ch. 7: lambda = N w^2, w = sqrt(sum (p1-p0)^2/p0))
// as the noncentral upper tail beyond the central critical value, the formula of R's pwr and of
// statsmodels' GofChisquarePower. Sample size: doubling then bisection on whole N, valid
// because the noncentral upper tail grows with lambda.
#include "power_analysis.hpp"

#include <cmath>
#include <cstdio>
#include <limits>
#include <string>

#include "chi_square_tail.hpp"
#include "noncentral_chi_square.hpp"
#include "number_format.hpp"

namespace tallyproof {
namespace {

std::string number(double v) { return format_general(v, 10); }

Status check_common(double alpha, double df) {
    if (!(alpha > 0 && alpha < 1)) return Status::failure("The significance level alpha = " + number(alpha) + " must lie strictly between 0 and 1.");
    if (!(df > 0) || std::isinf(df)) return Status::failure("The degrees of freedom df = " + number(df) + " must be a positive number.");
    // Tail sums are only checked to df = 1e6 (tests/reference/chi_square_tails.csv); far beyond,
    // they would not converge.
    if (df > 1e9) return Status::failure("The degrees of freedom df = " + number(df) + " are too many; at most 1e9.");
    return Status::success();
}

}  // namespace

double gof_power(double w, double n, double alpha, double df) {
    if (!(w >= 0) || std::isinf(w) || !(n >= 0) || std::isinf(n) || !check_common(alpha, df).ok)
        return std::numeric_limits<double>::quiet_NaN();
    const double critical = chi_square_critical_value(alpha, df);
    return noncentral_chi_square_upper_tail(critical, df, n * w * w);
}

Status cohens_w_of_alternative(const std::vector<double>& p0, const std::vector<double>& p1, double* w) {
    if (p0.size() < 2) return Status::failure("The null distribution needs at least 2 categories.");
    if (p1.size() != p0.size())
        return Status::failure("The alternative has " + std::to_string(p1.size()) + " shares but the null has " +
                               std::to_string(p0.size()) + ".");
    double s0 = 0, s1 = 0, sum = 0;
    for (std::size_t i = 0; i < p0.size(); ++i) {
        if (!(p0[i] > 0) || !std::isfinite(p0[i]))
            return Status::failure("Null share " + number(p0[i]) + " of category " + std::to_string(i + 1) + " must be positive.");
        if (!(p1[i] >= 0) || !std::isfinite(p1[i]))
            return Status::failure("Alternative share " + number(p1[i]) + " of category " + std::to_string(i + 1) + " must be non-negative.");
        s0 += p0[i];
        s1 += p1[i];
        sum += (p1[i] - p0[i]) * (p1[i] - p0[i]) / p0[i];
    }
    if (std::fabs(s0 - 1) > 1e-9) return Status::failure("The null shares sum to " + number(s0) + ", not 1.");
    if (std::fabs(s1 - 1) > 1e-9) return Status::failure("The alternative shares sum to " + number(s1) + ", not 1.");
    *w = std::sqrt(sum);
    return Status::success();
}

Status gof_power_for_alternative(const std::vector<double>& p0, const std::vector<double>& p1, double n, double alpha,
                                 double df, double* power) {
    double w = 0;
    Status s = cohens_w_of_alternative(p0, p1, &w);
    if (!s.ok) return s;
    if (!(n > 0) || std::isinf(n)) return Status::failure("The sample size N = " + number(n) + " must be positive.");
    s = check_common(alpha, df);
    if (!s.ok) return s;
    *power = gof_power(w, n, alpha, df);
    if (std::isnan(*power)) return Status::failure("The power could not be computed for N = " + number(n) + ".");
    return Status::success();
}

Status gof_sample_size(double w, double target_power, double alpha, double df, double* n) {
    if (!(w > 0) || std::isinf(w)) return Status::failure("The effect size w = " + number(w) + " must be positive.");
    if (!(target_power > 0 && target_power < 1))
        return Status::failure("The target power " + number(target_power) + " must lie strictly between 0 and 1.");
    Status s = check_common(alpha, df);
    if (!s.ok) return s;
    const double limit = 1e15;  // whole numbers stay exact in a double below 2^53
    double lo = 0, hi = 1;      // invariant: power(lo) < target (or lo = 0), power(hi) >= target
    while (!(gof_power(w, hi, alpha, df) >= target_power)) {
        lo = hi;
        hi *= 2;
        if (hi > limit) return Status::failure("No sample size up to 1e15 reaches power " + number(target_power) + ".");
    }
    while (hi - lo > 1) {
        const double mid = std::floor((lo + hi) / 2);
        if (gof_power(w, mid, alpha, df) >= target_power) hi = mid; else lo = mid;
    }
    *n = hi;
    return Status::success();
}

}  // namespace tallyproof
