// Validity rules for Pearson's X^2 from expected counts: the strict "all at least 5" rule
// (common practice) and Cochran's rule (Cochran 1954, Biometrics 10:417-451, on minimum
// expectations: up to one cell in five may fall below 5 provided none is below 1).
// The 20% share is tested in integers (5 * below_5 <= k) so no rounding can flip the verdict.
#include "validity.hpp"

#include <cmath>
#include <cstdio>

#include "number_format.hpp"

namespace tallyproof {

bool cochran_rule_holds(std::size_t k, std::size_t below_5, std::size_t below_1) {
    return k > 0 && below_1 == 0 && 5 * below_5 <= k;
}

Status check_validity(const std::vector<double>& expected, ValidityReport* report) {
    *report = ValidityReport{};
    const std::size_t k = expected.size();
    if (k == 0) return Status::failure("There are no expected counts to judge.");
    for (std::size_t i = 0; i < k; ++i) {
        const double e = expected[i];
        if (!std::isfinite(e) || e < 0) {
            char buf[160];
            std::snprintf(buf, sizeof buf, "Expected count %g for category %zu must be a non-negative number.", e, i + 1);
            return Status::failure(buf);
        }
    }
    ValidityReport& r = *report;
    r.categories = k;
    r.min_expected = expected[0];
    for (double e : expected) {
        if (e < r.min_expected) r.min_expected = e;
        if (e < 5) ++r.below_5;
        if (e < 1) ++r.below_1;
    }
    r.share_below_5 = static_cast<double>(r.below_5) / static_cast<double>(k);
    r.all_at_least_5 = r.below_5 == 0;
    r.cochran_holds = cochran_rule_holds(k, r.below_5, r.below_1);

    const std::string of_k = " of " + std::to_string(k);
    const std::string remedies =
        " Remedies: merge thin categories (on expected counts, never on observed ones), or use an exact "
        "or Monte Carlo p-value instead of the chi-square approximation.";
    if (r.all_at_least_5) {
        r.summary = "Every expected count is at least 5 (smallest " + format_significant(r.min_expected, 3) +
                    "): the chi-square approximation is adequate by the usual rules.";
    } else if (r.cochran_holds) {
        r.summary = std::to_string(r.below_5) + of_k + " expected counts are below 5 (smallest " +
                    format_significant(r.min_expected, 3) +
                    "), so the strict rule (all at least 5) fails, but Cochran's rule holds (none below 1, "
                    "at most 20% below 5): the chi-square approximation is acceptable.";
    } else {
        std::string why;
        if (r.below_1 > 0)
            why = std::to_string(r.below_1) + of_k + " expected counts are below 1 (smallest " +
                  format_significant(r.min_expected, 3) + ")";
        if (5 * r.below_5 > k) {
            char pct[32];
            std::snprintf(pct, sizeof pct, "%.0f%%", 100.0 * r.share_below_5);
            if (!why.empty()) why += " and ";
            why += std::to_string(r.below_5) + of_k + " (" + pct + ") are below 5, more than the 20% allowed";
        }
        r.summary = "Cochran's rule fails: " + why +
                    ". The chi-square approximation may be poor and its p-value unreliable." + remedies;
    }
    return Status::success();
}

}  // namespace tallyproof
