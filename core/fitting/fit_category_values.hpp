// Category values: reads labels of ordered whole-number categories ("0", "3-4", "5 or more",
// "≤ 2") as integer ranges, so discrete distributions can be fitted to them.
#pragma once
#include <string>
#include <vector>

#include "fit_discrete.hpp"
#include "status.hpp"

namespace tallyproof {

// Each label becomes an IntegerBin; "5 or more", "5+", "≥5", ">=5", "at least 5" open the last
// bin; "2 or fewer", "2 or less", "≤2", "<=2", "up to 2" open the first. Refuses a label that
// is not of these forms, naming it, and bins out of order.
Status integer_bins_from_labels(const std::vector<std::string>& labels, std::vector<IntegerBin>* bins);

}  // namespace tallyproof
