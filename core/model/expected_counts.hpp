// Expected counts from a model: the expected mix turned into counts that sum to N.
#pragma once
#include <vector>

#include "analysis.hpp"
#include "status.hpp"

namespace tallyproof {

// Fills `expected` (one per category) from `model`, for k categories with total `n`.
// Refuses values of the wrong length, negative or non-finite values and an all-zero mix.
// A notice about rescaling is appended to `warnings`.
Status expected_counts(const Model& model, std::size_t k, double n, std::vector<double>* expected,
                       std::vector<std::string>* warnings);

}  // namespace tallyproof
