// Design-based covariance of weighted category totals by Taylor linearisation, PSUs treated as
// drawn with replacement within strata (Wolter 2007, "Introduction to Variance Estimation",
// ch. 6; Lumley 2010, "Complex Surveys", s. 1.4 and appendix; R survey's svyrecvar without fpc):
// V = Σ_h n_h/(n_h − 1) Σ_c (z_hc − z̄_h)(z_hc − z̄_h)ᵀ, z_hc the PSU totals of w_i (y_i − centre).
#pragma once
#include <vector>

#include "survey_sample.hpp"

namespace tallyproof {

// A k × k symmetric matrix, row-major.
struct SquareMatrix {
    std::size_t k = 0;
    std::vector<double> v;
    double at(std::size_t i, std::size_t j) const { return v[i * k + j]; }
};

// Weighted totals T_j = Σ w_i [category_i = j] and their sum N̂ (sample assumed checked).
std::vector<double> weighted_totals(const SurveySample& s);

// Covariance of the linearised totals Σ_i w_i (y_ij − centre_j), y_ij the indicator of category j.
// With centre = the weighted shares p̂ and divided by N̂², this is the covariance of the shares
// p̂ (R survey's vcov(svymean(~category, design))).
SquareMatrix linearised_covariance(const SurveySample& s, const std::vector<double>& centre);

// Covariance of the weighted shares: linearised_covariance(s, p̂) / N̂².
SquareMatrix weighted_share_covariance(const SurveySample& s);

}  // namespace tallyproof
