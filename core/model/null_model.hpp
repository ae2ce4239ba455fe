// The null model: the expected share of every category under the analysis's model, whether
// stated (equal, shares, ratio, counts), a digit law, or a distribution fitted to the counts.
#pragma once
#include <string>
#include <vector>

#include "analysis.hpp"
#include "digit_laws.hpp"
#include "fit_distribution.hpp"
#include "status.hpp"

namespace tallyproof {

struct NullModel {
    std::vector<double> shares;              // one per category, summing to 1
    std::vector<ParameterValue> parameters;  // fitted models: every parameter, given or estimated
    int estimated_parameters = 0;            // m, parameters estimated from these counts
    std::string description;                 // e.g. "Poisson, mean estimated (0.610)"
    std::vector<std::string> warnings;
};

// The digit test behind a digit-law model kind (false for other kinds), and back.
bool digit_test_of(ModelKind kind, DigitTest* test);
ModelKind model_kind_of(DigitTest test);

// Builds the null model for `a` (observed counts already validated, total n > 0).
Status null_model(const Analysis& a, double n, NullModel* out);

}  // namespace tallyproof
