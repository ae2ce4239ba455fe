// Equal-probability bins: the K + 1 edges at which a normal, lognormal or exponential model
// fitted to raw values gives every bin probability 1/K. Parameters not given are estimated from
// the raw values by maximum likelihood (normal: the mean and the root mean square deviation,
// divisor n; lognormal: the same on the logarithms; exponential: rate 1/mean; Johnson, Kotz and
// Balakrishnan 1994, Continuous Univariate Distributions, vol. 1, ch. 13, 14 and 19). The inner
// edges are the model's quantiles i/K (Boost.Math), the outer ones -inf and +inf, or 0 and +inf.
// Equiprobable cells: Mann and Wald (1942, Annals of Mathematical Statistics 13:306-317); cells
// placed from estimated parameters leave the statistic's limit unchanged: Moore and Spruill
// (1975, Annals of Statistics 3:599-616).
#pragma once
#include <string>
#include <utility>
#include <vector>

#include "analysis.hpp"
#include "fit_distribution.hpp"
#include "status.hpp"

namespace tallyproof {

constexpr int kMaxEqualProbabilityBins = 1000;

// Count, mean and sum of squared deviations of the values, updated one value at a time
// (Welford 1962, Technometrics 4:419-420), so the raw values need not be kept.
struct RawMoments {
    double n = 0;
    double mean = 0;
    double m2 = 0;  // sum of (x - mean)^2
    void add(double x);
};

// True for normal, lognormal and exponential: the models that can place equal-probability bins.
bool places_equal_probability_bins(ModelKind kind);

struct EqualProbabilityBins {
    Status status;                           // !ok: a refusal; nothing else is set
    std::vector<double> edges;               // K + 1, strictly increasing
    std::vector<ParameterValue> parameters;  // every parameter, given or estimated from the raw values
    std::string note;                        // one sentence: the model, its parameters, the edges
};

// `moments` are those of the raw values (of their natural logarithms for the lognormal, whose
// values must all be > 0; the exponential's must be >= 0). `given` holds parameters stated by
// the user (as Model::parameters); the others are estimated. Names the model has not are ignored
// here (the test refuses them). K = `bins`, from 2 to kMaxEqualProbabilityBins.
EqualProbabilityBins equal_probability_bins(ModelKind kind, const RawMoments& moments,
                                            const std::vector<std::pair<std::string, double>>& given, int bins);

}  // namespace tallyproof
