// Simultaneous confidence intervals for multinomial proportions: Goodman (1965, Technometrics
// 7:247-254), Wilson-type intervals at the chi2(1) quantile 1 - alpha/k, exact to the quantile's
// precision; and Sison and Glaz (1995, JASA 90:366-369), whose coverage nu(c) is approximated by
// an Edgeworth expansion of truncated Poisson moments (accuracy that of the expansion, see paper).
#pragma once
#include <vector>

#include "status.hpp"

namespace tallyproof {

struct ProportionInterval {
    double lower = 0;
    double upper = 0;
};

// Sison-Glaz details: c with nu(c) < confidence < nu(c + 1), and gamma = (confidence - nu(c)) /
// (nu(c + 1) - nu(c)), which widens every upper bound by 2 gamma / n.
struct SisonGlazDetail {
    double c = 0;
    double gamma = 0;
    double coverage_c = 0;       // nu(c)
    double coverage_c_plus_1 = 0;  // nu(c + 1)
};

// Goodman's intervals, one per category, for whole counts `observed` (k >= 2, total > 0).
Status goodman_intervals(const std::vector<double>& observed, double confidence,
                         std::vector<ProportionInterval>* intervals);
// The same at confidence 1 - alpha given by alpha itself, so any alpha down to the smallest the
// chi-square quantile resolves (about 1e-300) keeps its value (1 - 1e-17 is 1 in double).
Status goodman_intervals_at_alpha(const std::vector<double>& observed, double alpha,
                                  std::vector<ProportionInterval>* intervals);

// Sison-Glaz intervals, one per category; `detail` (may be null) receives c, gamma and nu.
Status sison_glaz_intervals(const std::vector<double>& observed, double confidence,
                            std::vector<ProportionInterval>* intervals, SisonGlazDetail* detail = nullptr);

// Sison-Glaz's approximation to nu(c) = P(x_i - c <= X_i <= x_i + c for all i) for X
// multinomial(n, x / n), for whole c >= 1; c = 0 gives the exact multinomial probability of x.
// NaN for bad arguments.
double sison_glaz_coverage(const std::vector<double>& observed, double c);

}  // namespace tallyproof
