// Adjustment of p-values for multiplicity, as R's p.adjust: Holm (1979, Scand. J. Statist.
// 6:65-70) step-down, Bonferroni, and Benjamini-Hochberg (1995, JRSS B 57:289-300) false
// discovery rate step-up. Same arithmetic as R 4.2's p.adjust, so results agree to the last bits.
#pragma once
#include <string>
#include <vector>

#include "status.hpp"

namespace tallyproof {

enum class MultiplicityMethod {
    holm,                // family-wise error, step-down (the default)
    bonferroni,          // family-wise error, single step
    benjamini_hochberg,  // false discovery rate, step-up ("BH" in R)
    none,                // unadjusted
};

const char* multiplicity_method_name(MultiplicityMethod method);  // "holm", "bonferroni", "BH", "none"
bool multiplicity_method_from_name(const std::string& name, MultiplicityMethod* method);  // false if unknown

// Adjusted p-values, one per input, as p.adjust(p, method). Refuses values outside [0, 1] or NaN.
Status adjust_p_values(const std::vector<double>& p, MultiplicityMethod method, std::vector<double>* adjusted);

// The same adjustment carried out on log10 p-values, for p-values below the double range.
// Refuses NaN and values above 0; -inf (a p-value of exactly 0) is allowed.
Status adjust_log10_p_values(const std::vector<double>& log10_p, MultiplicityMethod method,
                             std::vector<double>* adjusted);

}  // namespace tallyproof
