// Continuous distributions fitted to binned measurements with stated bin edges: normal,
// lognormal and exponential, each parameter given or estimated by maximum likelihood on the
// grouped (multinomial) counts, not from bin midpoints (Cramer 1946, Mathematical Methods of
// Statistics, ch. 30). Bin probabilities from erfc / expm1 in complement form.
#pragma once
#include <optional>
#include <vector>

#include "fit_distribution.hpp"

namespace tallyproof {

// Bins are given by their edges: bin i is [edges[i], edges[i+1]), so k bins need k + 1 edges,
// strictly increasing. edges.front() may be -inf and edges.back() +inf (open end bins). For the
// lognormal and exponential models, whose support is x > 0, a first edge at or below 0 means
// "below edges[1]".
struct ContinuousFitOptions {
    // Support beyond the edges: widen the end bins to -inf / +inf (or 0), or add empty cells.
    TailCells tail_cells = TailCells::widen_end_bins;
};

// Normal(mean, sd), sd > 0.
FittedDistribution fit_normal(const std::vector<double>& edges, const std::vector<double>& observed,
                              std::optional<double> mean, std::optional<double> sd,
                              const ContinuousFitOptions& options = {});

// Lognormal: log X ~ Normal(meanlog, sdlog), sdlog > 0 (R's dlnorm parametrization).
FittedDistribution fit_lognormal(const std::vector<double>& edges, const std::vector<double>& observed,
                                 std::optional<double> meanlog, std::optional<double> sdlog,
                                 const ContinuousFitOptions& options = {});

// Exponential(rate): P(X > x) = exp(-rate x), rate > 0, mean 1 / rate.
FittedDistribution fit_exponential(const std::vector<double>& edges, const std::vector<double>& observed,
                                   std::optional<double> rate, const ContinuousFitOptions& options = {});

}  // namespace tallyproof
