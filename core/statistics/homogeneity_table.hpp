// The 2 x k table of a current sample against a previous (reference) sample under homogeneity:
// expected counts E_ij = r_i c_j / N, the power-divergence statistic over all 2k cells (Pearson
// 1900 for lambda = 1; Cressie and Read 1984), referred to chi2(k - 1), and Haberman's (1973,
// Biometrics 29:205-220) adjusted residuals (O - E) / sqrt(E (1 - r_i/N)(1 - c_j/N)), R's
// chisq.test()$stdres. Checked against SciPy 1.10 chi2_contingency and R 4.2 chisq.test.
#pragma once
#include <vector>

#include "status.hpp"

namespace tallyproof {

struct HomogeneityTable {
    std::vector<double> current, reference;                    // the two observed rows
    std::vector<double> expected_current, expected_reference;  // under homogeneity
    std::vector<double> pooled_shares;                         // c_j / N
    std::vector<double> contributions;                         // per column: both rows' terms
    std::vector<double> pearson_residuals;                     // current row: (O - E) / sqrt(E)
    std::vector<double> adjusted_residuals;                    // current row; the reference row's are their negatives
    double n_current = 0, n_reference = 0;
    double statistic = 0;                                      // sum of contributions
    double df = 0;                                             // k - 1
};

// Both rows: non-negative whole counts of the same length >= 2, each row total > 0, every
// column total > 0 (drop empty columns first). lambda as in power_divergence (> -1 when a cell is 0).
Status homogeneity_table(const std::vector<double>& current, const std::vector<double>& reference, double lambda,
                         HomogeneityTable* out);

// The statistic of a table with the same margins whose current row is `x` (reference row c - x).
double homogeneity_statistic(const HomogeneityTable& t, const std::vector<int>& x, double lambda);

}  // namespace tallyproof
