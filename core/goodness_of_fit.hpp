// analyse(): runs one goodness-of-fit analysis and returns the complete Result record.
#pragma once
#include "analysis.hpp"
#include "result.hpp"

namespace tallyproof {

Result analyse(const Analysis& analysis);  // never throws; refusals come back in Result::status

}  // namespace tallyproof
