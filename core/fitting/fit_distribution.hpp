// Fitted distributions over ordered categories: the record a fit returns (cell probabilities,
// parameters, the number m of estimated parameters and df = k - 1 - m), and the Chernoff and
// Lehmann (1954, Annals of Mathematical Statistics 25:579-586) bounds on the degrees of freedom
// when the parameters were estimated from the raw, ungrouped data instead of the grouped counts.
#pragma once
#include <cstddef>
#include <string>
#include <vector>

#include "chi_square_tail.hpp"
#include "status.hpp"

namespace tallyproof {

// What a fit does with support that no bin covers (values below the first bin or above the last).
enum class TailCells {
    add_empty_cells,  // add a cell "below the first bin" / "above the last bin" with observed 0
    widen_end_bins,   // the first bin becomes "lo or fewer", the last "hi or more"
};

struct ParameterValue {
    std::string name;        // "mean", "p", "size", "sd", "meanlog", "sdlog", "rate", "trials"
    double value = 0;
    bool estimated = false;  // false: given by the user (or derived from given ones)
};

struct FittedDistribution {
    Status status;                       // !ok: a refusal naming the bad input; nothing else is set
    std::string model;                   // "Poisson", "binomial", ...
    // The cells as used, in order: the user's bins (possibly widened) and any added empty
    // tail cells. Discrete cells are the integers lo..hi; continuous cells are [lo, hi).
    // lo may be -inf and hi +inf.
    std::vector<double> lo, hi;
    std::vector<double> observed;        // counts per cell (0 for added cells)
    std::vector<bool> added;             // the cell was added by TailCells::add_empty_cells
    std::vector<double> probabilities;   // per cell; the cells exhaust the support, so they sum to 1
    std::vector<ParameterValue> parameters;  // every parameter of the model, given or estimated
    int estimated_parameters = 0;        // m
    double df = 0;                       // k - 1 - m, k = number of cells as used
    double log_likelihood = 0;           // grouped (multinomial) log-likelihood sum n_i log p_i
    std::vector<std::string> warnings;   // plain-language notes (cells added or widened, ...)

    const ParameterValue* parameter(const std::string& name) const;  // nullptr if absent
};

// Shared by the fit_* functions: refuses counts that are negative, not finite, of the wrong
// number, or all zero.
Status check_observed_counts(const std::vector<double>& observed, std::size_t bins);
// Shared by the fit_* functions: a parameter or bin edge as written in messages ("0.61",
// "infinity"), to 10 significant digits.
std::string fit_number(double x);

// Shared by the fit_* functions: the refusals when the likelihood is maximised at the edge of a
// parameter's range, or the search does not converge.
Status boundary_refusal(const FittedDistribution& f, const std::string& parameter, bool upper,
                        const std::string& edge_low, const std::string& edge_high);
Status no_convergence(const FittedDistribution& f);

// Shared by the fit_* functions: sets log_likelihood and df from the cells, probabilities and
// estimated_parameters; refuses (fit->status) when df < 1 or the probabilities do not sum to 1.
void finish_fit(FittedDistribution* fit);

// How the parameters that the chi-square statistic is computed with were estimated.
enum class EstimatedFrom {
    grouped_counts,  // maximum likelihood on the grouped counts (what the fit_* functions do)
    raw_data,        // maximum likelihood on the ungrouped observations
};

// Degrees of freedom of the null distribution. grouped_counts: exactly k - 1 - m (asymptotically;
// Fisher 1924). raw_data: the statistic lies stochastically between chi2(k-1-m) and chi2(k-1)
// (Chernoff and Lehmann 1954), so the true p-value lies between the p-values at the two bounds.
struct FittedDegreesOfFreedom {
    Status status;
    double lower = 0;   // k - 1 - m
    double upper = 0;   // k - 1 (equal to lower when the bound is exact)
    bool exact = true;  // lower == upper
    std::string note;   // one sentence for the report
};

FittedDegreesOfFreedom fitted_degrees_of_freedom(std::size_t cells, int estimated_parameters,
                                                 EstimatedFrom from);

// The p-value of `statistic` at both bounds: `smaller` from chi2(lower), `larger` from chi2(upper).
struct PValueBounds {
    TailProbability smaller;
    TailProbability larger;
};
PValueBounds fitted_p_value_bounds(double statistic, const FittedDegreesOfFreedom& df);

}  // namespace tallyproof
