// Per-category diagnostics for a chi-square goodness-of-fit test: contributions to X^2, Pearson
// and adjusted residuals (Haberman 1973, Biometrics 29:205-220), exact binomial p-values per
// category adjusted for multiplicity (Holm 1979 by default), and simultaneous intervals for the
// observed shares (Goodman 1965; Sison and Glaz 1995). Accuracy: that of the parts named.
#pragma once
#include <string>
#include <vector>

#include "chi_square_tail.hpp"
#include "multiplicity.hpp"
#include "simultaneous_intervals.hpp"
#include "status.hpp"

namespace tallyproof {

// Sison-Glaz compares its coverage nu(c), computed as nu itself, with 1 - alpha: below this alpha
// double precision no longer tells them apart, so only Goodman's intervals (from alpha) are given.
constexpr double kMinSisonGlazAlpha = 1e-10;
constexpr double kMaxSisonGlazTotal = 1e8;      // above it only Goodman's intervals (bounded time)

struct CategoryDiagnosticsOptions {
    double alpha = 0.05;  // flags a category at adjusted p < alpha; intervals at 1 - alpha
    MultiplicityMethod adjustment = MultiplicityMethod::holm;
};

struct CategoryDiagnostic {
    std::string label;
    double observed = 0;            // O
    double expected = 0;            // E
    double difference = 0;          // O - E
    double observed_share = 0;      // O / n
    double expected_share = 0;      // p = E / sum E
    double contribution = 0;        // (O - E)^2 / E
    double contribution_share = 0;  // contribution / X^2 (0 when X^2 = 0)
    double pearson_residual = 0;    // (O - E) / sqrt(E)
    double adjusted_residual = 0;   // (O - E) / sqrt(E (1 - p)), R's chisq.test()$stdres
    TailProbability binomial;       // exact two-sided binom.test(O, n, p) p-value
    TailProbability adjusted;       // after the multiplicity adjustment
    ProportionInterval goodman;     // simultaneous 1 - alpha interval for the observed share (NaN: see warnings)
    ProportionInterval sison_glaz;  // simultaneous 1 - alpha interval (NaN if it failed or was not computed)
    bool drives_result = false;     // adjusted p < alpha
    std::string direction;          // "more than expected", "fewer than expected", "as expected"
    std::string description;        // e.g. "B: more than expected (30 observed vs 20.0 expected)"
};

struct CategoryDiagnostics {
    std::vector<CategoryDiagnostic> categories;
    double statistic = 0;                // X^2, the sum of the contributions
    double alpha = 0.05;
    MultiplicityMethod adjustment = MultiplicityMethod::holm;
    SisonGlazDetail sison_glaz;          // c and gamma behind the Sison-Glaz intervals
    std::vector<std::size_t> drivers;    // 0-based indices of the flagged categories
    std::string rule;                    // the one rule that makes a driver, in words ("Holm-adjusted exact binomial p below 0.05")
    std::string summary;                 // plain-language account of the drivers
    std::vector<std::string> warnings;   // e.g. intervals that could not be computed
};

// The drivers sentence, one wording for every path: "2 of 6 categories drive the result (TEST): ...",
// "1 of 6 categories drives ...", or "No single category NONE_PHRASE (TEST for none of the 6 categories)."
std::string drivers_summary(std::size_t drivers, std::size_t k, const std::string& test, const std::string& described,
                            const std::string& none_phrase);

// Diagnoses each category from whole observed counts and expected counts summing to the
// observed total (as from expected_counts()). Refuses zero or negative expected counts,
// mismatched lengths or totals, fewer than two categories and alpha outside (0, 1).
Status category_diagnostics(const std::vector<std::string>& labels, const std::vector<double>& observed,
                            const std::vector<double>& expected, const CategoryDiagnosticsOptions& options,
                            CategoryDiagnostics* result);

}  // namespace tallyproof
