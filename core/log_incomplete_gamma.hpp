// Logarithms of the regularized incomplete gamma functions P(a, x) and Q(a, x), finite where the
// functions themselves underflow a double. For a < 50 Boost.Math (DiDonato and Morris 1986, ACM
// TOMS 12:377) while the value is a normal double; otherwise the series and Legendre continued
// fraction (Press et al., Numerical Recipes 3rd ed. 2007, 6.2) summed in log space.
// Accuracy (tests/reference/chi_square_tails.csv): value within max(1e-14, 2^-52 (4 abs(ln p) +
// sqrt(2a)/10)) relative (the exp of a rounded exponent), ln value within ~1e-15 relative.
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
