// The brute-force reference shared by the exact-method tests: every outcome with the observed
// total visited by an odometer over the first k - 1 counts, P(x) = N! prod pi^x / x! (lgamma), the
// statistic from the Cressie-Read definition (Pearson's (x - e)^2 / e at lambda = 1), and the p-value
// P(statistic >= observed) or P(outcome probability <= observed) with the core's tie rule (1e-9
// relative). Feasible to about 5e6 tuples ((N + 1)^(k - 1)) in a unit test.
#pragma once
#include <cmath>
#include <cstddef>
#include <vector>

#include "exact_multinomial.hpp"

namespace tallyproof_test {

struct EnumeratedTable {
    std::vector<int> observed;
    std::vector<double> shares;  // need not sum to 1
};

inline double brute_force_p(const EnumeratedTable& c, tallyproof::ExtremeOrdering ordering, double lambda = 1.0) {
    const std::size_t k = c.observed.size();
    int n = 0;
    double total = 0;
    for (int v : c.observed) n += v;
    for (double s : c.shares) total += s;
    auto log_p = [&](const std::vector<int>& x) {
        double l = std::lgamma(n + 1.0);
        for (std::size_t i = 0; i < k; ++i) l += x[i] * std::log(c.shares[i] / total) - std::lgamma(x[i] + 1.0);
        return l;
    };
    auto statistic = [&](const std::vector<int>& x) {
        double t = 0;
        for (std::size_t i = 0; i < k; ++i) {
            const double o = x[i], e = n * c.shares[i] / total;
            if (lambda == 1) t += (o - e) * (o - e) / e;
            else if (lambda == 0) t += o > 0 ? 2 * o * std::log(o / e) : 0.0;
            else t += 2 / (lambda * (lambda + 1)) * ((o > 0 ? std::pow(o, lambda + 1) * std::pow(e, -lambda) : 0.0) - o);
        }
        return t;
    };
    const double l_obs = log_p(c.observed), t_obs = statistic(c.observed);
    std::vector<int> x(k, 0);
    double p = 0;
    for (;;) {
        int used = 0;
        for (std::size_t i = 0; i + 1 < k; ++i) used += x[i];
        if (used <= n) {
            x[k - 1] = n - used;
            const bool extreme = ordering == tallyproof::ExtremeOrdering::probability ? log_p(x) <= l_obs + 1e-9
                                                                                      : statistic(x) >= t_obs - 1e-9 * std::fabs(t_obs);
            if (extreme) p += std::exp(log_p(x));
        }
        std::size_t i = 0;  // odometer over x[0..k-2], each digit 0..n
        while (i + 1 < k && x[i] == n) x[i++] = 0;
        if (i + 1 >= k) break;
        ++x[i];
    }
    return p;
}

}  // namespace tallyproof_test
