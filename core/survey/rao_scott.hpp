// Design-corrected goodness-of-fit tests for survey data: Rao and Scott's first-order
// correction (1981, JASA 76:221-230) X²/δ̄ on k − 1 df, their second-order (Satterthwaite)
// correction (1984, Ann. Stat. 12:46-60) X²/(δ̄(1 + a²)) on (k − 1)/(1 + a²) df and its F form
// on (k − 1)/(1 + a²) and (PSUs − strata) times that df, with δ the generalised design effects
// as R survey 4.1's svygofchisq and svychisq define them; the first-order correction from
// per-category design effects (Rao and Scott 1981, eq. 4.3); the crude correction X²/D.
#pragma once
#include <string>
#include <vector>

#include "chi_square_tail.hpp"
#include "status.hpp"
#include "survey_sample.hpp"

namespace tallyproof {

enum class DesignTier {
    respondents,              // respondent-level rows: weights, strata, clusters (full covariance)
    category_design_effects,  // weighted shares with a design effect per category (first order only)
    overall_design_effect,    // one design effect for the whole table (crude)
};
const char* design_tier_name(DesignTier t);  // "respondents", "category-design-effects", "overall-design-effect"

struct DesignTest {
    bool available = false;
    double statistic = 0, df = 0;
    TailProbability p;
    std::string reason;  // why it is not available
};

struct DesignFTest {
    bool available = false;
    double statistic = 0, numerator_df = 0, denominator_df = 0;
    TailProbability p;
    std::string reason;
};

struct DesignCorrection {
    Status status;
    DesignTier tier = DesignTier::respondents;
    std::string correction;                 // the correction used, in words, for the write-up
    double n = 0;                           // nominal sample size (respondents, or the counts' total)
    double total_weight = 0;                // N̂, the weights' sum (tier 1), else n
    std::vector<double> shares;             // weighted shares p̂
    std::vector<double> standard_errors;    // design-based SE of each share (tier 1; tier 2 from the design effects)
    std::vector<double> design_effects;     // per category: n Var(p̂_j) / (p̂_j (1 − p̂_j)) (tiers 1 and 2)
    std::vector<double> generalised_design_effects;  // eigenvalues δ_1 ≥ ... ≥ δ_(k−1) (tier 1)
    double mean_design_effect = 0;          // δ̄ (tier 3: D)
    double cv2 = 0;                         // a², the squared CV of the δ (tier 1)
    double effective_n = 0;                 // n / δ̄
    double kish_design_effect = 0;          // 1 + CV² of the weights (tier 1; NaN otherwise)
    std::size_t clusters = 0, strata = 0;   // PSUs and strata (tier 1)
    bool clustered = false;                 // a cluster column was given (else each respondent is its own PSU)
    double uncorrected_statistic = 0;       // X² = n Σ (p̂ − p0)² / p0
    double uncorrected_df = 0;              // k − 1
    TailProbability uncorrected_p;
    DesignTest first_order, second_order;
    DesignFTest f_form;                     // second order as an F test with the design's df
};

// Tier 1: respondent-level data against the shares p0 (one per category, > 0, rescaled to sum 1).
DesignCorrection rao_scott_respondents(const SurveySample& s, const std::vector<double>& p0);

// Tier 2: weighted shares (any positive scale; rescaled to sum 1), n the nominal sample size,
// one design effect per category (> 0) as a survey report gives them.
DesignCorrection rao_scott_category_effects(const std::vector<double>& shares, double n,
                                            const std::vector<double>& design_effects, const std::vector<double>& p0);

// Tier 3: one overall design effect D > 0 (given, or Kish's 1 + CV² of the weights).
DesignCorrection crude_design_correction(const std::vector<double>& shares, double n, double D,
                                         const std::vector<double>& p0, bool from_kish);

}  // namespace tallyproof
