// Homogeneity of two samples over k categories (Pearson 1900; Haberman 1973 for the adjusted
// residuals); terms from power_divergence_term, so any Cressie-Read lambda works as for one sample.
#include "homogeneity_table.hpp"

#include <cmath>
#include <string>

#include "number_format.hpp"
#include "power_divergence.hpp"

namespace tallyproof {

Status homogeneity_table(const std::vector<double>& current, const std::vector<double>& reference, double lambda,
                         HomogeneityTable* out) {
    *out = HomogeneityTable{};
    const std::size_t k = current.size();
    if (k < 2) return Status::failure("A comparison of two samples needs at least two categories.");
    if (reference.size() != k)
        return Status::failure("The previous sample has " + std::to_string(reference.size()) + " counts but there are " +
                               std::to_string(k) + " categories; give one count per category.");
    double r1 = 0, r2 = 0;
    for (std::size_t j = 0; j < k; ++j) {
        for (double v : {current[j], reference[j]})
            if (!std::isfinite(v) || v < 0 || v != std::floor(v) || v >= 9007199254740992.0)
                return Status::failure("Count " + format_plain(v) + " in category " + std::to_string(j + 1) +
                                       " must be a non-negative whole number.");
        if (current[j] + reference[j] <= 0)
            return Status::failure("Category " + std::to_string(j + 1) + " is empty in both samples.");
        r1 += current[j];
        r2 += reference[j];
    }
    if (!(r1 > 0)) return Status::failure("All counts of the current sample are zero: there is nothing to compare.");
    if (!(r2 > 0)) return Status::failure("All counts of the previous sample are zero: there is nothing to compare with.");
    const double n = r1 + r2;
    HomogeneityTable& t = *out;
    t.current = current;
    t.reference = reference;
    t.n_current = r1;
    t.n_reference = r2;
    t.df = static_cast<double>(k) - 1;
    for (std::size_t j = 0; j < k; ++j) {
        const double c = current[j] + reference[j];
        const double e1 = r1 * c / n, e2 = r2 * c / n;
        t.pooled_shares.push_back(c / n);
        t.expected_current.push_back(e1);
        t.expected_reference.push_back(e2);
        const double term = power_divergence_term(current[j], e1, lambda) + power_divergence_term(reference[j], e2, lambda);
        if (!std::isfinite(term))
            return Status::failure("The statistic with λ = " + format_plain(lambda) + " is undefined when a cell is empty "
                                   "(category " + std::to_string(j + 1) + "); use Pearson's χ² or G².");
        t.contributions.push_back(term);
        t.statistic += term;
        const double d = current[j] - e1;
        t.pearson_residuals.push_back(d / std::sqrt(e1));
        // 1 - c_j/N as the other columns' share: exact when c_j is nearly all of N
        t.adjusted_residuals.push_back(d / std::sqrt(e1 * (r2 / n) * ((n - c) / n)));
    }
    return Status::success();
}

double homogeneity_statistic(const HomogeneityTable& t, const std::vector<int>& x, double lambda) {
    double s = 0;
    for (std::size_t j = 0; j < x.size(); ++j) {
        const double c = t.current[j] + t.reference[j];
        s += power_divergence_term(x[j], t.expected_current[j], lambda) +
             power_divergence_term(c - x[j], t.expected_reference[j], lambda);
    }
    return s;
}

}  // namespace tallyproof
