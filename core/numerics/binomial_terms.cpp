// Binomial terms from the mode outward by the ratio recurrence, the mode by log-factorials
// (Johnson, Kemp & Kotz 2005, Univariate Discrete Distributions, 3rd ed., sect. 3.2); the
// remainder past a term t with ratio rho < 1 is at most t rho / (1 - rho) (ratios only fall).
#include "binomial_terms.hpp"

#include <cmath>

namespace tallyproof {
namespace {
constexpr double kTermCut = 1e-20;
}

double binomial_terms(int M, double q, double odds, const std::vector<double>& lf, std::vector<double>* pmf, int* lo,
                      int* hi) {
    int mode = static_cast<int>(std::floor((M + 1.0) * q));
    if (mode > M) mode = M;
    const double log_mode = lf[static_cast<std::size_t>(M)] - lf[static_cast<std::size_t>(mode)] -
                            lf[static_cast<std::size_t>(M - mode)] + mode * std::log(q) + (M - mode) * std::log1p(-q);
    pmf->assign(static_cast<std::size_t>(M) + 1, 0.0);
    double* f = pmf->data();
    f[mode] = std::exp(log_mode);
    *lo = *hi = mode;
    double bounded = 0;
    for (int x = mode; x < M; ++x) {
        const double rho = (static_cast<double>(M - x) / (x + 1.0)) * odds;
        const double t = f[x] * rho;
        if (t < kTermCut && rho < 0.5) {
            bounded += t / (1 - rho);
            break;
        }
        f[x + 1] = t;
        *hi = x + 1;
    }
    for (int x = mode; x > 0; --x) {
        const double rho = x / ((M - x + 1.0) * odds);
        const double t = f[x] * rho;
        if (t < kTermCut && rho < 0.5) {
            bounded += t / (1 - rho);
            break;
        }
        f[x - 1] = t;
        *lo = x - 1;
    }
    return bounded;
}

}  // namespace tallyproof
