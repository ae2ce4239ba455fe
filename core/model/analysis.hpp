// Analysis: the value type describing one goodness-of-fit analysis (the input side of the
// analysis document, docs/analysis-document.md): categories with observed counts, the expected
// mix (the model) and the test settings.
//
// Index: ModelKind, Model · StatisticChoice · PValueChoice · MergeChoice · PlanChoice · ConformityChoice · DesignChoice · Analysis
#pragma once
#include <cstdint>
#include <limits>
#include <string>
#include <utility>
#include <vector>

#include "merge_categories.hpp"  // MergeRule
#include "survey_sample.hpp"      // SurveySample

namespace tallyproof {

enum class ModelKind {
    equal,              // every category equally likely
    shares,             // stated shares (fractions or percentages), rescaled to sum 1
    ratio,              // ratios such as 9:3:3:1
    counts,             // expected counts, rescaled to the observed total when they differ by rounding
    poisson,            // fitted to ordered whole-number categories ("0", "1", ..., "5 or more")
    binomial,           // parameters: trials (given), p
    geometric,          // p; support 0, 1, 2, ...
    negative_binomial,  // size, p
    uniform,            // discrete uniform over the categories' range
    normal,             // binned continuous data with `edges`: mean, sd
    lognormal,          // meanlog, sdlog
    exponential,        // rate
    benford_first,      // Benford's law, first digit 1-9
    benford_second,     // second digit 0-9
    benford_first_two,  // first two digits 10-99
    last_digit,         // last digit uniform over 0-9
    last_digit_even,    // last digit uniform over 0, 2, 4, 6, 8
    reference_sample,   // `values` are a previous sample's counts: 2 x k test of homogeneity (df k - 1)
};

const char* model_kind_name(ModelKind kind);                          // "equal", "negative-binomial", ...
bool model_kind_from_name(const std::string& name, ModelKind* kind);  // false if unknown
bool model_is_fitted(ModelKind kind);                                 // a distribution with parameters
bool model_is_digit_law(ModelKind kind);

struct Model {
    ModelKind kind = ModelKind::equal;
    std::vector<double> values;                             // shares / ratio terms / expected counts
    std::vector<std::pair<std::string, double>> parameters; // given parameters; absent ones are estimated
    std::vector<double> edges;                              // bin edges for binned continuous data (k + 1)
};

struct StatisticChoice {
    double lambda = 1.0;    // power-divergence lambda (Cressie and Read 1984): 1 Pearson, 0 G², 2/3 ...
    bool williams = false;  // Williams (1976) correction of G²
};

enum class PValueMethod { asymptotic, exact, monte_carlo };
enum class ExactOrdering { statistic, probability };

struct PValueChoice {
    PValueMethod method = PValueMethod::asymptotic;
    ExactOrdering ordering = ExactOrdering::statistic;
    std::uint64_t replicates = 100000;  // Monte Carlo replicates B
    std::uint64_t seed = 1;             // Monte Carlo seed: same seed, same p-value everywhere
};

struct MergeChoice {
    MergeRule rule = MergeRule::none;
    double minimum = 5.0;  // for MergeRule::custom_minimum
};

struct PlanChoice {
    bool requested = false;
    double w = std::numeric_limits<double>::quiet_NaN();            // effect size to detect
    double n = std::numeric_limits<double>::quiet_NaN();            // sample size (for power)
    double alpha = std::numeric_limits<double>::quiet_NaN();        // default: the analysis alpha
    double df = std::numeric_limits<double>::quiet_NaN();           // default: the analysis df
    double target_power = std::numeric_limits<double>::quiet_NaN(); // for the required N
};

// Conformity (equivalence) test: show that the mix departs from the stated one by less than w0.
struct ConformityChoice {
    bool requested = false;
    double margin_w = std::numeric_limits<double>::quiet_NaN();      // w0, in (0, 1]
    // The margin entered as the largest shift in percentage points between two categories
    // (core/conformity margin_w_from_points); when given, w0 is derived from it and the shares.
    double margin_points = std::numeric_limits<double>::quiet_NaN();
    double true_w = std::numeric_limits<double>::quiet_NaN();        // planning: true w assumed (default 0)
    double target_power = std::numeric_limits<double>::quiet_NaN();  // planning: default 0.8
};

// Survey data (core/survey): the design behind the counts, for a design-corrected test (Rao and
// Scott 1981, 1984). Tier 1: respondent rows (`sample`) with weights, strata and clusters; tier 2:
// one design effect per category; tier 3: one overall design effect, given or Kish's from the
// weights. With a sample, the categories and counts are the sample's (weighted shares times the
// number of respondents); otherwise the counts as read give the shares and n.
struct DesignChoice {
    bool requested = false;
    SurveySample sample;                          // respondent rows (empty: none)
    std::vector<double> category_design_effects;  // tier 2, one per category
    double overall_design_effect = std::numeric_limits<double>::quiet_NaN();  // tier 3 (given)
    bool kish = false;                            // tier 3: D = 1 + CV² of the sample's weights
};

struct Analysis {
    std::vector<std::string> categories;  // labels, one per category
    std::vector<double> observed;         // non-negative whole counts
    bool ordered = false;                 // categories have a natural order
    Model model;
    StatisticChoice statistic;
    double alpha = 0.05;                  // significance level of the decision
    PValueChoice pvalue;
    MergeChoice merge;
    int extra_estimated_parameters = 0;   // parameters estimated elsewhere, each costing one df
    PlanChoice plan;
    ConformityChoice conformity;
    DesignChoice design;                  // survey data: the design-corrected test (requested: on)
};

const char* pvalue_method_name(PValueMethod m);  // "asymptotic", "exact", "monte-carlo"

}  // namespace tallyproof
