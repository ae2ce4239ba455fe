// Binning: raw measurements counted into bins [e_i, e_{i+1}) with given edges, or K bins of
// equal width between the smallest and largest value (the last bin closed at the maximum), as
// in R's hist and cut (R Core Team, "R: A Language and Environment", cut/hist docs). Exact counts.
#pragma once
#include <string>
#include <vector>

#include "raw_observations.hpp"

namespace tallyproof {

// "[10, 20)", "[90, 100]" for the last closed bin, "[-inf, 0)" for open ends.
std::string bin_label(double lo, double hi, bool closed_right);

// Counts the numbers of `src` into bins; out->edges, categories and observed are filled.
// Equal-probability bins need a fitted model and are refused for now.
void count_into_bins(const RawSource& src, const BinChoice& bins, ParsedInput* out);

}  // namespace tallyproof
