// Validity of the chi-square approximation, judged from the expected counts alone: the
// smallest expected count, cells below 5 and below 1, the "all expected at least 5" rule and
// Cochran's rule (Cochran 1954, Biometrics 10:417-451: no expected count below 1 and at most
// 20% of them below 5). Exact counting; no approximation is involved.
#pragma once
#include <cstddef>
#include <string>
#include <vector>

#include "status.hpp"

namespace tallyproof {

struct ValidityReport {
    std::size_t categories = 0;     // k, the number of expected counts judged
    double min_expected = 0;        // smallest expected count
    std::size_t below_5 = 0;        // cells with expected count < 5
    std::size_t below_1 = 0;        // cells with expected count < 1
    double share_below_5 = 0;       // below_5 / k
    bool all_at_least_5 = false;    // every expected count >= 5
    bool cochran_holds = false;     // none below 1 and at most 20% below 5
    std::string summary;            // plain-language verdict naming the failing rule and remedies
};

// Judges `expected` (one count per category, at least one); refuses negative or non-finite values.
Status check_validity(const std::vector<double>& expected, ValidityReport* report);

// Cochran's rule on counts alone: none below 1 and below_5 at most 20% of k (exact integer test).
bool cochran_rule_holds(std::size_t k, std::size_t below_5, std::size_t below_1);

}  // namespace tallyproof
