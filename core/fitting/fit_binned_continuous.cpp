// Grouped maximum likelihood for binned continuous data. Normal bins use erfc on the side of
// the mean where both edges lie (P(X > a) - P(X > b) above the mean), so far-tail bins keep
// full relative accuracy; the lognormal is the normal on log edges; an exponential bin is
// exp(-rate a) * -expm1(-rate (b - a)). Relative accuracy ~1e-14 per bin.
#include "fit_binned_continuous.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <functional>
#include <limits>
#include <string>

#include "fit_grouped_mle.hpp"

namespace tallyproof {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

std::string bin_label(double lo, double hi) {
    if (lo == -kInf) return "below " + fit_number(hi);
    if (hi == kInf) return fit_number(lo) + " or more";
    return fit_number(lo) + " to " + fit_number(hi);
}

using CellProbability = std::function<double(double lo, double hi)>;

// Bins from the edges, clamped to the support [smin, +inf) and extended to cover it.
FittedDistribution prepare_bins(const char* model, const std::vector<double>& edges,
                                const std::vector<double>& observed, double smin, TailCells tails) {
    FittedDistribution f;
    f.model = model;
    if (edges.size() < 3) {
        f.status = Status::failure("At least two bins (three edges) are needed; there are " +
                                   std::to_string(edges.size()) + " edges.");
        return f;
    }
    f.status = check_observed_counts(observed, edges.size() - 1);
    if (!f.status.ok) return f;
    for (std::size_t i = 0; i < edges.size(); ++i) {
        const double e = edges[i];
        const bool ok = std::isfinite(e) || (i == 0 && e == -kInf) || (i + 1 == edges.size() && e == kInf);
        if (!ok) {
            f.status = Status::failure("Bin edge " + std::to_string(i + 1) + " (" + fit_number(e) +
                                       ") must be a finite number; only the first may be -infinity and the last +infinity.");
            return f;
        }
        if (i > 0 && !(e > edges[i - 1])) {
            f.status = Status::failure("Bin edges must increase: edge " + std::to_string(i + 1) + " (" + fit_number(e) +
                                       ") does not exceed edge " + std::to_string(i) + " (" + fit_number(edges[i - 1]) + ").");
            return f;
        }
    }
    if (edges[1] <= smin) {
        f.status = Status::failure("Bin 1 (" + bin_label(edges[0], edges[1]) + ") lies below " + fit_number(smin) +
                                   ", where the " + model + " model has no values.");
        return f;
    }
    for (std::size_t i = 0; i + 1 < edges.size(); ++i) {
        f.lo.push_back(i == 0 ? std::max(edges[0], smin) : edges[i]);
        f.hi.push_back(edges[i + 1]);
        f.observed.push_back(observed[i]);
        f.added.push_back(false);
    }
    if (f.lo.front() > smin) {
        if (tails == TailCells::widen_end_bins) {
            f.warnings.push_back("The first bin (" + bin_label(f.lo.front(), f.hi.front()) + ") is taken as " +
                                 (smin == -kInf ? bin_label(-kInf, f.hi.front()) : bin_label(smin, f.hi.front())) +
                                 ", so that the bins cover every possible value.");
            f.lo.front() = smin;
        } else {
            f.warnings.push_back("A bin " + (smin == -kInf ? bin_label(-kInf, f.lo.front()) : bin_label(smin, f.lo.front())) +
                                 " with observed count 0 is added, so that the bins cover every possible value.");
            f.hi.insert(f.hi.begin(), f.lo.front());
            f.lo.insert(f.lo.begin(), smin);
            f.observed.insert(f.observed.begin(), 0.0);
            f.added.insert(f.added.begin(), true);
        }
    }
    if (f.hi.back() < kInf) {
        if (tails == TailCells::widen_end_bins) {
            f.warnings.push_back("The last bin (" + bin_label(f.lo.back(), f.hi.back()) + ") is taken as " +
                                 bin_label(f.lo.back(), kInf) + ", so that the bins cover every possible value.");
            f.hi.back() = kInf;
        } else {
            f.warnings.push_back("A bin " + bin_label(f.hi.back(), kInf) +
                                 " with observed count 0 is added, so that the bins cover every possible value.");
            f.lo.push_back(f.hi.back());
            f.hi.push_back(kInf);
            f.observed.push_back(0.0);
            f.added.push_back(true);
        }
    }
    return f;
}

double grouped_log_likelihood(const FittedDistribution& f, const CellProbability& cell) {
    double ll = 0;
    for (std::size_t i = 0; i < f.lo.size(); ++i) {
        if (f.observed[i] <= 0) continue;
        const double p = cell(f.lo[i], f.hi[i]);
        if (!(p > 0)) return -kInf;
        ll += f.observed[i] * std::log(p);
    }
    return ll;
}

void fill_probabilities(FittedDistribution* f, const CellProbability& cell) {
    f->probabilities.resize(f->lo.size());
    for (std::size_t i = 0; i < f->lo.size(); ++i) f->probabilities[i] = cell(f->lo[i], f->hi[i]);
}

// P(a <= X < b) for X ~ Normal(mu, sigma), from erfc on the side of mu where the bin lies.
double normal_cell(double mu, double sigma, double a, double b) {
    const double s = sigma * 1.4142135623730950488;
    const double za = (a - mu) / s, zb = (b - mu) / s;  // +-inf at open ends
    if (a == -kInf && b == kInf) return 1.0;
    if (a >= mu) return 0.5 * (std::erfc(za) - std::erfc(zb));      // upper tails
    if (b <= mu) return 0.5 * (std::erfc(-zb) - std::erfc(-za));    // lower tails
    return 1.0 - 0.5 * (std::erfc(-za) + std::erfc(zb));            // both tails are below 1/2
}

// Bin representatives for starting values: midpoints, an open end bin one neighbour's width out.
std::vector<double> representatives(const std::vector<double>& lo, const std::vector<double>& hi, double fallback) {
    std::vector<double> x(lo.size());
    for (std::size_t i = 0; i < lo.size(); ++i) {
        if (std::isfinite(lo[i]) && std::isfinite(hi[i])) { x[i] = 0.5 * (lo[i] + hi[i]); continue; }
        const double edge = std::isfinite(lo[i]) ? lo[i] : hi[i];
        double w = fallback;
        if (i > 0 && std::isfinite(lo[i - 1]) && std::isfinite(hi[i - 1])) w = hi[i - 1] - lo[i - 1];
        if (i + 1 < lo.size() && std::isfinite(lo[i + 1]) && std::isfinite(hi[i + 1])) w = hi[i + 1] - lo[i + 1];
        x[i] = std::isfinite(lo[i]) ? edge + 0.5 * w : edge - 0.5 * w;
    }
    return x;
}

void moments(const std::vector<double>& x, const std::vector<double>& n, double* mean, double* sd) {
    double t = 0, s = 0, s2 = 0;
    for (std::size_t i = 0; i < x.size(); ++i) { t += n[i]; s += n[i] * x[i]; }
    *mean = s / t;
    for (std::size_t i = 0; i < x.size(); ++i) s2 += n[i] * (x[i] - *mean) * (x[i] - *mean);
    *sd = std::sqrt(s2 / t);
}

// Index of the first and last occupied bin.
void occupied_span(const FittedDistribution& f, int* first, int* last, double* n) {
    *first = -1; *last = -1; *n = 0;
    for (std::size_t i = 0; i < f.observed.size(); ++i)
        if (f.observed[i] > 0) {
            if (*first < 0) *first = static_cast<int>(i);
            *last = static_cast<int>(i);
            *n += f.observed[i];
        }
}


// Normal fit on transformed edges: `to_scale` maps an edge to the normal's scale (identity or log).
FittedDistribution location_scale_fit(const char* model, const char* location_name, const char* scale_name,
                                      const std::vector<double>& edges, const std::vector<double>& observed,
                                      std::optional<double> location, std::optional<double> scale, double smin,
                                      TailCells tails, const std::function<double(double)>& to_scale) {
    FittedDistribution f;
    f.model = model;
    if (location && !std::isfinite(*location)) {
        f.status = Status::failure(std::string("The ") + model + " " + location_name +
                                   " must be a finite number; it was given as " + fit_number(*location) + ".");
        return f;
    }
    if (scale && !(std::isfinite(*scale) && *scale > 0)) {
        f.status = Status::failure(std::string("The ") + model + " " + scale_name +
                                   " must be a positive number; it was given as " + fit_number(*scale) + ".");
        return f;
    }
    f = prepare_bins(model, edges, observed, smin, tails);
    if (!f.status.ok) return f;
    std::vector<double> tlo(f.lo.size()), thi(f.lo.size());
    for (std::size_t i = 0; i < f.lo.size(); ++i) { tlo[i] = to_scale(f.lo[i]); thi[i] = to_scale(f.hi[i]); }
    auto cell_on = [&](double mu, double sigma) {
        return [mu, sigma, &to_scale](double a, double b) { return normal_cell(mu, sigma, to_scale(a), to_scale(b)); };
    };
    double mu = location ? *location : 0, sigma = scale ? *scale : 0;
    if (!location || !scale) {
        int first = 0, last = 0;
        double n = 0;
        occupied_span(f, &first, &last, &n);
        const std::string what = !location && !scale ? std::string(location_name) + " and " + scale_name
                                                      : (!location ? location_name : scale_name);
        if (first == last) {
            f.status = Status::failure("All " + fit_number(n) + " observations are in one bin (" +
                                       bin_label(f.lo[first], f.hi[first]) + "); counts in a single bin cannot identify the " +
                                       model + " " + what + ".");
            return f;
        }
        if (!location && !scale && last == first + 1) {
            f.status = Status::failure("All " + fit_number(n) + " observations are in two neighbouring bins (" +
                                       bin_label(f.lo[first], f.hi[last]) + "); the " + model + " " + scale_name +
                                       " then shrinks towards 0, so it cannot be estimated. At least three bins must be spanned.");
            return f;
        }
        double finite_width = 0;
        for (std::size_t i = 0; i < tlo.size(); ++i)
            if (std::isfinite(tlo[i]) && std::isfinite(thi[i])) finite_width = std::max(finite_width, thi[i] - tlo[i]);
        const double fallback = scale ? *scale : (finite_width > 0 ? finite_width : 1.0);
        double m = 0, s = 0;
        moments(representatives(tlo, thi, fallback), f.observed, &m, &s);
        if (location) m = *location;
        const double s_start = scale ? *scale : (s > 0 ? s : fallback);
        const ParameterSearch loc_search{ParameterScale::real, m, 0.25 * s_start, m - 200 * s_start, m + 200 * s_start};
        const ParameterSearch scale_search{ParameterScale::positive, s_start, 0.25, s_start * 1e-9, s_start * 1e9};
        MaximumLikelihood ml;
        if (!location && !scale) {
            ml = maximise_log_likelihood(
                [&](const std::vector<double>& t) { return grouped_log_likelihood(f, cell_on(t[0], t[1])); },
                {loc_search, scale_search});
        } else if (!location) {
            ml = maximise_log_likelihood(
                [&](const std::vector<double>& t) { return grouped_log_likelihood(f, cell_on(t[0], sigma)); }, {loc_search});
        } else {
            ml = maximise_log_likelihood(
                [&](const std::vector<double>& t) { return grouped_log_likelihood(f, cell_on(mu, t[0])); }, {scale_search});
        }
        if (ml.at_boundary) {
            const bool loc = !location && ml.boundary_parameter == 0;
            f.status = loc ? boundary_refusal(f, location_name, ml.boundary_upper, "-infinity", "+infinity")
                           : boundary_refusal(f, scale_name, ml.boundary_upper, "0", "infinity");
            return f;
        }
        if (!ml.converged) { f.status = no_convergence(f); return f; }
        if (!location) mu = ml.theta[0];
        if (!scale) sigma = ml.theta[location ? 0 : (ml.theta.size() - 1)];
        f.estimated_parameters = (location ? 0 : 1) + (scale ? 0 : 1);
    }
    f.parameters.push_back({location_name, mu, !location});
    f.parameters.push_back({scale_name, sigma, !scale});
    fill_probabilities(&f, cell_on(mu, sigma));
    finish_fit(&f);
    return f;
}

double exponential_cell(double rate, double a, double b) {
    const double from = std::max(a, 0.0);
    if (b == kInf) return std::exp(-rate * from);
    return std::exp(-rate * from) * -std::expm1(-rate * (b - from));  // no 1 - cdf anywhere
}

}  // namespace

FittedDistribution fit_normal(const std::vector<double>& edges, const std::vector<double>& observed,
                              std::optional<double> mean, std::optional<double> sd, const ContinuousFitOptions& options) {
    return location_scale_fit("normal", "mean", "sd", edges, observed, mean, sd, -kInf, options.tail_cells,
                              [](double x) { return x; });
}

FittedDistribution fit_lognormal(const std::vector<double>& edges, const std::vector<double>& observed,
                                 std::optional<double> meanlog, std::optional<double> sdlog,
                                 const ContinuousFitOptions& options) {
    return location_scale_fit("lognormal", "meanlog", "sdlog", edges, observed, meanlog, sdlog, 0, options.tail_cells,
                              [](double x) { return x <= 0 ? -kInf : std::log(x); });
}

FittedDistribution fit_exponential(const std::vector<double>& edges, const std::vector<double>& observed,
                                   std::optional<double> rate, const ContinuousFitOptions& options) {
    FittedDistribution f;
    f.model = "exponential";
    if (rate && !(std::isfinite(*rate) && *rate > 0)) {
        f.status = Status::failure("The exponential rate must be a positive number; it was given as " + fit_number(*rate) + ".");
        return f;
    }
    f = prepare_bins("exponential", edges, observed, 0, options.tail_cells);
    if (!f.status.ok) return f;
    double lambda = rate ? *rate : 0;
    if (!rate) {
        int first = 0, last = 0;
        double n = 0;
        occupied_span(f, &first, &last, &n);
        if (first == last) {
            f.status = Status::failure("All " + fit_number(n) + " observations are in one bin (" +
                                       bin_label(f.lo[first], f.hi[first]) +
                                       "); counts in a single bin cannot identify the exponential rate.");
            return f;
        }
        double width = 0;
        for (std::size_t i = 0; i < f.lo.size(); ++i)
            if (std::isfinite(f.hi[i])) width = std::max(width, f.hi[i] - f.lo[i]);
        double m = 0, s = 0;
        moments(representatives(f.lo, f.hi, width), f.observed, &m, &s);
        const double start = 1 / std::max(m, 1e-300);
        const MaximumLikelihood ml = maximise_log_likelihood(
            [&f](const std::vector<double>& t) {
                const double r = t[0];
                return grouped_log_likelihood(f, [r](double a, double b) { return exponential_cell(r, a, b); });
            },
            {{ParameterScale::positive, start, 0.25, start * 1e-9, start * 1e9}});
        if (ml.at_boundary) { f.status = boundary_refusal(f, "rate", ml.boundary_upper, "0", "infinity"); return f; }
        if (!ml.converged) { f.status = no_convergence(f); return f; }
        lambda = ml.theta[0];
        f.estimated_parameters = 1;
    }
    f.parameters.push_back({"rate", lambda, !rate});
    fill_probabilities(&f, [lambda](double a, double b) { return exponential_cell(lambda, a, b); });
    finish_fit(&f);
    return f;
}

}  // namespace tallyproof
