// Binomial draws without tables. BTRD (Hörmann 1993, J. Statist. Comput. Simul. 46:101-110,
// algorithm BTRD, steps 0-5.3; the constants a, b, alpha, v_r and the Stirling-correction table fc
// are Hörmann's, as in Boost.Random's binomial_distribution; divisions by b and v_r are made once
// as multiplications by their reciprocals, and step 4's ratio f(k)/f(mode) is compared as a
// product of numerators against one of denominators, which changes only rounding): a transformed-rejection hat with a
// squeeze that accepts about 86% of draws from one uniform, then recursive evaluation of f(k)/f(mode)
// near the mode, a second squeeze and the Stirling-series log-density ratio beyond it. For a mode
// below 11 (where BTRD is not valid) the second waiting-time method (Devroye 1986, Non-Uniform Random
// Variate Generation, ch. X.4): X = the least x with E_0/n + E_1/(n-1) + ... + E_x/(n-x) > -log(1-p),
// E_i standard exponentials, is Bin(n, p) (the order statistics of n exponentials, Renyi's
// representation). Logarithms by portable_log only. Rounding: each log ratio in step 5.3 is formed
// to about 1e-16 relative and multiplied by at most n, so the acceptance boundary carries a
// relative error below n * 3e-16 (3e-10 at n = 1e6), confined to draws more than 15 from the mode
// that neither squeeze decides.
#include "binomial_draw.hpp"

#include <cmath>

#include "portable_log.hpp"
#include "random.hpp"

namespace tallyproof {
namespace {

// fc(k) = log k! - [(k + 1/2) log(k + 1) - (k + 1) + log(2 pi) / 2] (Hörmann 1993, step 5.3):
// tabulated for k < 10, else the Stirling series to 1/(k + 1)^5.
double stirling_correction(int k) {
    static const double table[10] = {0.08106146679532726,  0.04134069595540929,  0.02767792568499834,
                                     0.02079067210376509,  0.01664469118982119,  0.01387612882307075,
                                     0.01189670994589177,  0.01041126526197209,  0.009255462182712733,
                                     0.008330563433362871};
    if (k < 10) return table[k];
    const double ikp1 = 1.0 / (k + 1.0), ikp1_2 = ikp1 * ikp1;
    return (1.0 / 12 - (1.0 / 360 - (1.0 / 1260) * ikp1_2) * ikp1_2) * ikp1;
}

int waiting_time(int n, const BinomialShare& s, Xoshiro256* g) {
    double sum = 0;
    for (int x = 0; x < n; ++x) {
        sum += -portable_log(1.0 - next_unit(g)) / static_cast<double>(n - x);  // 1 - u in (0, 1]
        if (sum > s.rate) return x;
    }
    return n;
}

int btrd(int n, const BinomialShare& s, Xoshiro256* g, int mode) {
    const double p = s.p, r = s.odds;
    const double np = n * p, npq = np * (1.0 - p), spq = std::sqrt(npq);
    const double b = 1.15 + 2.53 * spq, inv_b = 1.0 / b;
    const double a = -0.0873 + 0.0248 * b + 0.01 * p, two_a = 2 * a;
    const double c = np + 0.5;
    const double alpha = (2.83 + 5.1 * inv_b) * spq;
    const double v_r = 0.92 - 4.2 * inv_b, inv_v_r = 1.0 / v_r;
    const double u_rv_r = 0.86 * v_r;
    for (;;) {
        double v = next_unit(g);
        double u;
        if (v <= u_rv_r) {  // step 1: inside the squeeze box
            u = v * inv_v_r - 0.43;
            return static_cast<int>(std::floor((two_a / (0.5 - std::fabs(u)) + b) * u + c));
        }
        if (v >= v_r) {  // step 2
            u = next_unit(g) - 0.5;
        } else {
            u = v * inv_v_r - 0.93;
            u = (u < 0 ? -0.5 : 0.5) - u;
            v = next_unit(g) * v_r;
        }
        const double us = 0.5 - std::fabs(u);  // step 3
        if (!(us > 0)) continue;               // u = -1/2 exactly: outside the hat's support
        const double kd = std::floor((two_a / us + b) * u + c);
        if (kd < 0 || kd > n) continue;
        const int k = static_cast<int>(kd);
        v = v * alpha / (a / (us * us) + b);
        const int km = k > mode ? k - mode : mode - k;
        if (km <= 15) {  // step 4: f(k) / f(mode) by the recursion, as numerator and denominator products
            // prod (nr / i - r) = prod r (n + 1 - i) / prod i, compared without dividing (both
            // products stay below 1e150 for n < 2^31 and at most 15 factors).
            double num = 1, den = 1;
            if (mode < k) {
                for (int i = mode + 1; i <= k; ++i) {
                    num = num * (r * ((n - i) + 1.0));
                    den = den * i;
                }
                if (v * den <= num) return k;  // v <= f(k) / f(mode)
            } else {
                for (int i = k + 1; i <= mode; ++i) {
                    num = num * (r * ((n - i) + 1.0));
                    den = den * i;
                }
                if (v * num <= den) return k;  // v f(mode) / f(k) <= 1
            }
            continue;
        }
        // Step 5: squeeze on log v, then the exact log-density ratio by Stirling's series.
        v = portable_log(v);
        const double kmd = km;
        const double rho = (kmd / npq) * (((kmd / 3.0 + 0.625) * kmd + 1.0 / 6) / npq + 0.5);
        const double t = -kmd * kmd / (2 * npq);
        if (v < t - rho) return k;
        if (v > t + rho) continue;
        const double nm = (n - mode) + 1.0;  // in double: n + 1 may pass INT_MAX
        const double h = (mode + 0.5) * portable_log((mode + 1.0) / (r * nm)) + stirling_correction(mode) +
                         stirling_correction(n - mode);
        const double nk = (n - k) + 1.0;
        // (n + 1) log(nm / nk) as log1p((k - mode) / nk): nm / nk is near 1 and n large.
        if (v <= h + (n + 1.0) * portable_log1p(static_cast<double>(k - mode) / nk) +
                     (k + 0.5) * portable_log(nk * r / (k + 1.0)) - stirling_correction(k) - stirling_correction(n - k))
            return k;
    }
}

}  // namespace

BinomialShare binomial_share(double p, double odds) {
    BinomialShare s;
    s.p = p;
    s.odds = odds;
    s.rate = portable_log1p(odds);  // -log(1 - p) = log(1 / (1 - p)) = log(1 + odds)
    return s;
}

int draw_binomial(int n, const BinomialShare& s, Xoshiro256* g) {
    if (n <= 0 || !(s.p > 0)) return 0;
    const int mode = static_cast<int>(std::floor((n + 1.0) * s.p));
    return mode < 11 ? waiting_time(n, s, g) : btrd(n, s, g, mode);
}

}  // namespace tallyproof
