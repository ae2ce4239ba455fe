// Result: the one record every front end draws from (page, command-line tool, reports).
// Nothing shown to a user is recomputed outside core/.
//
// Index: as read · model · merging · tested cells and diagnostics · statistic and p-values ·
//        validity · effect size and planning · digit laws · previous sample, conformity · notes
#pragma once
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "analysis.hpp"
#include "category_diagnostics.hpp"
#include "chi_square_tail.hpp"
#include "conformity.hpp"
#include "effect_size.hpp"
#include "fit_distribution.hpp"
#include "rao_scott.hpp"
#include "reference_sample.hpp"
#include "status.hpp"
#include "validity.hpp"

namespace tallyproof {

// p-values at both ends of the Chernoff and Lehmann (1954) df range, for parameters estimated
// from raw data rather than from these grouped counts.
struct DfRange {
    bool shown = false;
    double lower_df = 0, upper_df = 0;
    TailProbability p_at_lower_df, p_at_upper_df;
    std::string note;
};

struct ExactOutcome {
    bool requested = false, computed = false;
    TailProbability p;
    double error_bound = 0;
    double p_lower = 0, p_upper = 1;  // certified bracket on the exact p (p -+ error_bound for the enumerations)
    bool bracketed = false;           // a bracket rather than a point (the grid's, wider than 1e-9 of p)
    bool decides_at_alpha = false;    // the bracket lies wholly at or below alpha or above it: the decision is exact
    double work_units = 0;
    std::string method;   // exact_method_name: "branch-and-bound", "equal-shares-dp", "grid-bracket"
    std::string refusal;  // why it was not computed (too costly: use Monte Carlo)
};

struct MonteCarloOutcome {
    bool requested = false, computed = false;
    double p = 1, standard_error = 0;
    std::uint64_t replicates = 0, hits = 0, seed = 0;
    bool refit = false;   // parameters re-estimated on every replicate (parametric bootstrap)
    std::string refusal;
};

struct PlanOutcome {
    bool requested = false;
    Status status;
    double w = 0, n = 0, alpha = 0, df = 0, target_power = 0;
    double power = 0;       // at w and n (NaN when n not given)
    double n_required = 0;  // smallest N for target_power (NaN when not asked)
};

struct DigitOutcome {
    bool computed = false;
    double mad = 0;
    std::string band;  // Nigrini's conformity band, or empty
};

struct Result {
    Status status;                          // !status.ok: only `status` and `warnings` are set

    // As read (before merging)
    std::vector<std::string> categories;
    std::vector<std::vector<std::size_t>> look_alike_labels;  // groups of categories whose labels look the same
    std::vector<double> observed;
    std::vector<double> expected_shares;    // the null model's share per category
    std::vector<double> expected_counts;    // N * share
    double n = 0;                           // total observed count

    // Model
    std::string model_description;
    std::vector<ParameterValue> estimates;  // fitted models: every parameter
    int estimated_parameters = 0;           // m from the fit, plus extra_estimated_parameters

    // Merging of thin categories (merge_map lists original indices per tested cell)
    bool merged = false;
    std::vector<std::vector<std::size_t>> merge_map;
    std::string merge_note;

    // Tested cells (after merging; equal to the categories when nothing was merged)
    std::vector<std::string> tested_categories;
    std::vector<double> tested_observed, tested_expected;
    std::vector<double> contributions;      // terms of the chosen statistic, summing to it
    CategoryDiagnostics diagnostics;        // residuals, per-cell binomial p, intervals, drivers

    // Statistic and p-values
    std::string statistic_name;             // "Pearson χ²", "likelihood ratio G²", ...
    std::string statistic_symbol;           // statistic_symbol(lambda): "χ²", "G²", "T²", "GM²", "NM²", "CR"
    double lambda = 1;
    double williams_q = 1;
    double statistic = 0;
    double df = 0;
    TailProbability upper;                  // asymptotic P(chi2(df) >= statistic)
    TailProbability lower;                  // asymptotic P(chi2(df) <= statistic): a fit too good?
    bool exact_lower_computed = false;      // small N: P(T <= statistic) by enumeration (exact_lower_tail)
    TailProbability exact_lower;
    DfRange df_range;
    ExactOutcome exact;
    MonteCarloOutcome monte_carlo;
    PValueMethod method = PValueMethod::asymptotic;  // the method behind `p` and the decision
    TailProbability p;                      // the p-value reported and decided on
    double alpha = 0.05;
    double critical_value = 0;              // upper alpha quantile of chi2(df)
    bool reject = false;                    // p <= alpha

    // Validity of the chi-square approximation
    ValidityReport validity;                // of the tested cells
    ValidityReport validity_before_merge;   // of the categories as read

    // Effect size and planning
    EffectOutcome effect;
    PlanOutcome plan;

    // Digit laws
    DigitOutcome digits;

    // Comparison with a previous sample (model kind reference-sample), and the conformity test
    std::optional<ReferenceSampleOutcome> reference;
    std::optional<ConformityResult> conformity;  // when asked for (ok or refused, with its reason)

    // Survey data: the design-corrected test (Analysis::design). `statistic`, `df` and `upper` are
    // then the uncorrected X² of the weighted shares scaled to the nominal n; `p` and `reject` are
    // the corrected test's (second order where available, else first order).
    std::optional<DesignCorrection> design;
    std::string design_decided_on;          // "second-order", "first-order" or "crude"

    std::vector<std::string> warnings;      // plain-language notes about this analysis
    std::vector<std::string> questions;     // quiet checks a user may dismiss ("counts, or percentages?"), not warnings
    std::string model_suggestion;           // a model these data are usually tested against, shown with the verdict ("" if none)
    std::vector<std::string> cautions;      // the usual cautions that apply to it
};

}  // namespace tallyproof
