// analyse(): runs one goodness-of-fit analysis and returns the complete Result record with the
// asymptotic p-value; exact and Monte Carlo p-values run afterwards through pvalue_job.hpp.
#pragma once
#include "analysis.hpp"
#include "result.hpp"

namespace tallyproof {

Result analyse(const Analysis& analysis);  // never throws; refusals come back in Result::status

}  // namespace tallyproof
