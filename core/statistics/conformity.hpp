// Conformity (equivalence) test of a goodness of fit: H0 "the mix departs from the stated one by
// at least w0" (Cohen's w >= w0) against H1 "w < w0", rejected when X² falls below the alpha
// quantile of the noncentral chi-square with df and noncentrality N w0², i.e. when
// p = P(X <= X²_obs | chi2(df, N w0²)) < alpha (the goodness-of-fit equivalence test in Wellek,
// Testing Statistical Hypotheses of Equivalence and Noninferiority, 2nd ed. 2010, from memory).
// The smallest w0 shown at alpha is the upper 1 - alpha confidence bound for w (Steiger and
// Fouladi 1997). Planning: the N whose power to show conformity reaches a target when the true
// effect is w1 < w0 (X² ~ chi2(df, N w1²)). Checked against SciPy 1.10 ncx2 and a simulation.
#pragma once
#include <limits>
#include <string>
#include <vector>

#include "chi_square_tail.hpp"
#include "status.hpp"

namespace tallyproof {

struct ConformityPlan {
    bool computed = false;
    Status status;
    double true_w = 0;          // the true effect assumed (0: exactly the stated mix)
    double target_power = 0.8;
    double n_required = std::numeric_limits<double>::quiet_NaN();  // smallest whole N reaching target_power
    double power_at_n = std::numeric_limits<double>::quiet_NaN();  // power at the observed N
};

struct ConformityResult {
    Status status;                  // !ok: not computed, and why (fitted parameters, margin outside (0, 1], ...)
    double margin_w = 0;            // w0
    double alpha = 0.05, df = 0, n = 0, statistic = 0;
    double noncentrality = 0;       // N w0²
    double critical_value = 0;      // alpha quantile of chi2(df, N w0²): conformity when X² is below it
    TailProbability p_value;        // P(X <= X² | chi2(df, N w0²))
    bool conforms = false;          // p_value < alpha
    double smallest_margin_w = 0;   // smallest w0 shown at alpha (0 when X² is below the central alpha quantile)
    // The same margins as the largest shift in percentage points between two categories
    // (margin_points_from_w); NaN when the shares are not known.
    double margin_points = std::numeric_limits<double>::quiet_NaN();
    double smallest_margin_points = std::numeric_limits<double>::quiet_NaN();
    ConformityPlan plan;
};

// The test at margin w0 (0 < w0 <= 1) for statistic X² >= 0 from N > 0 observations with df >= 1.
Status conformity_test(double statistic, double n, double df, double alpha, double margin_w, ConformityResult* out);

// P(X² below the critical value) when the true effect is true_w (0 <= true_w); NaN on a bad argument.
double conformity_power(double true_w, double margin_w, double n, double alpha, double df);

// Smallest whole N with conformity_power >= target_power; refuses true_w >= margin_w.
Status conformity_sample_size(double true_w, double margin_w, double target_power, double alpha, double df, double* n);

// A margin in percentage points: moving a share d from one category to another gives
// w² = d²/p_i + d²/p_j, largest for the two smallest expected shares p1, p2; so every shift of at
// most d between two categories has w <= w0 exactly when d <= w0 / sqrt(1/p1 + 1/p2)
// (docs/methods.md, Conformity). Points are 100 d. NaN for fewer than two shares or a bad value.
double margin_points_from_w(double margin_w, const std::vector<double>& shares);
double margin_w_from_points(double points, const std::vector<double>& shares);

// Reads a margin as typed: "0.1" is w0; "2 pp", "2 points", "2 percentage points" or "2%" is a
// shift in percentage points. False when the text is neither (then both outputs are NaN).
bool read_conformity_margin(const std::string& text, double* margin_w, double* margin_points);

// Words on choosing w0 (Cohen's benchmarks; the contract or local rule decides).
const char* conformity_margin_guidance();

}  // namespace tallyproof
