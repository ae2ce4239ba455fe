// Survey sample: respondent-level data for design-based tests (Lumley 2010, "Complex Surveys",
// ch. 1-2): each respondent's category, sampling weight, stratum and cluster (primary sampling
// unit). No clusters: each respondent is its own PSU; no strata: one stratum.
#pragma once
#include <cstddef>
#include <string>
#include <vector>

#include "status.hpp"

namespace tallyproof {

struct SurveySample {
    std::vector<std::string> categories;   // labels, in the order the tests use
    std::vector<std::size_t> category;     // per respondent: index into categories
    std::vector<double> weight;            // per respondent: sampling weight, > 0
    std::vector<std::size_t> stratum;      // per respondent: index into strata (empty: one stratum)
    std::vector<std::size_t> cluster;      // per respondent: index into clusters (empty: each its own PSU)
    std::vector<std::string> strata;       // stratum labels (for messages)
    std::vector<std::string> clusters;     // cluster labels; a label may recur in two strata as two PSUs when nested
    std::string weight_column, stratum_column, cluster_column, category_column;  // as chosen ("" when absent)
};

// Checks the sample: at least one respondent and two categories, indices in range, weights
// finite and > 0, the weights' sum finite, every stratum with at least two PSUs (R's survey
// default, options(survey.lonely.psu = "fail"), refuses a lonely PSU too; we do the same and
// say which stratum).
Status check_survey_sample(const SurveySample& s);

// Number of PSUs (distinct stratum-cluster pairs) and of strata actually present.
std::size_t survey_psu_count(const SurveySample& s);
std::size_t survey_stratum_count(const SurveySample& s);

// Kish's (1965) design effect of unequal weighting, 1 + CV² of the weights = n Σw² / (Σw)².
double kish_design_effect(const std::vector<double>& weights);

}  // namespace tallyproof
