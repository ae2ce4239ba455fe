// Discrete distributions fitted to ordered count categories (0, 1, 2, "5 or more"): Poisson,
// binomial, geometric, negative binomial and discrete uniform, each parameter given or estimated
// by maximum likelihood on the grouped (multinomial) counts (Cramer 1946, Mathematical Methods
// of Statistics, ch. 30). Cell probabilities come from complement-form tails.
#pragma once
#include <optional>
#include <vector>

#include "fit_distribution.hpp"

namespace tallyproof {

// The integers lo..hi. lo = -inf (or any lo at or below the support's minimum) means "hi or
// fewer"; hi = +inf means "lo or more". Bins must be in ascending order, contiguous (each lo is
// the previous hi + 1) and not overlap; ends must be whole numbers.
struct IntegerBin {
    double lo = 0;
    double hi = 0;
};

struct DiscreteFitOptions {
    // Support beyond the bins: widen the end bins (textbook practice, "4 or more") or add cells
    // with observed 0. Only add_empty_cells keeps single-value bins exact, so that the Poisson
    // grouped MLE is the sample mean.
    TailCells tail_cells = TailCells::widen_end_bins;
};

// Poisson(mean), support 0, 1, 2, ...; mean > 0. Estimated when not given.
FittedDistribution fit_poisson(const std::vector<IntegerBin>& bins, const std::vector<double>& observed,
                               std::optional<double> mean, const DiscreteFitOptions& options = {});

// Binomial(trials, p), support 0..trials; trials a given whole number >= 1, 0 < p < 1.
FittedDistribution fit_binomial(const std::vector<IntegerBin>& bins, const std::vector<double>& observed,
                                double trials, std::optional<double> p, const DiscreteFitOptions& options = {});

// Geometric(p) counting failures before the first success: P(k) = p (1 - p)^k, k = 0, 1, 2, ...,
// mean (1 - p) / p; 0 < p < 1.
FittedDistribution fit_geometric(const std::vector<IntegerBin>& bins, const std::vector<double>& observed,
                                 std::optional<double> p, const DiscreteFitOptions& options = {});

// Negative binomial counting failures before the `size`-th success (size r > 0, real):
// P(k) = Gamma(k + r) / (Gamma(r) k!) p^r (1 - p)^k, mean = r (1 - p) / p, variance = mean + mean^2 / r
// (R's dnbinom(size, prob) / dnbinom(size, mu)). Give at most one of p and mean; whatever is not
// given is estimated. The result lists size, p and mean.
struct NegativeBinomialParameters {
    std::optional<double> size;
    std::optional<double> p;
    std::optional<double> mean;
};
FittedDistribution fit_negative_binomial(const std::vector<IntegerBin>& bins, const std::vector<double>& observed,
                                         const NegativeBinomialParameters& given,
                                         const DiscreteFitOptions& options = {});

// Discrete uniform over the integers from the first bin's lo to the last bin's hi (both finite);
// a bin's probability is its width over the range's. Nothing is estimated.
FittedDistribution fit_discrete_uniform(const std::vector<IntegerBin>& bins, const std::vector<double>& observed);

}  // namespace tallyproof
