// Chi-square tails via Boost.Math's regularized incomplete gamma: Q(df/2, x/2) for the upper
// tail and P(df/2, x/2) for the lower (DiDonato and Morris 1986, as implemented in Boost 1.74).
// log10 of a tail that underflows a double falls back to the leading term of the asymptotic
// expansion of the incomplete gamma function (Abramowitz and Stegun 6.5.32).
#include "chi_square_tail.hpp"

#include <cmath>
#include <limits>

#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/special_functions/gamma.hpp>

#include "math_policy.hpp"

namespace tallyproof {
namespace {

constexpr double kLn10 = 2.302585092994045684;

// log of the upper regularized incomplete gamma Q(a, z) for large z where Q underflows:
// Q(a, z) ~ z^(a-1) e^(-z) / Gamma(a) * sum_k (a-1)(a-2)...(a-k) / z^k.
double log_upper_gamma_asymptotic(double a, double z) {
    double sum = 1.0, term = 1.0;
    for (int k = 1; k < 60; ++k) {
        term *= (a - k) / z;
        if (std::fabs(term) < 1e-17 * std::fabs(sum)) break;
        sum += term;
    }
    return (a - 1.0) * std::log(z) - z - std::lgamma(a) + std::log(sum);
}

}  // namespace

TailProbability chi_square_upper_tail(double x, double df) {
    const double nan = std::numeric_limits<double>::quiet_NaN();
    if (!(df > 0) || std::isnan(x)) return {nan, nan};
    if (x <= 0) return {1.0, 0.0};
    const double a = df / 2, z = x / 2;
    const double q = boost::math::gamma_q(a, z, quiet_policy());
    if (q > 0 && std::isfinite(q)) return {q, std::log10(q)};
    return {0.0, log_upper_gamma_asymptotic(a, z) / kLn10};
}

TailProbability chi_square_lower_tail(double x, double df) {
    const double nan = std::numeric_limits<double>::quiet_NaN();
    if (!(df > 0) || std::isnan(x)) return {nan, nan};
    if (x <= 0) return {0.0, -std::numeric_limits<double>::infinity()};
    const double p = boost::math::gamma_p(df / 2, x / 2, quiet_policy());
    return {p, p > 0 ? std::log10(p) : -std::numeric_limits<double>::infinity()};
}

double chi_square_density(double x, double df) {
    if (!(df > 0) || std::isnan(x)) return std::numeric_limits<double>::quiet_NaN();
    if (x < 0) return 0.0;
    if (x == 0) return df < 2 ? std::numeric_limits<double>::infinity() : (df == 2 ? 0.5 : 0.0);
    boost::math::chi_squared_distribution<double, quiet_policy> dist(df);
    return boost::math::pdf(dist, x);
}

double chi_square_critical_value(double alpha, double df) {
    if (!(df > 0) || !(alpha > 0) || !(alpha < 1)) return std::numeric_limits<double>::quiet_NaN();
    boost::math::chi_squared_distribution<double, quiet_policy> dist(df);
    return boost::math::quantile(boost::math::complement(dist, alpha));
}

}  // namespace tallyproof
