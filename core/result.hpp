// Result: the one record every front end draws from (page, command-line tool, reports).
// Nothing shown to a user is recomputed outside core/.
#pragma once
#include <string>
#include <vector>

#include "chi_square_tail.hpp"
#include "status.hpp"

namespace tallyproof {

struct Result {
    Status status;                          // !status.ok: only `status` and `warnings` are set
    std::vector<std::string> categories;    // as used
    std::vector<double> observed;
    std::vector<double> expected_counts;
    std::vector<double> contributions;      // (O - E)^2 / E, summing to the statistic
    std::vector<double> pearson_residuals;  // (O - E) / sqrt(E)
    double n = 0;                           // total observed count
    double statistic = 0;                   // Pearson X^2
    double df = 0;                          // degrees of freedom
    TailProbability upper;                  // P(chi2(df) >= statistic), the p-value
    double alpha = 0.05;
    double critical_value = 0;              // upper alpha quantile of chi2(df)
    bool reject = false;                    // statistic beyond the critical value
    double min_expected = 0;                // smallest expected count
    std::vector<std::string> warnings;      // plain-language notes for the user
};

}  // namespace tallyproof
