// Effect sizes of a chi-square goodness-of-fit test: Cohen's w = sqrt(X2 / N) (Cohen 1988, ch. 7)
// and Fei = sqrt(X2 / (N (1/p_min - 1))) (Ben-Shachar, Patil, Theriault, Wiernik and Luedecke 2023,
// Mathematics 11(9):1982), with confidence intervals by inverting the noncentral chi-square in its
// noncentrality (Steiger and Fouladi 1997). Interval ends are accurate to ~1e-10 relative.
#pragma once

#include "status.hpp"

namespace tallyproof {

double cohens_w(double chi_square, double n);  // sqrt(X2 / N); NaN if X2 < 0 or N <= 0
// sqrt(max(0, X2 - df) / N): w from the noncentrality's moment estimate X2 - df (E X2 = df + lambda),
// which lies inside the noncentrality interval and is 0 for a sample typical of the null, where
// sqrt(X2 / N) still reads about sqrt(df / N). NaN on a bad argument.
double noncentral_w(double chi_square, double n, double df);
// Cohen's (1988) labels: "very small" below .1, "small" from .1, "medium" from .3, "large" from .5.
const char* cohens_w_label(double w);
// Fei in [0, 1]; p_min is the smallest expected share, 0 < p_min < 1. NaN on a bad argument.
double fei(double chi_square, double n, double p_min);
// Fei of the chance-corrected w: sqrt(max(0, X2 - df) / (N (1/p_min - 1))), capped at 1; inside fei_interval.
double noncentral_fei(double chi_square, double n, double df, double p_min);

// An effect size with a two-sided confidence interval at `level` (e.g. 0.95).
struct EffectSizeInterval {
    double estimate = 0;
    double lower = 0;
    double upper = 0;
    double level = 0.95;
};

// The effect sizes a Result carries (effect_outcome below). The labelled, reported w is the
// chance-corrected `estimate`, which lies inside `w_interval`; Fei is the same estimate rescaled,
// inside `fei_interval`. Cohen's uncorrected sqrt(X2 / N) is `w`, kept for reference.
struct EffectOutcome {
    double estimate = 0;        // sqrt(max(0, X2 - df) / N): noncentrality-based, inside w_interval
    const char* label = "";     // Cohen's (1988) label of `estimate`
    double w = 0;               // Cohen's w = sqrt(X2 / N), biased upward by about df / N under the null
    const char* w_label = "";   // Cohen's label of w (kept for reference; the labelled size is `estimate`)
    EffectSizeInterval w_interval;  // .estimate is `estimate`
    bool fei_defined = false;   // needs a smallest expected share below 1
    double fei = 0;             // noncentral_fei: the same chance-corrected estimate, inside fei_interval
    EffectSizeInterval fei_interval;
};

// Every member above for statistic X2 from N observations with df; p_min the smallest expected
// share of the tested cells (NaN or outside (0, 1): no Fei). Intervals at 95%.
EffectOutcome effect_outcome(double chi_square, double n, double df, double p_min);

// Noncentrality interval: lambda_low with P(X >= X2; lambda_low) = (1-level)/2 and lambda_high
// with P(X <= X2; lambda_high) = (1-level)/2, each 0 when even lambda = 0 is beyond it.
Status noncentrality_interval(double chi_square, double df, double level, double* lambda_low, double* lambda_high);
// w = sqrt(lambda / N) at both ends.
Status cohens_w_interval(double chi_square, double n, double df, double level, EffectSizeInterval* out);
// Fei = sqrt(lambda / (N (1/p_min - 1))) at both ends, capped at 1.
Status fei_interval(double chi_square, double n, double df, double p_min, double level, EffectSizeInterval* out);

}  // namespace tallyproof
