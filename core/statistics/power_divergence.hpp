// Cressie-Read power-divergence statistics 2/(l(l+1)) sum O[(O/E)^l - 1] for any real lambda
// (Cressie & Read 1984, JRSS B 46:440-464), with the limits G^2 (l = 0) and Kullback's modified
// likelihood ratio (l = -1), and Williams' (1976, Biometrika 63:33-37) correction of G^2.
// Per-category terms use the centred form (non-negative, summing to the statistic when the
// totals agree); relative accuracy about 1e-14 (checked against SciPy 1.10 and mpmath).
#pragma once
#include <string>
#include <vector>

#include "status.hpp"

namespace tallyproof {

// Named members of the family (Cressie & Read 1984, section 2; SciPy's `lambda_` names).
namespace power_lambda {
constexpr double pearson = 1.0;                // Pearson X^2
constexpr double log_likelihood = 0.0;         // G^2, likelihood ratio
constexpr double freeman_tukey = -0.5;         // Freeman-Tukey T^2 = 4 sum (sqrt O - sqrt E)^2
constexpr double mod_log_likelihood = -1.0;    // Kullback's minimum discrimination information
constexpr double neyman = -2.0;                // Neyman's modified X^2 = sum (O - E)^2 / O
constexpr double cressie_read = 2.0 / 3.0;     // Cressie & Read's recommended compromise
}  // namespace power_lambda

// The one name each named statistic goes by on the page, in the report and in the glossary:
// "Pearson χ²", "likelihood ratio G²", "Freeman-Tukey T²", "modified likelihood ratio GM²",
// "Neyman NM²", "Cressie-Read CR"; "" for an unnamed lambda.
const char* power_lambda_name(double lambda);
// Lambda as the page's statistic list writes it: "2/3", "−1/2", "−1", "−2", else up to four
// significant digits, negative values with a true minus sign.
std::string lambda_value_text(double lambda);
// The statistic's own symbol: "χ²" (Pearson), "G²" (likelihood ratio), "T²" (Freeman-Tukey),
// "GM²" (modified likelihood ratio), "NM²" (Neyman), "CR" (any other power-divergence lambda).
std::string statistic_symbol(double lambda);

struct PowerDivergenceOptions {
    double lambda = power_lambda::pearson;
    bool williams_correction = false;  // divide G^2 by Williams' q; only with lambda = 0
};

struct PowerDivergence {
    double lambda = 1.0;
    double statistic = 0;                // the sum, left to right, of `contributions`
    double williams_q = 1.0;             // 1 + (k + 1) / (6 N) when corrected, else 1
    std::vector<double> contributions;   // per category, >= 0, divided by williams_q if corrected
};

// One category's centred term 2/(l(l+1)) [O (O/E)^l - O - l (O - E)]; its sum over categories
// equals the power-divergence statistic whenever sum O = sum E. E must be > 0, O >= 0; gives
// +inf for O = 0 with lambda <= -1 (undefined there) and NaN for bad arguments.
double power_divergence_term(double observed, double expected, double lambda);

// The statistic for observed counts against expected counts (same length, totals agreeing to
// 1e-8 relative as SciPy >= 1.11 requires). Categories with E = 0 and O = 0 contribute 0; E = 0
// with O > 0, and O = 0 with lambda <= -1, are refused with a message naming the category.
Status power_divergence(const std::vector<double>& observed, const std::vector<double>& expected,
                        const PowerDivergenceOptions& options, PowerDivergence* out);

}  // namespace tallyproof
