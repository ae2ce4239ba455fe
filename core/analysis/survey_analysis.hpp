// The design-corrected test inside one analysis (Analysis::design): the survey sample's weighted
// shares become the counts tested (scaled to the number of respondents), and the Rao-Scott or
// crude correction (core/survey/rao_scott) decides; the uncorrected test stays beside it.
#pragma once
#include "analysis.hpp"
#include "result.hpp"

namespace tallyproof {

// The analysis as tested: with a survey sample, its categories and n p̂ as the counts. Refuses
// what the correction does not cover (fitted models, a previous sample, merging, other statistics
// than Pearson's, exact or Monte Carlo p-values) with a message that says so.
Status prepare_design_analysis(const Analysis& a, Analysis* tested);

// After the uncorrected test: the correction, the p-value decided on, effect size intervals on the
// effective n, and the notes saying what was corrected.
void add_design_correction(const Analysis& a, Result* r);

}  // namespace tallyproof
