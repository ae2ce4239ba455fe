// Pearson X² of binomial draws tallied at x = a..b against Boost.Math's binomial pmf: walking
// x = a..b, expected counts are gathered until each cell holds at least 50 (the tails below a and
// above b folded into the end cells), the usual rule for a chi-square goodness-of-fit check
// (common practice). Shared by the sampler tests.
#pragma once
#include <cstddef>
#include <vector>

#include <boost/math/distributions/binomial.hpp>

inline double binomial_cells_chi2(const std::vector<long long>& hits, int a, int b, double draws,
                                  const boost::math::binomial_distribution<double>& dist, int* cells_out) {
    double chi2 = 0, cell_e = draws * (a > 0 ? boost::math::cdf(dist, a - 1.0) : 0.0), cell_o = 0;
    int cells = 0;
    for (int x = a; x <= b; ++x) {
        cell_e += draws * boost::math::pdf(dist, x);
        cell_o += static_cast<double>(hits[static_cast<std::size_t>(x - a)]);
        if (x == b) cell_e += draws * boost::math::cdf(boost::math::complement(dist, static_cast<double>(b)));
        if (cell_e >= 50 || x == b) {
            chi2 += (cell_o - cell_e) * (cell_o - cell_e) / cell_e;
            ++cells;
            cell_e = cell_o = 0;
        }
    }
    *cells_out = cells;
    return chi2;
}
