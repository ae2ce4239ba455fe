// Conditional p-values of the 2 x k homogeneity test, given both margins (the tables then follow
// the multivariate hypergeometric law P(x) = prod_j C(c_j, x_j) / C(N, r); Agresti 2013,
// Categorical Data Analysis, 3rd ed., sec. 3.5): exact, by enumerating every table with those
// margins and summing the probability of those with a statistic at least the observed one (a sum
// of positive terms, in log space); and Monte Carlo, B tables drawn by a partial Fisher-Yates
// shuffle of the N observations, p = (b + 1) / (B + 1) (Davison and Hinkley 1997, eq. 4.11; as
// R's chisq.test(simulate.p.value = TRUE)). Ties within 1e-9 relative count as extreme.
// Ordered by probability instead, a table counts as extreme when its own probability is at most
// the observed table's times 1 + 1e-7 (R's fisher.test, which uses the same relative tolerance).
#pragma once
#include <cstdint>

#include "chi_square_tail.hpp"
#include "homogeneity_table.hpp"
#include "monte_carlo.hpp"
#include "status.hpp"

namespace tallyproof {

struct HomogeneityExactResult {
    TailProbability p;
    double tables = 0;  // tables enumerated (all with the observed margins)
};

// Number of 2 x k tables with the margins of `t` (as a double); NaN when counting itself would
// take more than about 5e7 steps (the smaller row total times k).
double homogeneity_table_count(const HomogeneityTable& t);

// Refuses (naming the number of tables and offering Monte Carlo) above max_tables.
// by_probability: order tables by their probability (Fisher's exact test for a 2 x k table).
Status homogeneity_exact_p(const HomogeneityTable& t, double lambda, double max_tables, HomogeneityExactResult* out,
                           bool by_probability = false);

// B replicates from `seed` (xoshiro256**, core/numerics/random). Refuses when B times the smaller row
// total exceeds max_work (samples that large are where the asymptotic p-value holds).
Status homogeneity_monte_carlo_p(const HomogeneityTable& t, double lambda, std::uint64_t replicates, std::uint64_t seed,
                                 double max_work, MonteCarloResult* out, bool by_probability = false);

}  // namespace tallyproof
