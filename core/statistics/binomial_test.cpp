// Two-sided exact binomial p-value as in R 4.2's binom.test (its confidence interval is not made):
// P = sum of P(X = i) over all i with P(X = i) <= P(X = x) * (1 + 1e-7). The pmf is monotone on
// each side of n p, so the far-tail cut point is found by bisection (O(log n) pmf calls) and
// the p-value is one lower and one upper cdf. When that sum underflows, log10 P comes from
// log pmf (lgamma) times a ratio series summed term by term, good to about 1e-12 relative.
#include "binomial_test.hpp"

#include <cmath>
#include <cstdint>
#include <limits>

#include <boost/math/distributions/binomial.hpp>
#include <boost/math/special_functions/gamma.hpp>

#include "math_policy.hpp"

namespace tallyproof {
namespace {

constexpr double kRelErr = 1 + 1e-7;  // R's binom.test tolerance for "no larger than"
constexpr double kLn10 = 2.302585092994045684;
constexpr double kMaxTerms = 1e7;  // a tail beyond the double range falls off far faster than this
using Binomial = boost::math::binomial_distribution<double, quiet_policy>;

double log_pmf(double i, double n, double p) {
    if (p == 0) return i == 0 ? 0.0 : -INFINITY;
    if (p == 1) return i == n ? 0.0 : -INFINITY;
    return boost::math::lgamma(n + 1, quiet_policy()) - boost::math::lgamma(i + 1, quiet_policy()) -
           boost::math::lgamma(n - i + 1, quiet_policy()) + i * std::log(p) + (n - i) * std::log1p(-p);
}

// pmf in the double range and its natural log everywhere.
struct Mass {
    double value;
    double log_value;
};

Mass mass(const Binomial& dist, double i, double n, double p) {
    const double v = boost::math::pdf(dist, i);
    if (v > std::numeric_limits<double>::min()) return {v, std::log(v)};
    return {v, log_pmf(i, n, p)};
}

// "P(X = i) no larger than P(X = x)", decided on the pmf when both are normal doubles (as R
// does) and on logarithms when one has underflowed.
bool no_larger(const Mass& mi, const Mass& mx) {
    if (mx.value > std::numeric_limits<double>::min() && mi.value > std::numeric_limits<double>::min())
        return mi.value <= mx.value * kRelErr;
    return mi.log_value <= mx.log_value + std::log(kRelErr);
}

// ln P(X <= x) (lower) or ln P(X >= x) (upper) as pmf(x) times a sum of pmf ratios, for tails
// beyond the double range; the ratios fall geometrically there.
double log_tail(double x, double n, double p, bool upper) {
    const double lx = log_pmf(x, n, p);
    if (!std::isfinite(lx)) return lx;
    double sum = 1, term = 1;
    if (upper) {
        for (double i = x; i < n && i < x + kMaxTerms; ++i) {
            term *= (n - i) * p / ((i + 1) * (1 - p));
            sum += term;
            if (term < 1e-17 * sum) break;
        }
    } else {
        for (double i = x; i > 0 && i > x - kMaxTerms; --i) {
            term *= i * (1 - p) / ((n - i + 1) * p);
            sum += term;
            if (term < 1e-17 * sum) break;
        }
    }
    return lx + std::log(sum);
}

double log_add(double a, double b) {
    if (a == -INFINITY) return b;
    if (b == -INFINITY) return a;
    const double hi = std::max(a, b), lo = std::min(a, b);
    return hi + std::log1p(std::exp(lo - hi));
}

}  // namespace

TailProbability binomial_test_two_sided(double x, double n, double p) {
    const double nan = std::numeric_limits<double>::quiet_NaN();
    if (!std::isfinite(n) || n < 0 || n != std::floor(n) || !std::isfinite(x) || x < 0 || x > n ||
        x != std::floor(x) || !(p >= 0 && p <= 1))
        return {nan, nan};
    const double m = n * p;
    if (x == m) return {1.0, 0.0};
    const Binomial dist(n, p);
    const Mass mx = mass(dist, x, n, p);

    // Tail pieces: lower = P(X <= lo_end), upper = P(X >= hi_start); either may be empty.
    // The bisection runs on 64-bit integers: a double midpoint of two counts above 2^52 can round
    // back onto an end and never move (it hung for n = 9e15).
    const std::int64_t ni = static_cast<std::int64_t>(n);
    std::int64_t lo_i, hi_i;
    if (x < m) {
        // i in [ceil(m), n] with pmf(i) <= pmf(x) form a suffix [j, n] (pmf non-increasing there).
        std::int64_t a = static_cast<std::int64_t>(std::ceil(m)), b = ni + 1;  // j in [a, b]; b = n + 1: none
        while (a < b) {
            const std::int64_t mid = a + (b - a) / 2;
            if (no_larger(mass(dist, static_cast<double>(mid), n, p), mx)) b = mid;
            else a = mid + 1;
        }
        lo_i = static_cast<std::int64_t>(x);
        hi_i = a;
    } else {
        // i in [0, floor(m)] with pmf(i) <= pmf(x) form a prefix [0, j] (pmf non-decreasing there).
        std::int64_t a = -1, b = static_cast<std::int64_t>(std::floor(m));  // j in [a, b]; a = -1: none
        while (a < b) {
            const std::int64_t mid = b - (b - a) / 2;  // rounds up, so a = mid always moves
            if (no_larger(mass(dist, static_cast<double>(mid), n, p), mx)) a = mid;
            else b = mid - 1;
        }
        lo_i = a;
        hi_i = static_cast<std::int64_t>(x);
    }
    // n + 1 (no upper piece) may not be a double above 2^53; the pieces are tested as integers.
    const bool no_lower = lo_i < 0, no_upper = hi_i > ni;
    const double lo_end = static_cast<double>(lo_i), hi_start = no_upper ? n : static_cast<double>(hi_i);
    const double lower = no_lower ? 0.0 : boost::math::cdf(dist, lo_end);
    const double upper =
        no_upper ? 0.0 : (hi_i <= 0 ? 1.0 : boost::math::cdf(boost::math::complement(dist, hi_start - 1)));
    const double total = lower + upper;
    if (!std::isfinite(total)) return {nan, nan};
    if (total >= 1) return {1.0, 0.0};
    if (total > 1e-300) return {total, std::log10(total)};
    const double ll = no_lower ? -INFINITY : log_tail(lo_end, n, p, false);
    const double lu = no_upper ? -INFINITY : log_tail(hi_start, n, p, true);
    // Near and below the double's underflow Boost's cdf loses relative precision (4% seen by
    // fuzz_engine at 2e-301), so the value is taken from the logarithm, which stays exact.
    const double log10_total = log_add(ll, lu) / kLn10;
    return {std::pow(10.0, log10_total), log10_total};
}

}  // namespace tallyproof
