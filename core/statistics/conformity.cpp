// Equivalence test for goodness of fit (Wellek 2010, from memory): noncentral chi-square lower
// tail at X² with noncentrality N w0², its alpha quantile, the margin at which p = alpha (through
// effect_size's noncentrality_interval at level 1 - 2 alpha) and the planning N (doubling, then
// bisection on whole N). Underflowing p-values are summed as their Poisson mixture in log space;
// above noncentrality 1e5 the lower tail is the Lugannani-Rice saddlepoint approximation (Butler
// 2007, Saddlepoint Approximations with Applications, sec. 1.2), relative error O(1/noncentrality).
#include "conformity.hpp"

#include <cmath>
#include <cctype>
#include <cstdlib>
#include <string>

#include "effect_size.hpp"
#include "noncentral_chi_square.hpp"
#include "noncentral_chi_square_quantile.hpp"
#include "number_format.hpp"
#include "number_reading.hpp"

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

// log P(X <= x), X ~ chi2(df, lambda), by Lugannani and Rice: the cumulant generating function
// K(t) = -df/2 ln(1 - 2t) + lambda t/(1 - 2t); with u = 1/(1 - 2t), K'(t) = df u + lambda u² = x
// gives u, then r = sign(t) sqrt(2 (t x - K(t))), v = t sqrt(K''(t)), K'' = 2 df u² + 4 lambda u³, and
// P ~ Phi(r) + phi(r) (1/r - 1/v); in the far lower tail (r < -30), with Mills' ratio
// Phi(r) ~ phi(r) (-1/r + 1/r³), its logarithm -r²/2 - ln sqrt(2 pi) + ln(1/r³ - 1/v) keeps every
// digit below double range.
double ln_lower_tail_saddlepoint(double x, double df, double lambda) {
    const double mean = df + lambda, sd = std::sqrt(2 * (df + 2 * lambda));
    if (std::fabs(x - mean) < 1e-6 * sd) x = mean - 1e-6 * sd;  // r = v = 0 there: step off it
    const double u = 2 * x / (df + std::sqrt(df * df + 4 * lambda * x));  // root of lambda u² + df u - x
    const double t = (1 - 1 / u) / 2;
    const double k = -df / 2 * std::log1p(-2 * t) + lambda * t * u;
    const double r = (t < 0 ? -1 : 1) * std::sqrt(std::max(0.0, 2 * (t * x - k)));
    const double v = t * std::sqrt(2 * df * u * u + 4 * lambda * u * u * u);
    const double ln_phi = -r * r / 2 - 0.5 * std::log(2 * 3.141592653589793);
    if (r < -30) return ln_phi + std::log(1 / (r * r * r) - 1 / v);
    const double p = 0.5 * std::erfc(-r / std::sqrt(2.0)) + std::exp(ln_phi) * (1 / r - 1 / v);
    return std::log(std::min(1.0, std::max(p, 1e-300)));
}

constexpr double kSaddlepointFrom = 1e5;  // noncentral_chi_square's normal approximation starts here too

// P(X <= x) for the conformity p-value: 0 at x = 0 (a continuous law has no mass there), the
// Boost series up to noncentrality 1e5 (the Poisson mixture in log space below 1e-290), the
// saddlepoint above.
TailProbability conformity_lower_tail(double x, double df, double lambda) {
    if (!(x > 0)) return TailProbability{0.0, -HUGE_VAL};
    if (lambda > kSaddlepointFrom) {
        const double ln_p = ln_lower_tail_saddlepoint(x, df, lambda);
        return TailProbability{std::exp(ln_p), ln_p / std::log(10.0)};
    }
    const double p = noncentral_chi_square_lower_tail(x, df, lambda);
    if (p > 1e-290) return TailProbability{p, std::log10(p)};
    const double l10 = log10_lower_tail_mixture(x, df, lambda);
    return TailProbability{std::pow(10.0, l10), l10};
}

// The alpha quantile of the same law, by bisection on conformity_lower_tail, so that X² below
// it and p < alpha are one decision.
double conformity_critical_value(double alpha, double df, double lambda) {
    if (lambda <= kSaddlepointFrom) return noncentral_chi_square_quantile(alpha, df, lambda);
    double lo = 0, hi = df + lambda;
    while (conformity_lower_tail(hi, df, lambda).p < alpha) { lo = hi; hi *= 2; }
    for (int i = 0; i < 200 && hi - lo > 1e-13 * hi; ++i) {
        const double mid = 0.5 * (lo + hi);
        if (conformity_lower_tail(mid, df, lambda).p < alpha) lo = mid; else hi = mid;
    }
    return lo;
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
    out->critical_value = conformity_critical_value(alpha, df, out->noncentrality);
    out->p_value = conformity_lower_tail(statistic, df, out->noncentrality);
    out->conforms = out->p_value.p < alpha;
    double lambda_low = 0, lambda_high = 0;
    s = noncentrality_interval(statistic, df, 1 - 2 * alpha, &lambda_low, &lambda_high);
    if (alpha >= 0.5 || !s.ok) out->smallest_margin_w = NAN;
    else out->smallest_margin_w = std::sqrt(lambda_high / n);
    return Status::success();
}

double conformity_power(double true_w, double margin_w, double n, double alpha, double df) {
    if (!check_common(n, df, alpha, margin_w).ok || !(true_w >= 0) || std::isinf(true_w)) return NAN;
    const double critical = conformity_critical_value(alpha, df, n * margin_w * margin_w);
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

namespace {
// sqrt(1/p1 + 1/p2) over the two smallest positive shares.
double shift_scale(const std::vector<double>& shares) {
    double p1 = INFINITY, p2 = INFINITY;
    for (double p : shares) {
        if (!(p > 0)) continue;
        if (p < p1) { p2 = p1; p1 = p; } else if (p < p2) p2 = p;
    }
    if (!std::isfinite(p2)) return NAN;
    return std::sqrt(1 / p1 + 1 / p2);
}
}  // namespace

double margin_points_from_w(double margin_w, const std::vector<double>& shares) {
    if (!(margin_w >= 0) || std::isinf(margin_w)) return NAN;
    return 100 * margin_w / shift_scale(shares);
}

double margin_w_from_points(double points, const std::vector<double>& shares) {
    if (!(points > 0 && points <= 100)) return NAN;
    return points / 100 * shift_scale(shares);
}

bool read_conformity_margin(const std::string& text, double* margin_w, double* margin_points) {
    *margin_w = *margin_points = NAN;
    std::string t;
    for (char ch : text) t += static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
    const char* const point_suffixes[] = {"percentage points", "percentage point", "points", "point", "pp", "%"};
    bool points = false;
    while (!t.empty() && t.back() == ' ') t.pop_back();
    for (const char* suffix : point_suffixes) {
        const std::string sfx = suffix;
        if (t.size() > sfx.size() && t.compare(t.size() - sfx.size(), sfx.size(), sfx) == 0) {
            t.erase(t.size() - sfx.size());
            points = true;
            break;
        }
    }
    while (!t.empty() && t.back() == ' ') t.pop_back();
    while (!t.empty() && t.front() == ' ') t.erase(0, 1);
    double v = 0;  // the one reader of typed numbers: "0,1" reads as "0.1" does
    if (t.empty() || !read_typed_number(t, &v) || !std::isfinite(v)) return false;
    (points ? *margin_points : *margin_w) = v;
    return true;
}

const char* conformity_margin_guidance() {
    return "The margin w0 is the largest departure from the stated mix that still counts as conforming. Cohen's "
           "benchmarks call w = 0.1 small, 0.3 medium and 0.5 large; a margin of 0.1 is a common strict choice. It can "
           "also be typed as percentage points (\"2 pp\"): the largest shift of share between two categories that "
           "still counts as conforming; each is shown with the other. The "
           "contract, specification or your local rule decides the margin; choose it before looking at the data.";
}

}  // namespace tallyproof
