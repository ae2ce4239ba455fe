// Equal-probability bin edges from the raw values' moments: maximum likelihood estimates of the
// parameters not given, then the quantiles i/K through Boost.Math with the quiet policy (upper
// half from the complement, (K - i)/K, so edges far out keep their accuracy).
#include "equal_probability_bins.hpp"

#include <cmath>
#include <cstdio>
#include <optional>

#include <boost/math/distributions/exponential.hpp>
#include <boost/math/distributions/lognormal.hpp>
#include <boost/math/distributions/normal.hpp>

#include "math_policy.hpp"
#include "number_format.hpp"

namespace tallyproof {
namespace {

std::optional<double> find(const std::vector<std::pair<std::string, double>>& given, const char* name) {
    for (const auto& [k, v] : given)
        if (k == name) return v;
    return std::nullopt;
}

std::string num(double x) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.6g", x);
    return buf;
}


// The inner edge i of K under `dist`: quantile i/K, from the complement above the median.
template <class Dist>
double inner_edge(const Dist& dist, int i, int bins) {
    if (2 * i <= bins) return boost::math::quantile(dist, static_cast<double>(i) / bins);
    return boost::math::quantile(boost::math::complement(dist, static_cast<double>(bins - i) / bins));
}

}  // namespace

void RawMoments::add(double x) {
    n += 1;
    const double d = x - mean;
    mean += d / n;
    m2 += d * (x - mean);
}

bool places_equal_probability_bins(ModelKind kind) {
    return kind == ModelKind::normal || kind == ModelKind::lognormal || kind == ModelKind::exponential;
}

EqualProbabilityBins equal_probability_bins(ModelKind kind, const RawMoments& moments,
                                            const std::vector<std::pair<std::string, double>>& given, int bins) {
    EqualProbabilityBins out;
    const std::string model = model_kind_name(kind);
    if (!places_equal_probability_bins(kind)) {
        out.status = Status::failure("Equal-probability bins are placed at the quantiles of a normal, lognormal or exponential "
                                     "model; the " + model + " model is not one of these. Choose one of them, or give bin "
                                     "edges (such as 0,10,20,inf) or equal widths (equal:K).");
        return out;
    }
    if (bins < 2 || bins > kMaxEqualProbabilityBins) {
        out.status = Status::failure("Equal-probability bins: expected a number of bins from 2 to " +
                                     std::to_string(kMaxEqualProbabilityBins) + ", got " + std::to_string(bins) + ".");
        return out;
    }
    if (!(moments.n >= 1)) {
        out.status = Status::failure("No values to count into bins.");
        return out;
    }
    const double n = moments.n;
    auto positive = [&](const char* name, double v) {
        if (std::isfinite(v) && v > 0) return true;
        out.status = Status::failure("The " + model + " model's " + name + " must be a positive number; " + num(v) + " was given.");
        return false;
    };
    auto finite = [&](const char* name, double v) {
        if (std::isfinite(v)) return true;
        out.status = Status::failure("The " + model + " model's " + name + " must be a finite number; " + num(v) + " was given.");
        return false;
    };
    out.edges.assign(static_cast<std::size_t>(bins) + 1, 0.0);
    out.edges.back() = HUGE_VAL;
    std::string params;
    if (kind == ModelKind::normal || kind == ModelKind::lognormal) {
        const bool logs = kind == ModelKind::lognormal;
        const char* loc_name = logs ? "meanlog" : "mean";
        const char* scale_name = logs ? "sdlog" : "sd";
        const auto loc_given = find(given, loc_name), scale_given = find(given, scale_name);
        if (loc_given && !finite(loc_name, *loc_given)) return out;
        if (scale_given && !positive(scale_name, *scale_given)) return out;
        const double loc = loc_given.value_or(moments.mean);
        // Maximum likelihood sd about `loc`: sqrt(sum (x - loc)^2 / n).
        const double dev = moments.mean - loc;
        const double scale = scale_given.value_or(std::sqrt(moments.m2 / n + dev * dev));
        if (!(scale > 0) || !std::isfinite(scale) || !std::isfinite(loc)) {
            out.status = Status::failure("All " + format_count(n) + " values are " + num(logs ? std::exp(moments.mean) : moments.mean) +
                                         ": the " + model + " model fitted to them has " + scale_name +
                                         " 0, so it cannot place equal-probability bins; they need a spread of values.");
            return out;
        }
        out.parameters = {{loc_name, loc, !loc_given}, {scale_name, scale, !scale_given}};
        if (logs) {
            const boost::math::lognormal_distribution<double, quiet_policy> dist(loc, scale);
            for (int i = 1; i < bins; ++i) out.edges[i] = inner_edge(dist, i, bins);
        } else {
            const boost::math::normal_distribution<double, quiet_policy> dist(loc, scale);
            for (int i = 1; i < bins; ++i) out.edges[i] = inner_edge(dist, i, bins);
            out.edges.front() = -HUGE_VAL;
        }
    } else {
        const auto rate_given = find(given, "rate");
        if (rate_given && !positive("rate", *rate_given)) return out;
        if (!rate_given && !(moments.mean > 0)) {
            out.status = Status::failure("All " + format_count(n) + " values are 0: the exponential model fitted to them has no "
                                         "positive mean, so it cannot place equal-probability bins.");
            return out;
        }
        const double rate = rate_given.value_or(1.0 / moments.mean);
        out.parameters = {{"rate", rate, !rate_given}};
        const boost::math::exponential_distribution<double, quiet_policy> dist(rate);
        for (int i = 1; i < bins; ++i) out.edges[i] = inner_edge(dist, i, bins);
    }
    for (int i = 1; i <= bins; ++i)
        if (!(out.edges[i] > out.edges[i - 1]) || (i < bins && !std::isfinite(out.edges[i]))) {
            out.status = Status::failure("The " + model + " model's quantiles " + std::to_string(i - 1) + "/" + std::to_string(bins) +
                                         " and " + std::to_string(i) + "/" + std::to_string(bins) +
                                         " cannot be told apart in double precision (" + num(out.edges[i - 1]) + ", " +
                                         num(out.edges[i]) + "); expected fewer bins.");
            out.edges.clear();
            out.parameters.clear();
            return out;
        }
    std::size_t estimated = 0;
    for (const auto& p : out.parameters) estimated += p.estimated ? 1 : 0;
    const std::string how = "estimated from the " + format_count(n) + " raw values by maximum likelihood";
    for (const auto& p : out.parameters) {
        params += std::string(params.empty() ? "" : " and ") + p.name + " " + num(p.value);
        if (estimated > 0 && estimated < out.parameters.size()) params += p.estimated ? " (" + how + ")" : " (given)";
    }
    if (estimated == out.parameters.size()) params += " " + how;
    else if (estimated == 0) params += " (given)";
    out.note = std::to_string(bins) + " bins of equal probability 1/" + std::to_string(bins) + " under the " + model +
               " model with " + params + ": the inner edges are its quantiles i/" + std::to_string(bins) + ".";
    return out;
}

}  // namespace tallyproof
