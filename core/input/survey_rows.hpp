// Survey rows: respondent-level survey data (one row per respondent under a header) read into a
// SurveySample for the design-corrected tests (core/survey): the category, weight, stratum and
// cluster columns chosen by header name (any case) or 1-based number, as the group column is.
// Clusters are taken as nested in strata (a cluster label in two strata is two PSUs, R survey's
// nest = TRUE). Categories in first-seen order, or sorted. A column chosen by name needs the
// header row (the first line); with numbers only, the first line is a header when its weight
// cell is not a number or, without a weight column, when its category occurs nowhere below it.
#pragma once
#include <string>
#include <string_view>
#include <vector>

#include "status.hpp"
#include "survey_sample.hpp"

namespace tallyproof {

struct SurveyColumns {
    std::string category;  // required
    std::string weight;    // "": every weight 1
    std::string stratum;   // "": one stratum
    std::string cluster;   // "": each respondent its own PSU
    bool sorted = false;   // categories in sorted order (default: first seen)
};

struct SurveyRowsReading {
    Status status;
    SurveySample sample;
    std::vector<double> counts;  // respondents per category (unweighted)
};

// Refuses by name: a chosen column that does not exist, a missing category cell, a weight that is
// missing, not a number, zero or negative; then check_survey_sample (lonely PSU, one category).
SurveyRowsReading read_survey_rows(std::string_view text, const SurveyColumns& columns);

}  // namespace tallyproof
