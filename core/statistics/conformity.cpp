// Equivalence test for goodness of fit (Wellek 2010, from memory): noncentral chi-square lower
// tail at X² with noncentrality N w0², its alpha quantile, the margin at which p = alpha (through
// effect_size's noncentrality_interval at level 1 - 2 alpha) and the planning N (doubling, then
// bisection on whole N). Underflowing p-values are summed as their Poisson mixture in log space.
#include "conformity.hpp"

#include <cmath>
#include <string>

#include "effect_size.hpp"
#include "noncentral_chi_square.hpp"
#include "noncentral_chi_square_quantile.hpp"
#include "number_format.hpp"

namespace tallyproof {
namespace {

// log10 P(X <= x), X ~ chi2(df, lambda), as sum_i Pois(i; lambda/2) P(chi2(df + 2i) <= x) in log
// space (Johnson, Kotz and Balakrishnan 1995, ch. 29), for tails below double range.
double log10_lower_tail_mixture(double x, double df, double lambda) {
    const double half = lambda / 2;
    const double last = half + 40 * std::sqrt(half) + 100;
    double top = -HUGE_VAL, sum = 0;
    for (double i = 0; i <= last && i < 2e6; ++i) {
        const double log_term = -half + i * std::log(half) - std::lgamma(i + 1) +
                                chi_square_lower_tail(x, df + 2 * i).log10_p * std::log(10.0);
        if (log_term > top) { sum = sum * std::exp(top - log_term) + 1; top = log_term; }
        else sum += std::exp(log_term - top);
    }
    return (top + std::log(sum)) / std::log(10.0);
}

Status check_common(double n, double df, double alpha, double margin_w) {
    if (!(margin_w > 0 && margin_w <= 1))
        return Status::failure("The conformity margin w0 = " + format_plain(margin_w) + " must lie in (0, 1]; Cohen's w of 0.1 is a small departure.");
    if (!(alpha > 0 && alpha < 1)) return Status::failure("The significance level α must lie between 0 and 1.");
    if (!(df >= 1) || std::isinf(df)) return Status::failure("Conformity needs at least one degree of freedom.");
    if (!(n > 0) || std::isinf(n)) return Status::failure("Conformity needs a positive sample size N.");
    return Status::success();
}

}  // namespace

Status conformity_test(double statistic, double n, double df, double alpha, double margin_w, ConformityResult* out) {
    *out = ConformityResult{};
    out->margin_w = margin_w;
    out->alpha = alpha;
    out->df = df;
    out->n = n;
    out->statistic = statistic;
    Status s = check_common(n, df, alpha, margin_w);
    if (!s.ok) { out->status = s; return s; }
    if (!(statistic >= 0) || std::isinf(statistic)) {
        out->status = Status::failure("Conformity needs a finite statistic.");
        return out->status;
    }
    out->noncentrality = n * margin_w * margin_w;
    out->critical_value = noncentral_chi_square_quantile(alpha, df, out->noncentrality);
    const double p = noncentral_chi_square_lower_tail(statistic, df, out->noncentrality);
    if (p > 1e-290) out->p_value = TailProbability{p, std::log10(p)};
    else {
        const double l10 = log10_lower_tail_mixture(statistic, df, out->noncentrality);
        out->p_value = TailProbability{std::pow(10.0, l10), l10};
    }
    out->conforms = out->p_value.p < alpha;
    double lambda_low = 0, lambda_high = 0;
    s = noncentrality_interval(statistic, df, 1 - 2 * alpha, &lambda_low, &lambda_high);
    if (alpha >= 0.5 || !s.ok) out->smallest_margin_w = NAN;
    else out->smallest_margin_w = std::sqrt(lambda_high / n);
    return Status::success();
}

double conformity_power(double true_w, double margin_w, double n, double alpha, double df) {
    if (!check_common(n, df, alpha, margin_w).ok || !(true_w >= 0) || std::isinf(true_w)) return NAN;
    const double critical = noncentral_chi_square_quantile(alpha, df, n * margin_w * margin_w);
    return noncentral_chi_square_lower_tail(critical, df, n * true_w * true_w);
}

Status conformity_sample_size(double true_w, double margin_w, double target_power, double alpha, double df, double* n) {
    Status s = check_common(1, df, alpha, margin_w);
    if (!s.ok) return s;
    if (!(true_w >= 0) || !(true_w < margin_w))
        return Status::failure("The true w assumed (" + format_plain(true_w) + ") must be at least 0 and below the margin w0 = " +
                               format_plain(margin_w) + ": a mix that departs by w0 or more can never be shown to conform.");
    if (!(target_power > 0 && target_power < 1))
        return Status::failure("The target power " + format_plain(target_power) + " must lie strictly between 0 and 1.");
    double lo = 0, hi = 1;  // power(lo) < target (or lo = 0), power(hi) >= target
    while (!(conformity_power(true_w, margin_w, hi, alpha, df) >= target_power)) {
        lo = hi;
        hi *= 2;
        if (hi > 1e12) return Status::failure("No sample size up to 1e12 reaches power " + format_plain(target_power) + ".");
    }
    while (hi - lo > 1) {
        const double mid = std::floor((lo + hi) / 2);
        if (conformity_power(true_w, margin_w, mid, alpha, df) >= target_power) hi = mid; else lo = mid;
    }
    *n = hi;
    return Status::success();
}

const char* conformity_margin_guidance() {
    return "The margin w0 is the largest departure from the stated mix that still counts as conforming. Cohen's "
           "benchmarks call w = 0.1 small, 0.3 medium and 0.5 large; a margin of 0.1 is a common strict choice. The "
           "contract, specification or your local rule decides the margin; choose it before looking at the data.";
}

}  // namespace tallyproof
