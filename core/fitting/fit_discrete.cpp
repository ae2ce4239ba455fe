// Grouped maximum likelihood for discrete count models. Cell probabilities: one-value cells from
// the probability mass function, others from whichever of P(X <= k) and P(X > k) avoids
// cancellation, both taken directly from Boost.Math 1.74 (Poisson: regularized gamma
// P/Q; binomial and negative binomial: regularized incomplete beta I/I-complement; geometric:
// expm1/log1p closed forms), so a tail cell is never 1 - cdf; relative accuracy ~1e-14 per cell.
#include "fit_discrete.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <functional>
#include <limits>
#include <string>

#include <boost/math/distributions/binomial.hpp>
#include <boost/math/distributions/negative_binomial.hpp>
#include <boost/math/distributions/poisson.hpp>
#include <boost/math/special_functions/beta.hpp>
#include <boost/math/special_functions/gamma.hpp>

#include "fit_grouped_mle.hpp"
#include "math_policy.hpp"

namespace tallyproof {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kMaxWhole = 9007199254740992.0;  // 2^53: beyond it k + 1 is not exact

std::string cell_label(double lo, double hi) {
    if (lo == -kInf) return fit_number(hi) + " or fewer";
    if (hi == kInf) return fit_number(lo) + " or more";
    if (lo == hi) return fit_number(lo);
    return fit_number(lo) + "-" + fit_number(hi);
}

bool whole(double x) { return std::floor(x) == x && std::fabs(x) <= kMaxWhole; }

// The bins checked, clamped to the support [smin, smax] and extended to cover it.
FittedDistribution prepare_cells(const char* model, const std::vector<IntegerBin>& bins,
                                 const std::vector<double>& observed, double smin, double smax,
                                 TailCells tails) {
    FittedDistribution f;
    f.model = model;
    if (bins.size() < 2) {
        f.status = Status::failure("At least two bins are needed; there are " + std::to_string(bins.size()) + ".");
        return f;
    }
    f.status = check_observed_counts(observed, bins.size());
    if (!f.status.ok) return f;
    for (std::size_t i = 0; i < bins.size(); ++i) {
        const double lo = bins[i].lo, hi = bins[i].hi;
        const std::string which = "Bin " + std::to_string(i + 1);
        const bool lo_ok = whole(lo) || (lo == -kInf && i == 0);
        const bool hi_ok = whole(hi) || (hi == kInf && i + 1 == bins.size());
        if (!lo_ok || !hi_ok) {
            f.status = Status::failure(which + " (" + fit_number(lo) + " to " + fit_number(hi) +
                                       ") must have whole-number ends; only the first may start at -infinity "
                                       "and only the last may end at +infinity.");
            return f;
        }
        if (lo > hi) {
            f.status = Status::failure(which + " runs from " + fit_number(lo) + " down to " + fit_number(hi) + ".");
            return f;
        }
        if (i > 0 && lo != bins[i - 1].hi + 1) {
            f.status = Status::failure(lo <= bins[i - 1].hi
                ? which + " (" + cell_label(lo, hi) + ") overlaps the bin before it (" +
                      cell_label(bins[i - 1].lo, bins[i - 1].hi) + ")."
                : "No bin holds the values " + cell_label(bins[i - 1].hi + 1, lo - 1) + " between bin " +
                      std::to_string(i) + " and bin " + std::to_string(i + 1) + ".");
            return f;
        }
        if (hi < smin || lo > smax) {
            f.status = Status::failure(which + " (" + cell_label(lo, hi) + ") lies outside the values the " +
                                       model + " model can take (" + cell_label(smin, smax) + ").");
            return f;
        }
        f.lo.push_back(std::max(lo, smin));
        f.hi.push_back(std::min(hi, smax));
        f.observed.push_back(observed[i]);
        f.added.push_back(false);
    }
    if (f.lo.front() > smin) {
        if (tails == TailCells::widen_end_bins) {
            f.warnings.push_back("The first bin (" + cell_label(f.lo.front(), f.hi.front()) + ") is taken as " +
                                 cell_label(-kInf, f.hi.front()) + ", so that the bins cover every possible value.");
            f.lo.front() = smin;
        } else {
            f.warnings.push_back("A cell " + cell_label(smin, f.lo.front() - 1) +
                                 " with observed count 0 is added, so that the cells cover every possible value.");
            f.lo.insert(f.lo.begin(), smin);
            f.hi.insert(f.hi.begin(), f.lo[1] - 1);
            f.observed.insert(f.observed.begin(), 0.0);
            f.added.insert(f.added.begin(), true);
        }
    }
    if (f.hi.back() < smax) {
        if (tails == TailCells::widen_end_bins) {
            f.warnings.push_back("The last bin (" + cell_label(f.lo.back(), f.hi.back()) + ") is taken as " +
                                 (smax == kInf ? cell_label(f.lo.back(), kInf) : cell_label(f.lo.back(), smax)) +
                                 ", so that the bins cover every possible value.");
            f.hi.back() = smax;
        } else {
            const double from = f.hi.back() + 1;
            f.warnings.push_back("A cell " + cell_label(from, smax) +
                                 " with observed count 0 is added, so that the cells cover every possible value.");
            f.lo.push_back(from);
            f.hi.push_back(smax);
            f.observed.push_back(0.0);
            f.added.push_back(true);
        }
    }
    return f;
}

// Cumulative probabilities of a model: cdf(k) = P(X <= k), sf(k) = P(X > k), pmf(k) = P(X = k).
struct Tails {
    std::function<double(double)> cdf, sf, pmf;
};

double cell_probability(const Tails& t, double lo, double hi, double smin, double smax) {
    const bool from_min = lo <= smin, to_max = hi >= smax;
    if (from_min && to_max) return 1.0;
    if (lo == hi) return t.pmf(lo);
    if (from_min) return t.cdf(hi);
    if (to_max) return t.sf(lo - 1);
    const double below = t.cdf(lo - 1);
    // take the difference on the side where both terms are small, so no digits cancel
    return below < 0.5 ? std::max(0.0, t.cdf(hi) - below) : std::max(0.0, t.sf(lo - 1) - t.sf(hi));
}

void fill_probabilities(FittedDistribution* f, const Tails& t, double smin, double smax) {
    f->probabilities.resize(f->lo.size());
    for (std::size_t i = 0; i < f->lo.size(); ++i)
        f->probabilities[i] = cell_probability(t, f->lo[i], f->hi[i], smin, smax);
}

double grouped_log_likelihood(const FittedDistribution& f, const Tails& t, double smin, double smax) {
    double ll = 0;
    for (std::size_t i = 0; i < f.lo.size(); ++i) {
        if (f.observed[i] <= 0) continue;
        const double p = cell_probability(t, f.lo[i], f.hi[i], smin, smax);
        if (!(p > 0)) return -kInf;
        ll += f.observed[i] * std::log(p);
    }
    return ll;
}

// Grouped mean and variance, each cell at its midpoint and an open last cell at its lower end;
// only starting values for the search.
void raw_moments(const FittedDistribution& f, double* mean, double* variance) {
    double n = 0, s = 0, s2 = 0;
    for (std::size_t i = 0; i < f.lo.size(); ++i) {
        const double x = f.hi[i] == kInf ? f.lo[i] : 0.5 * (f.lo[i] + f.hi[i]);
        n += f.observed[i];
        s += f.observed[i] * x;
        s2 += f.observed[i] * x * x;
    }
    *mean = s / n;
    *variance = std::max(0.0, s2 / n - *mean * *mean);
}

// The refusal when every observation falls in a single cell and something is to be estimated.
bool single_cell(FittedDistribution* f, const std::string& what) {
    int occupied = -1, count = 0;
    double n = 0;
    for (std::size_t i = 0; i < f->observed.size(); ++i)
        if (f->observed[i] > 0) { occupied = static_cast<int>(i); ++count; n += f->observed[i]; }
    if (count != 1) return false;
    f->status = Status::failure("All " + fit_number(n) + " observations are in one bin (" +
                                cell_label(f->lo[occupied], f->hi[occupied]) +
                                "); counts in a single bin cannot identify the " + f->model + " " + what + ".");
    return true;
}


void add_parameter(FittedDistribution* f, const char* name, double value, bool estimated) {
    f->parameters.push_back({name, value, estimated});
}

Tails poisson_tails(double mu) {
    return {[mu](double k) { return boost::math::gamma_q(k + 1, mu, quiet_policy()); },
            [mu](double k) { return boost::math::gamma_p(k + 1, mu, quiet_policy()); },
            [mu](double k) {
                return boost::math::pdf(boost::math::poisson_distribution<double, quiet_policy>(mu), k);
            }};
}

Tails binomial_tails(double n, double p) {
    return {[n, p](double k) { return k >= n ? 1.0 : boost::math::ibetac(k + 1, n - k, p, quiet_policy()); },
            [n, p](double k) { return k >= n ? 0.0 : boost::math::ibeta(k + 1, n - k, p, quiet_policy()); },
            [n, p](double k) {
                return boost::math::pdf(boost::math::binomial_distribution<double, quiet_policy>(n, p), k);
            }};
}

Tails geometric_tails(double p) {
    const double l = std::log1p(-p);
    return {[l](double k) { return -std::expm1((k + 1) * l); },
            [l](double k) { return std::exp((k + 1) * l); },
            [l, p](double k) { return p * std::exp(k * l); }};
}

Tails negative_binomial_tails(double r, double p) {
    return {[r, p](double k) { return boost::math::ibeta(r, k + 1, p, quiet_policy()); },
            [r, p](double k) { return boost::math::ibetac(r, k + 1, p, quiet_policy()); },
            [r, p](double k) {
                return boost::math::pdf(boost::math::negative_binomial_distribution<double, quiet_policy>(r, p), k);
            }};
}

bool positive_finite(double x) { return std::isfinite(x) && x > 0; }

// The maximum-likelihood estimate of a one-parameter law on [0, inf) (Poisson, geometric) into
// `theta`: its search from the raw mean m (`search(m)`); false, with f->status saying why, for a
// single cell, an estimate running to an edge (`lower`, `upper` name them) or no convergence.
template <class TailsOf, class SearchFrom>
bool fit_one_parameter(FittedDistribution* f, const char* name, TailsOf tails_of, const char* lower, const char* upper,
                       double* theta, SearchFrom search) {
    if (single_cell(f, name)) return false;
    double m = 0, v = 0;
    raw_moments(*f, &m, &v);
    const FittedDistribution& cells = *f;
    const MaximumLikelihood ml = maximise_log_likelihood(
        [&cells, &tails_of](const std::vector<double>& t) { return grouped_log_likelihood(cells, tails_of(t[0]), 0, kInf); },
        {search(m)});
    if (ml.at_boundary) { f->status = boundary_refusal(*f, name, ml.boundary_upper, lower, upper); return false; }
    if (!ml.converged) { f->status = no_convergence(*f); return false; }
    *theta = ml.theta[0];
    f->estimated_parameters = 1;
    return true;
}

// A fit refused before it starts: a given parameter out of its range.
FittedDistribution refused_fit(const char* model, const std::string& message) {
    FittedDistribution f;
    f.model = model;
    f.status = Status::failure(message);
    return f;
}
bool open_unit(double x) { return x > 0 && x < 1; }

}  // namespace

FittedDistribution fit_poisson(const std::vector<IntegerBin>& bins, const std::vector<double>& observed,
                               std::optional<double> mean, const DiscreteFitOptions& options) {
    if (mean && !positive_finite(*mean))
        return refused_fit("Poisson", "The Poisson mean must be a positive number; it was given as " + fit_number(*mean) + ".");
    FittedDistribution f = prepare_cells("Poisson", bins, observed, 0, kInf, options.tail_cells);
    if (!f.status.ok) return f;
    double mu = mean ? *mean : 0;
    if (!mean && !fit_one_parameter(&f, "mean", poisson_tails, "0", "infinity", &mu, [](double m) {
            const double start = std::max(m, 0.05);
            return ParameterSearch{ParameterScale::positive, start, 0.25, start * 1e-9, start * 1e9};
        }))
        return f;
    add_parameter(&f, "mean", mu, !mean);
    fill_probabilities(&f, poisson_tails(mu), 0, kInf);
    finish_fit(&f);
    return f;
}

FittedDistribution fit_binomial(const std::vector<IntegerBin>& bins, const std::vector<double>& observed,
                                double trials, std::optional<double> p, const DiscreteFitOptions& options) {
    FittedDistribution f;
    f.model = "binomial";
    if (!(whole(trials) && trials >= 1 && trials <= 1e9)) {
        f.status = Status::failure("The number of binomial trials must be a whole number from 1 to 1e9; it was given as " +
                                   fit_number(trials) + ".");
        return f;
    }
    if (p && !open_unit(*p)) {
        f.status = Status::failure("The binomial p must lie strictly between 0 and 1; it was given as " + fit_number(*p) + ".");
        return f;
    }
    f = prepare_cells("binomial", bins, observed, 0, trials, options.tail_cells);
    if (!f.status.ok) return f;
    double q = p ? *p : 0;
    if (!p) {
        if (single_cell(&f, "p")) return f;
        double m = 0, v = 0;
        raw_moments(f, &m, &v);
        const double start = std::min(0.99, std::max(0.01, m / trials));
        const MaximumLikelihood ml = maximise_log_likelihood(
            [&f, trials](const std::vector<double>& t) {
                return grouped_log_likelihood(f, binomial_tails(trials, t[0]), 0, trials);
            },
            {{ParameterScale::unit_interval, start, 0.25, 1e-12, 1 - 1e-12}});
        if (ml.at_boundary) { f.status = boundary_refusal(f, "p", ml.boundary_upper, "0", "1"); return f; }
        if (!ml.converged) { f.status = no_convergence(f); return f; }
        q = ml.theta[0];
        f.estimated_parameters = 1;
    }
    add_parameter(&f, "trials", trials, false);
    add_parameter(&f, "p", q, !p);
    fill_probabilities(&f, binomial_tails(trials, q), 0, trials);
    finish_fit(&f);
    return f;
}

FittedDistribution fit_geometric(const std::vector<IntegerBin>& bins, const std::vector<double>& observed,
                                 std::optional<double> p, const DiscreteFitOptions& options) {
    if (p && !open_unit(*p))
        return refused_fit("geometric", "The geometric p must lie strictly between 0 and 1; it was given as " + fit_number(*p) + ".");
    FittedDistribution f = prepare_cells("geometric", bins, observed, 0, kInf, options.tail_cells);
    if (!f.status.ok) return f;
    double q = p ? *p : 0;
    if (!p && !fit_one_parameter(&f, "p", geometric_tails, "0", "1", &q, [](double m) {
            const double start = std::min(0.99, std::max(1e-6, 1 / (1 + m)));
            return ParameterSearch{ParameterScale::unit_interval, start, 0.25, 1e-12, 1 - 1e-12};
        }))
        return f;
    add_parameter(&f, "p", q, !p);
    add_parameter(&f, "mean", (1 - q) / q, !p);
    fill_probabilities(&f, geometric_tails(q), 0, kInf);
    finish_fit(&f);
    return f;
}

FittedDistribution fit_negative_binomial(const std::vector<IntegerBin>& bins, const std::vector<double>& observed,
                                         const NegativeBinomialParameters& given,
                                         const DiscreteFitOptions& options) {
    FittedDistribution f;
    f.model = "negative binomial";
    if (given.p && given.mean) {
        f.status = Status::failure("Give the negative binomial p or its mean, not both: each fixes the other once size is known.");
        return f;
    }
    if (given.size && !positive_finite(*given.size)) {
        f.status = Status::failure("The negative binomial size must be a positive number; it was given as " +
                                   fit_number(*given.size) + ".");
        return f;
    }
    if (given.p && !open_unit(*given.p)) {
        f.status = Status::failure("The negative binomial p must lie strictly between 0 and 1; it was given as " +
                                   fit_number(*given.p) + ".");
        return f;
    }
    if (given.mean && !positive_finite(*given.mean)) {
        f.status = Status::failure("The negative binomial mean must be a positive number; it was given as " +
                                   fit_number(*given.mean) + ".");
        return f;
    }
    f = prepare_cells("negative binomial", bins, observed, 0, kInf, options.tail_cells);
    if (!f.status.ok) return f;
    double m = 0, v = 0;
    raw_moments(f, &m, &v);
    const double mean_start = std::max(m, 0.05);
    // method of moments for the size, r = mean^2 / (variance - mean), when over-dispersed
    const double size_start = std::min(1e6, std::max(0.01, v > 1.05 * m ? m * m / (v - m) : 20 * mean_start));
    const ParameterSearch size_search{ParameterScale::positive, size_start, 0.25, 1e-8, 1e10};
    const ParameterSearch mean_search{ParameterScale::positive, mean_start, 0.25, mean_start * 1e-9, mean_start * 1e9};
    auto ll_size_mean = [&f](double r, double mu) {
        return grouped_log_likelihood(f, negative_binomial_tails(r, r / (r + mu)), 0, kInf);
    };
    double r = 0, p = 0;
    const bool need_size = !given.size, need_second = !given.p && !given.mean;
    if ((need_size || need_second) && single_cell(&f, need_size ? "size" : "mean")) return f;
    const std::string not_dispersed =
        "The counts are not over-dispersed (their variance does not exceed their mean), so the negative binomial "
        "size runs to infinity, the Poisson limit; fit a Poisson model instead.";
    if (need_size && need_second) {
        const MaximumLikelihood ml = maximise_log_likelihood(
            [&](const std::vector<double>& t) { return ll_size_mean(t[0], t[1]); }, {size_search, mean_search});
        if (ml.at_boundary && ml.boundary_parameter == 0 && ml.boundary_upper) { f.status = Status::failure(not_dispersed); return f; }
        if (ml.at_boundary) {
            f.status = boundary_refusal(f, ml.boundary_parameter == 0 ? "size" : "mean", ml.boundary_upper, "0", "infinity");
            return f;
        }
        if (!ml.converged) { f.status = Status::failure(v <= m ? not_dispersed : no_convergence(f).message); return f; }
        r = ml.theta[0];
        p = r / (r + ml.theta[1]);
        f.estimated_parameters = 2;
    } else if (need_size) {
        const MaximumLikelihood ml = maximise_log_likelihood(
            [&](const std::vector<double>& t) {
                return given.p ? grouped_log_likelihood(f, negative_binomial_tails(t[0], *given.p), 0, kInf)
                               : ll_size_mean(t[0], *given.mean);
            },
            {size_search});
        if (ml.at_boundary) { f.status = boundary_refusal(f, "size", ml.boundary_upper, "0", "infinity"); return f; }
        if (!ml.converged) { f.status = no_convergence(f); return f; }
        r = ml.theta[0];
        p = given.p ? *given.p : r / (r + *given.mean);
        f.estimated_parameters = 1;
    } else if (need_second) {
        r = *given.size;
        const MaximumLikelihood ml = maximise_log_likelihood(
            [&](const std::vector<double>& t) { return ll_size_mean(r, t[0]); }, {mean_search});
        if (ml.at_boundary) { f.status = boundary_refusal(f, "mean", ml.boundary_upper, "0", "infinity"); return f; }
        if (!ml.converged) { f.status = no_convergence(f); return f; }
        p = r / (r + ml.theta[0]);
        f.estimated_parameters = 1;
    } else {
        r = *given.size;
        p = given.p ? *given.p : r / (r + *given.mean);
    }
    const bool mix_estimated = need_size || need_second;  // p and mean depend on every estimate
    add_parameter(&f, "size", r, need_size);
    add_parameter(&f, "p", p, mix_estimated && !given.p);
    add_parameter(&f, "mean", given.mean ? *given.mean : r * (1 - p) / p, mix_estimated && !given.mean);
    fill_probabilities(&f, negative_binomial_tails(r, p), 0, kInf);
    finish_fit(&f);
    return f;
}

FittedDistribution fit_discrete_uniform(const std::vector<IntegerBin>& bins, const std::vector<double>& observed) {
    FittedDistribution f;
    f.model = "discrete uniform";
    if (!bins.empty() && (!std::isfinite(bins.front().lo) || !std::isfinite(bins.back().hi))) {
        f.status = Status::failure("A discrete uniform model needs a finite range: the first bin must have a lowest "
                                   "value and the last a highest value.");
        return f;
    }
    const double a = bins.empty() ? 0 : bins.front().lo, b = bins.empty() ? 0 : bins.back().hi;
    f = prepare_cells("discrete uniform", bins, observed, a, b, TailCells::widen_end_bins);
    if (!f.status.ok) return f;
    const double width = b - a + 1;
    add_parameter(&f, "lowest", a, false);
    add_parameter(&f, "highest", b, false);
    f.probabilities.resize(f.lo.size());
    for (std::size_t i = 0; i < f.lo.size(); ++i) f.probabilities[i] = (f.hi[i] - f.lo[i] + 1) / width;
    finish_fit(&f);
    return f;
}

}  // namespace tallyproof
