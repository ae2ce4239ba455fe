// Degrees of freedom after fitting: k - 1 - m for grouped-data estimates (Fisher 1924, Journal of
// the Royal Statistical Society 87:442-450) and the Chernoff-Lehmann (1954) bracket
// [k - 1 - m, k - 1] for raw-data maximum likelihood estimates. Exact integer arithmetic; the
// p-values come from chi_square_upper_tail (complement form).
#include "fit_distribution.hpp"

#include <cmath>
#include <cstdio>
#include <limits>

namespace tallyproof {

const ParameterValue* FittedDistribution::parameter(const std::string& name) const {
    for (const auto& p : parameters)
        if (p.name == name) return &p;
    return nullptr;
}

Status check_observed_counts(const std::vector<double>& observed, std::size_t bins) {
    if (observed.size() != bins)
        return Status::failure("There are " + std::to_string(bins) + " bins but " +
                               std::to_string(observed.size()) + " observed counts.");
    double total = 0;
    for (std::size_t i = 0; i < observed.size(); ++i) {
        if (!std::isfinite(observed[i]) || observed[i] < 0) {
            char buf[120];
            std::snprintf(buf, sizeof buf, "Observed count %g in bin %zu must be a non-negative number.",
                          observed[i], i + 1);
            return Status::failure(buf);
        }
        total += observed[i];
    }
    if (!(total > 0)) return Status::failure("The observed counts are all zero.");
    return Status::success();
}

void finish_fit(FittedDistribution* fit) {
    double sum = 0, ll = 0;
    for (std::size_t i = 0; i < fit->probabilities.size(); ++i) {
        const double p = fit->probabilities[i];
        if (!(p >= 0 && p <= 1)) {
            fit->status = Status::failure("Internal error: cell " + std::to_string(i + 1) +
                                          " of the " + fit->model + " fit has no valid probability.");
            return;
        }
        sum += p;
        if (fit->observed[i] > 0) ll += fit->observed[i] * std::log(p);
    }
    // The cells exhaust the support, so anything beyond rounding is a defect, not a tail.
    if (!(std::fabs(sum - 1) <= 1e-9)) {
        char buf[160];
        std::snprintf(buf, sizeof buf, "Internal error: the %s cell probabilities sum to %.17g, not 1.",
                      fit->model.c_str(), sum);
        fit->status = Status::failure(buf);
        return;
    }
    fit->log_likelihood = ll;
    const long long k = static_cast<long long>(fit->probabilities.size());
    const long long df = k - 1 - fit->estimated_parameters;
    if (df < 1) {
        fit->status = Status::failure(
            "The " + fit->model + " fit uses " + std::to_string(k) + " cells and estimates " +
            std::to_string(fit->estimated_parameters) + " parameter(s), which leaves no degrees of freedom (k - 1 - m = " +
            std::to_string(df) + "); at least " + std::to_string(fit->estimated_parameters + 2) + " cells are needed.");
        return;
    }
    fit->df = static_cast<double>(df);
}

FittedDegreesOfFreedom fitted_degrees_of_freedom(std::size_t cells, int estimated_parameters,
                                                 EstimatedFrom from) {
    FittedDegreesOfFreedom r;
    if (estimated_parameters < 0) {
        r.status = Status::failure("The number of estimated parameters (" +
                                   std::to_string(estimated_parameters) + ") cannot be negative.");
        return r;
    }
    const long long k = static_cast<long long>(cells), m = estimated_parameters;
    if (k - 1 - m < 1) {
        r.status = Status::failure("With " + std::to_string(k) + " categories and " + std::to_string(m) +
                                   " estimated parameter(s) no degrees of freedom are left (k - 1 - m = " +
                                   std::to_string(k - 1 - m) + "); at least " + std::to_string(m + 2) +
                                   " categories are needed.");
        return r;
    }
    r.lower = static_cast<double>(k - 1 - m);
    if (from == EstimatedFrom::grouped_counts || m == 0) {
        r.upper = r.lower;
        r.exact = true;
        r.note = m == 0 ? "No parameters were estimated: df = k - 1."
                        : "Parameters estimated from the grouped counts: df = k - 1 - m.";
    } else {
        r.upper = static_cast<double>(k - 1);
        r.exact = false;
        r.note = "Parameters estimated from the raw data: the null distribution lies between chi-square(" +
                 std::to_string(k - 1 - m) + ") and chi-square(" + std::to_string(k - 1) +
                 ") (Chernoff and Lehmann 1954), so the p-value lies between the two.";
    }
    return r;
}

PValueBounds fitted_p_value_bounds(double statistic, const FittedDegreesOfFreedom& df) {
    const double nan = std::numeric_limits<double>::quiet_NaN();
    if (!df.status.ok || !(df.lower > 0) || !(df.upper >= df.lower)) return {{nan, nan}, {nan, nan}};
    // A larger df puts more mass in the upper tail at any x, so chi2(lower) gives the smaller p.
    return {chi_square_upper_tail(statistic, df.lower), chi_square_upper_tail(statistic, df.upper)};
}

Status boundary_refusal(const FittedDistribution& f, const std::string& parameter, bool upper,
                        const std::string& edge_low, const std::string& edge_high) {
    return Status::failure("The counts push the " + f.model + " " + parameter + " towards " +
                           (upper ? edge_high : edge_low) +
                           ", so it cannot be estimated from them; check the bins and counts or give its value.");
}

Status no_convergence(const FittedDistribution& f) {
    return Status::failure("The maximum-likelihood search for the " + f.model +
                           " parameters did not converge on these counts; give the parameter values instead.");
}

std::string fit_number(double x) {
    if (std::isinf(x)) return x > 0 ? "infinity" : "-infinity";
    char buf[40];
    std::snprintf(buf, sizeof buf, "%.10g", x);
    return buf;
}

}  // namespace tallyproof
