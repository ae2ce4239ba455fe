// The conformity test of an analysed Result (core/statistics/conformity: Wellek's goodness-of-fit
// equivalence test), when the analysis asks for it; refused, with the reason, for fitted models
// and for comparisons with a previous sample.
#pragma once
#include "analysis.hpp"
#include "result.hpp"

namespace tallyproof {

void add_conformity(const Analysis& a, Result* r);  // sets r->conformity when a.conformity.requested

}  // namespace tallyproof
