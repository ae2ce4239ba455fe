// ReferenceSampleOutcome: the part of a Result that only a comparison with a previous sample
// has (model kind reference-sample): the previous sample's row of the 2 x k table, its expected
// counts under homogeneity, the 2 x k adjusted residuals and per-category 2 x 2 tests, and the
// validity of each row. The common fields (statistic, df, p, expected counts of the current
// sample, effect size, validity of all 2k cells) stay in Result with the same meaning.
#pragma once
#include <string>
#include <vector>

#include "chi_square_tail.hpp"
#include "validity.hpp"

namespace tallyproof {

struct ReferenceSampleOutcome {
    std::vector<double> reference;              // the previous sample's counts, one per category as read
    double n_reference = 0;                     // its total
    double n_total = 0;                         // both samples together
    std::vector<double> tested_reference;       // per tested cell (after merging both rows together)
    std::vector<double> expected_reference;     // expected counts of the previous sample under homogeneity
    std::vector<double> pooled_shares;          // per tested cell: (current + previous) / n_total
    std::vector<double> adjusted_residuals;     // current row of the 2 x k table (R's chisq.test()$stdres[1, ])
    std::vector<TailProbability> category_p;    // each category against the rest: 2 x 2 X² = residual², df 1
    std::vector<double> category_p_adjusted;    // Holm (1979)
    ValidityReport validity_current;            // expected counts of the current row
    ValidityReport validity_reference;          // expected counts of the previous sample's row
    double exact_tables = 0;                    // tables enumerated for the exact conditional p-value
};

}  // namespace tallyproof
