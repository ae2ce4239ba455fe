// Logarithms of the regularized incomplete gamma functions P(a, x) and Q(a, x), finite where the
// functions themselves underflow a double. Series and Legendre continued fraction times a prefix
// whose logarithm is formed in double-double (core/base/double_double.hpp); Boost.Math (DiDonato and
// Morris 1986) only for a < 1/4. Accuracy (tests/reference/chi_square_tails.csv): value within
// 1e-14 relative wherever it is a normal double (measured 2.9e-16), ln value within ~1e-16 relative.
#pragma once

namespace tallyproof {

// A regularized incomplete gamma value with its natural logarithm (finite even where value is 0).
struct GammaTail {
    double value = 1.0;
    double log_value = 0.0;
};

GammaTail upper_incomplete_gamma_tail(double a, double x);  // Q(a, x) and ln Q(a, x); NaN if a <= 0 or x < 0
GammaTail lower_incomplete_gamma_tail(double a, double x);  // P(a, x) and ln P(a, x); NaN if a <= 0 or x < 0
double log_gamma_q(double a, double x);                      // ln Q(a, x)
double log_gamma_p(double a, double x);                      // ln P(a, x)
double log_gamma_prefix(double a, double x);                 // ln(x^a e^-x / Gamma(a)), x > 0

}  // namespace tallyproof
