// Chi-square tails as regularized incomplete gamma functions, Q(df/2, x/2) upper and
// P(df/2, x/2) lower, each from core/numerics/log_incomplete_gamma (series / continued fraction with a
// double-double exponent, to a few ulps wherever p is a normal double). Critical values from Boost's
// quantile, or for alpha given as log10 by safeguarded Newton steps on ln Q (Press et al. 2007, 9.4).
#include "chi_square_tail.hpp"

#include <cmath>
#include <limits>

#include <boost/math/distributions/chi_squared.hpp>

#include "log_incomplete_gamma.hpp"
#include "math_policy.hpp"

namespace tallyproof {
namespace {

constexpr double kLn10 = 2.302585092994045684;
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

bool bad_df(double df) { return !(df > 0) || std::isinf(df); }

}  // namespace

TailProbability chi_square_upper_tail(double x, double df) {
    if (bad_df(df) || std::isnan(x)) return {kNaN, kNaN};
    if (x <= 0) return {1.0, 0.0};
    const GammaTail q = upper_incomplete_gamma_tail(df / 2, x / 2);
    return {q.value, q.log_value / kLn10};
}

TailProbability chi_square_lower_tail(double x, double df) {
    if (bad_df(df) || std::isnan(x)) return {kNaN, kNaN};
    if (x <= 0) return {0.0, -std::numeric_limits<double>::infinity()};
    const GammaTail p = lower_incomplete_gamma_tail(df / 2, x / 2);
    return {p.value, p.log_value / kLn10};
}

double chi_square_density(double x, double df) {
    if (bad_df(df) || std::isnan(x)) return kNaN;
    if (x < 0) return 0.0;
    if (x == 0) return df < 2 ? std::numeric_limits<double>::infinity() : (df == 2 ? 0.5 : 0.0);
    boost::math::chi_squared_distribution<double, quiet_policy> dist(df);
    return boost::math::pdf(dist, x);
}

double chi_square_critical_value(double alpha, double df) {
    if (bad_df(df) || !(alpha > 0) || !(alpha < 1)) return kNaN;
    boost::math::chi_squared_distribution<double, quiet_policy> dist(df);
    return boost::math::quantile(boost::math::complement(dist, alpha));
}

double chi_square_critical_value_log10(double log10_alpha, double df) {
    if (bad_df(df) || !(log10_alpha <= 0) || std::isinf(log10_alpha)) return kNaN;
    if (log10_alpha == 0) return 0.0;
    if (log10_alpha > -300) return chi_square_critical_value(std::pow(10.0, log10_alpha), df);
    // Solve g(z) = ln Q(a, z) - target = 0 in z = x/2. g falls monotonically; its slope is
    // -density/Q, i.e. -exp(ln prefix - ln z - ln Q). Start from the alpha = 1e-300 point, which
    // lies below the root, and keep a bracket so a poor Newton step falls back to bisection.
    const double a = df / 2, target = log10_alpha * kLn10;
    double lo = chi_square_critical_value(1e-300, df) / 2;
    if (!std::isfinite(lo) || !(lo > 0)) return kNaN;
    double hi = lo;
    for (int i = 0; i < 2000; ++i) {
        hi *= 2;
        if (!std::isfinite(hi)) return kNaN;
        if (log_gamma_q(a, hi) < target) break;
    }
    double z = lo;
    for (int i = 0; i < 200; ++i) {
        const double log_q = log_gamma_q(a, z);
        const double g = log_q - target;
        if (g > 0) lo = z; else hi = z;
        const double slope = -std::exp(log_gamma_prefix(a, z) - std::log(z) - log_q);
        double next = z - g / slope;
        if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
        if (std::fabs(next - z) <= 4e-16 * z || hi - lo <= 4e-16 * hi) { z = next; break; }
        z = next;
    }
    return 2 * z;
}

}  // namespace tallyproof
