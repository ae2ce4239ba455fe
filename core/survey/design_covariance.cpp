// Design-based covariance of weighted totals, with-replacement PSUs within strata (Wolter 2007,
// ch. 6; Lumley 2010, appendix; the same estimator as R survey 4.1's svyrecvar without fpc).
#include "design_covariance.hpp"

#include <map>
#include <utility>

#include "compensated_sum.hpp"

namespace tallyproof {

std::vector<double> weighted_totals(const SurveySample& s) {
    std::vector<CompensatedSum> t(s.categories.size());
    for (std::size_t i = 0; i < s.weight.size(); ++i) t[s.category[i]].add(s.weight[i]);
    std::vector<double> out;
    for (const auto& x : t) out.push_back(x.value());
    return out;
}

SquareMatrix linearised_covariance(const SurveySample& s, const std::vector<double>& centre) {
    const std::size_t k = s.categories.size();
    // PSU totals of z_i = w_i (y_i − centre), grouped by stratum.
    std::map<std::size_t, std::map<std::size_t, std::vector<double>>> psu;  // stratum -> PSU -> z total
    for (std::size_t i = 0; i < s.weight.size(); ++i) {
        const std::size_t h = s.stratum.empty() ? 0 : s.stratum[i];
        const std::size_t c = s.cluster.empty() ? i : s.cluster[i];
        auto& z = psu[h][c];
        if (z.empty()) z.assign(k, 0.0);
        for (std::size_t j = 0; j < k; ++j) z[j] += s.weight[i] * ((s.category[i] == j ? 1.0 : 0.0) - centre[j]);
    }
    SquareMatrix V;
    V.k = k;
    V.v.assign(k * k, 0.0);
    for (const auto& [h, units] : psu) {
        const double nh = static_cast<double>(units.size());
        if (nh < 2) continue;  // refused by check_survey_sample
        std::vector<double> mean(k, 0.0);
        for (const auto& [c, z] : units)
            for (std::size_t j = 0; j < k; ++j) mean[j] += z[j] / nh;
        const double factor = nh / (nh - 1);
        for (const auto& [c, z] : units)
            for (std::size_t a = 0; a < k; ++a)
                for (std::size_t b = 0; b < k; ++b) V.v[a * k + b] += factor * (z[a] - mean[a]) * (z[b] - mean[b]);
    }
    return V;
}

SquareMatrix weighted_share_covariance(const SurveySample& s) {
    const std::vector<double> totals = weighted_totals(s);
    CompensatedSum n_hat;
    for (double t : totals) n_hat.add(t);
    std::vector<double> shares;
    for (double t : totals) shares.push_back(t / n_hat.value());
    SquareMatrix V = linearised_covariance(s, shares);
    for (double& x : V.v) x /= n_hat.value() * n_hat.value();
    return V;
}

}  // namespace tallyproof
