// Pearson's chi-square goodness-of-fit test (Pearson 1900): X^2 = sum (O - E)^2 / E with
// k - 1 degrees of freedom; p-value is the upper tail of chi2(k - 1) in complement form.
#include "goodness_of_fit.hpp"

#include <cmath>
#include <cstdio>

#include "expected_counts.hpp"

namespace tallyproof {
namespace {

Result refuse(std::string message, int line = 0) {
    Result r;
    r.status = Status::failure(std::move(message), line);
    return r;
}

}  // namespace

Result analyse(const Analysis& a) {
    const std::size_t k = a.observed.size();
    if (k == 0) return refuse("There are no categories: paste lines of label and count.");
    if (a.categories.size() != k)
        return refuse("There are " + std::to_string(a.categories.size()) + " labels but " + std::to_string(k) +
                      " counts.");
    if (k < 2) return refuse("Only one category (\"" + a.categories[0] + "\"): a goodness-of-fit test needs at least two.");
    if (!(a.alpha > 0 && a.alpha < 1)) return refuse("The significance level alpha must lie between 0 and 1.");

    Result r;
    r.categories = a.categories;
    r.observed = a.observed;
    r.alpha = a.alpha;
    double n = 0;
    for (std::size_t i = 0; i < k; ++i) {
        const double o = a.observed[i];
        if (!std::isfinite(o) || o < 0 || o != std::floor(o))
            return refuse("The count for \"" + a.categories[i] + "\" must be a non-negative whole number.");
        n += o;
    }
    if (n <= 0) return refuse("All counts are zero: there is nothing to test.");
    r.n = n;

    Status s = expected_counts(a.model, k, n, &r.expected_counts, &r.warnings);
    if (!s.ok) { r.status = s; return r; }

    r.contributions.resize(k);
    r.pearson_residuals.resize(k);
    r.min_expected = r.expected_counts[0];
    for (std::size_t i = 0; i < k; ++i) {
        const double o = a.observed[i], e = r.expected_counts[i];
        if (e <= 0) {
            if (o > 0) return refuse("Category \"" + a.categories[i] + "\" has an expected share of zero but " +
                                     "was observed: the stated mix rules it out.");
            r.contributions[i] = 0;
            r.pearson_residuals[i] = 0;
            continue;
        }
        const double d = o - e;
        r.contributions[i] = d * d / e;
        r.pearson_residuals[i] = d / std::sqrt(e);
        r.statistic += r.contributions[i];
        if (e < r.min_expected) r.min_expected = e;
    }
    r.df = static_cast<double>(k - 1);
    r.upper = chi_square_upper_tail(r.statistic, r.df);
    r.critical_value = chi_square_critical_value(a.alpha, r.df);
    r.reject = r.statistic >= r.critical_value;
    if (r.min_expected < 5) {
        char buf[200];
        std::snprintf(buf, sizeof buf,
                      "The smallest expected count is %.3g (below 5): the chi-square approximation may be poor.",
                      r.min_expected);
        r.warnings.push_back(buf);
    }
    return r;
}

}  // namespace tallyproof
