// Cohen's w (Cohen 1988, ch. 7) and Fei (Ben-Shachar et al. 2023, Mathematics 11(9):1982, eq. for
// goodness of fit: Fei = sqrt(X2 / (N (1/p_min - 1))), bounded to [0, 1]). Intervals invert the
// noncentral chi-square in lambda (Steiger and Fouladi 1997, "Noncentrality interval estimation")
// by bisection, which is safe because the upper tail at fixed X2 rises monotonically with lambda.
#include "effect_size.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <string>

#include "noncentral_chi_square.hpp"

namespace tallyproof {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

std::string number(double v) {
    char buf[40];
    std::snprintf(buf, sizeof buf, "%.10g", v);
    return buf;
}

// lambda with f(lambda) = target for f falling in lambda from f(0) > target; bisection to
// 1e-13 relative (about 50 steps after the bracket is found).
template <class F>
double solve_falling(F f, double target, double start) {
    double lo = 0, hi = std::max(start, 1.0);
    while (f(hi) > target) {
        lo = hi;
        hi *= 2;
        if (hi > 1e300) return kNaN;
    }
    for (int i = 0; i < 200 && hi - lo > 1e-13 * hi; ++i) {
        const double mid = 0.5 * (lo + hi);
        if (f(mid) > target) lo = mid; else hi = mid;
    }
    return 0.5 * (lo + hi);
}

Status check_statistic(double chi_square, double n) {
    if (!(chi_square >= 0) || std::isinf(chi_square))
        return Status::failure("The chi-square statistic " + number(chi_square) + " must be a non-negative number.");
    if (!(n > 0) || std::isinf(n)) return Status::failure("The sample size N = " + number(n) + " must be positive.");
    return Status::success();
}

}  // namespace

double cohens_w(double chi_square, double n) {
    if (!check_statistic(chi_square, n).ok) return kNaN;
    return std::sqrt(chi_square / n);
}

double noncentral_w(double chi_square, double n, double df) {
    if (!check_statistic(chi_square, n).ok || !(df > 0)) return kNaN;
    return std::sqrt(std::max(0.0, chi_square - df) / n);
}

const char* cohens_w_label(double w) {
    if (!(w >= 0)) return "undefined";
    if (w < 0.1) return "very small";
    if (w < 0.3) return "small";
    if (w < 0.5) return "medium";
    return "large";
}

double fei(double chi_square, double n, double p_min) {
    if (!check_statistic(chi_square, n).ok || !(p_min > 0 && p_min < 1)) return kNaN;
    return std::min(1.0, std::sqrt(chi_square / (n * (1 / p_min - 1))));
}

double noncentral_fei(double chi_square, double n, double df, double p_min) {
    if (!check_statistic(chi_square, n).ok || !(df > 0) || !(p_min > 0 && p_min < 1)) return kNaN;
    return std::min(1.0, std::sqrt(std::max(0.0, chi_square - df) / (n * (1 / p_min - 1))));
}

Status noncentrality_interval(double chi_square, double df, double level, double* lambda_low, double* lambda_high) {
    if (!(chi_square >= 0) || std::isinf(chi_square))
        return Status::failure("The chi-square statistic " + number(chi_square) + " must be a non-negative number.");
    if (!(df > 0) || std::isinf(df)) return Status::failure("The degrees of freedom df = " + number(df) + " must be positive.");
    if (!(level > 0 && level < 1)) return Status::failure("The confidence level " + number(level) + " must lie strictly between 0 and 1.");
    const double tail = (1 - level) / 2;
    // Lower end: P(X >= X2; lambda) rises with lambda; if already >= tail at 0, the end is 0.
    auto lower_tail = [&](double lambda) { return noncentral_chi_square_lower_tail(chi_square, df, lambda); };
    auto upper_tail = [&](double lambda) { return noncentral_chi_square_upper_tail(chi_square, df, lambda); };
    if (upper_tail(0) >= tail) {
        *lambda_low = 0;
    } else {
        *lambda_low = solve_falling([&](double l) { return -upper_tail(l); }, -tail, chi_square);
    }
    if (lower_tail(0) <= tail) {
        *lambda_high = 0;
    } else {
        *lambda_high = solve_falling(lower_tail, tail, chi_square);
    }
    if (std::isnan(*lambda_low) || std::isnan(*lambda_high))
        return Status::failure("The noncentrality interval could not be found for χ² = " + number(chi_square) + ".");
    return Status::success();
}

Status cohens_w_interval(double chi_square, double n, double df, double level, EffectSizeInterval* out) {
    Status s = check_statistic(chi_square, n);
    if (!s.ok) return s;
    double lo = 0, hi = 0;
    s = noncentrality_interval(chi_square, df, level, &lo, &hi);
    if (!s.ok) return s;
    *out = {cohens_w(chi_square, n), std::sqrt(lo / n), std::sqrt(hi / n), level};
    return Status::success();
}

Status fei_interval(double chi_square, double n, double df, double p_min, double level, EffectSizeInterval* out) {
    Status s = check_statistic(chi_square, n);
    if (!s.ok) return s;
    if (!(p_min > 0 && p_min < 1))
        return Status::failure("The smallest expected share p_min = " + number(p_min) + " must lie strictly between 0 and 1.");
    double lo = 0, hi = 0;
    s = noncentrality_interval(chi_square, df, level, &lo, &hi);
    if (!s.ok) return s;
    const double scale = n * (1 / p_min - 1);
    *out = {fei(chi_square, n, p_min), std::min(1.0, std::sqrt(lo / scale)), std::min(1.0, std::sqrt(hi / scale)), level};
    return Status::success();
}

EffectOutcome effect_outcome(double chi_square, double n, double df, double p_min) {
    EffectOutcome e;
    e.w = cohens_w(chi_square, n);
    e.w_label = cohens_w_label(e.w);
    e.estimate = noncentral_w(chi_square, n, df);
    e.label = cohens_w_label(e.estimate);
    if (!cohens_w_interval(chi_square, n, df, 0.95, &e.w_interval).ok) e.w_interval = {e.estimate, kNaN, kNaN, 0.95};
    e.w_interval.estimate = e.estimate;
    if (p_min > 0 && p_min < 1) {
        e.fei_defined = true;
        e.fei = noncentral_fei(chi_square, n, df, p_min);
        if (!fei_interval(chi_square, n, df, p_min, 0.95, &e.fei_interval).ok) e.fei_interval = {e.fei, kNaN, kNaN, 0.95};
        e.fei_interval.estimate = e.fei;
    }
    return e;
}

}  // namespace tallyproof
