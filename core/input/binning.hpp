// Binning: raw measurements counted into bins [e_i, e_{i+1}) with given edges, K bins of equal
// width between the smallest and largest value (the last bin closed at the maximum), as in R's
// hist and cut (R Core Team, "R: A Language and Environment", cut/hist docs), or K bins of equal
// probability under a normal, lognormal or exponential model fitted to the values
// (equal_probability_bins: maximum likelihood, quantiles i/K). Exact counts.
#pragma once
#include <string>
#include <vector>

#include "raw_observations.hpp"

namespace tallyproof {

// "[10, 20)", "[90, 100]" for the last closed bin, "[-inf, 0)" for open ends; edges written to
// `digits` significant digits.
std::string bin_label(double lo, double hi, bool closed_right, int digits = 6);

// Counts the numbers of `src` into bins; out->edges, categories and observed are filled.
// Equal-probability bins also set out->bin_model and out->bin_parameters (the model that placed
// them and its given parameters); values outside the model's support are refused, located.
void count_into_bins(const RawSource& src, const BinChoice& bins, ParsedInput* out);

}  // namespace tallyproof
