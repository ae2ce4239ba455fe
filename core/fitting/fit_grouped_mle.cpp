// Grouped-likelihood maximiser: grid + Brent (Brent 1973, "Algorithms for Minimization without
// Derivatives", ch. 5, as boost::math::tools::brent_find_minima) in one dimension, Nelder-Mead
// (Nelder and Mead 1965, Computer Journal 7:308-313) in two, each followed by Newton polishing on
// central differences, which takes the optimum from ~sqrt(eps) to ~1e-10 relative.
#include "fit_grouped_mle.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>

#include <boost/math/tools/minima.hpp>

namespace tallyproof {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

double to_search(ParameterScale s, double x) {
    switch (s) {
        case ParameterScale::positive: return std::log(x);
        case ParameterScale::unit_interval: return std::log(x) - std::log1p(-x);
        default: return x;
    }
}

double to_natural(ParameterScale s, double t) {
    switch (s) {
        case ParameterScale::positive: return std::exp(t);
        case ParameterScale::unit_interval: return t >= 0 ? 1 / (1 + std::exp(-t)) : std::exp(t) / (1 + std::exp(t));
        default: return t;
    }
}

// The objective on the search scale, -inf outside the box, counting evaluations.
struct Objective {
    const LogLikelihood& ll;
    const std::vector<ParameterSearch>& ps;
    std::vector<double> lo, hi;
    int evaluations = 0;

    Objective(const LogLikelihood& f, const std::vector<ParameterSearch>& p) : ll(f), ps(p) {
        for (const auto& q : ps) {
            lo.push_back(to_search(q.scale, q.lower));
            hi.push_back(to_search(q.scale, q.upper));
        }
    }
    std::vector<double> natural(const std::vector<double>& t) const {
        std::vector<double> x(t.size());
        for (std::size_t i = 0; i < t.size(); ++i) x[i] = to_natural(ps[i].scale, t[i]);
        return x;
    }
    double operator()(const std::vector<double>& t) {
        for (std::size_t i = 0; i < t.size(); ++i)
            if (!(t[i] >= lo[i] && t[i] <= hi[i])) return -kInf;
        ++evaluations;
        const double v = ll(natural(t));
        return std::isnan(v) ? -kInf : v;
    }
};

// Central-difference gradient and Hessian of f at t, with steps scaled by each parameter's step.
void derivatives(Objective& f, const std::vector<double>& t, std::vector<double>* g,
                 std::vector<std::vector<double>>* h) {
    const std::size_t n = t.size();
    g->assign(n, 0.0);
    h->assign(n, std::vector<double>(n, 0.0));
    const double f0 = f(t);
    std::vector<double> hg(n), hh(n);
    for (std::size_t i = 0; i < n; ++i) {
        hg[i] = 4e-5 * f.ps[i].step;  // balances truncation (h^2) against rounding (eps / h)
        hh[i] = 4e-4 * f.ps[i].step;
    }
    for (std::size_t i = 0; i < n; ++i) {
        std::vector<double> a = t, b = t;
        a[i] += hg[i];
        b[i] -= hg[i];
        (*g)[i] = (f(a) - f(b)) / (2 * hg[i]);
        a = t;
        b = t;
        a[i] += hh[i];
        b[i] -= hh[i];
        (*h)[i][i] = (f(a) - 2 * f0 + f(b)) / (hh[i] * hh[i]);
    }
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = i + 1; j < n; ++j) {
            std::vector<double> pp = t, pm = t, mp = t, mm = t;
            pp[i] += hh[i]; pp[j] += hh[j];
            pm[i] += hh[i]; pm[j] -= hh[j];
            mp[i] -= hh[i]; mp[j] += hh[j];
            mm[i] -= hh[i]; mm[j] -= hh[j];
            (*h)[i][j] = (*h)[j][i] = (f(pp) - f(pm) - f(mp) + f(mm)) / (4 * hh[i] * hh[j]);
        }
}

bool negative_definite(const std::vector<std::vector<double>>& h) {
    if (h.size() == 1) return h[0][0] < 0;
    return h[0][0] < 0 && h[0][0] * h[1][1] - h[0][1] * h[1][0] > 0;
}

double score_size(const std::vector<double>& g, const std::vector<ParameterSearch>& ps) {
    double s = 0;
    for (std::size_t i = 0; i < g.size(); ++i) s = std::max(s, std::fabs(g[i]) * ps[i].step);
    return s;
}

// Newton steps on the numerical score; a step is kept only when it shrinks the score and does
// not lower the likelihood by more than rounding. Returns whether the final point passes the
// convergence test: Hessian negative definite, score (per typical step) below 1e-6 (1 + |ll|).
bool polish(Objective& f, std::vector<double>* t, double* value) {
    std::vector<double> g;
    std::vector<std::vector<double>> h;
    derivatives(f, *t, &g, &h);
    for (int it = 0; it < 6; ++it) {
        if (!negative_definite(h)) break;
        std::vector<double> step(t->size());
        if (t->size() == 1) {
            step[0] = -g[0] / h[0][0];
        } else {
            const double det = h[0][0] * h[1][1] - h[0][1] * h[1][0];
            step[0] = -(h[1][1] * g[0] - h[0][1] * g[1]) / det;
            step[1] = -(-h[1][0] * g[0] + h[0][0] * g[1]) / det;
        }
        // never jump further than a few typical steps: polishing, not searching
        bool small = true;
        for (std::size_t i = 0; i < step.size(); ++i)
            if (!(std::fabs(step[i]) <= 2 * f.ps[i].step)) small = false;
        if (!small) break;
        std::vector<double> trial = *t;
        for (std::size_t i = 0; i < step.size(); ++i) trial[i] += step[i];
        const double v = f(trial);
        if (!(v >= *value - 1e-13 * (1 + std::fabs(*value)))) break;
        std::vector<double> g2;
        std::vector<std::vector<double>> h2;
        derivatives(f, trial, &g2, &h2);
        if (!(score_size(g2, f.ps) < score_size(g, f.ps))) break;
        *t = trial;
        *value = std::max(v, *value);
        g = g2;
        h = h2;
    }
    return negative_definite(h) && score_size(g, f.ps) <= 1e-6 * (1 + std::fabs(*value));
}

// True when coordinate i of t is within two typical steps of the box edge.
bool near_edge(const Objective& f, const std::vector<double>& t, std::size_t i, bool* upper) {
    const double margin = 2 * f.ps[i].step;
    if (t[i] >= f.hi[i] - margin) { *upper = true; return true; }
    if (t[i] <= f.lo[i] + margin) { *upper = false; return true; }
    return false;
}

MaximumLikelihood one_parameter(Objective& f) {
    MaximumLikelihood r;
    const ParameterSearch& p = f.ps[0];
    const double h = p.step;
    const double a = f.lo[0], b = f.hi[0];
    const int n = std::max(2, static_cast<int>(std::ceil((b - a) / h)));
    std::vector<double> grid(n + 1), val(n + 1);
    int best = -1;
    for (int j = 0; j <= n; ++j) {
        grid[j] = j == n ? b : a + j * (b - a) / n;
        val[j] = f({grid[j]});
        if (val[j] > -kInf && (best < 0 || val[j] > val[best])) best = j;
    }
    if (best < 0) return r;  // impossible everywhere
    const double tie = 1e-10 * (1 + std::fabs(val[best]));
    if (best <= 1 || val[0] >= val[best] - tie) {
        r.at_boundary = true; r.boundary_parameter = 0; r.boundary_upper = false;
    } else if (best >= n - 1 || val[n] >= val[best] - tie) {
        r.at_boundary = true; r.boundary_parameter = 0; r.boundary_upper = true;
    }
    if (r.at_boundary) {
        const int e = r.boundary_upper ? n : 0;
        r.theta = f.natural({grid[e]});
        r.log_likelihood = val[e];
        r.evaluations = f.evaluations;
        return r;
    }
    boost::uintmax_t iterations = 200;
    auto neg = [&](double t) { const double v = f({t}); return v > -kInf ? -v : std::numeric_limits<double>::max(); };
    const std::pair<double, double> m =
        boost::math::tools::brent_find_minima(neg, grid[best - 1], grid[best + 1], 53, iterations);
    std::vector<double> t{m.first};
    double value = -m.second;
    if (val[best] > value) { t[0] = grid[best]; value = val[best]; }
    const bool ok = polish(f, &t, &value) && iterations < 200;
    r.converged = ok;
    r.theta = f.natural(t);
    r.log_likelihood = value;
    r.evaluations = f.evaluations;
    return r;
}

// Nelder-Mead on the negative log-likelihood (standard coefficients 1, 2, 1/2, 1/2).
std::vector<double> nelder_mead(Objective& f, std::vector<double> start, double* best_value) {
    const std::size_t n = start.size();
    std::vector<std::vector<double>> x(n + 1, start);
    std::vector<double> fx(n + 1);
    for (std::size_t i = 0; i < n; ++i) x[i + 1][i] += 2 * f.ps[i].step;
    for (std::size_t i = 0; i <= n; ++i) fx[i] = -f(x[i]);
    for (int it = 0; it < 5000; ++it) {
        std::vector<std::size_t> order(n + 1);
        for (std::size_t i = 0; i <= n; ++i) order[i] = i;
        std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return fx[a] < fx[b]; });
        std::vector<std::vector<double>> xs;
        std::vector<double> fs;
        for (std::size_t i : order) { xs.push_back(x[i]); fs.push_back(fx[i]); }
        x = xs;
        fx = fs;
        double size = 0;
        for (std::size_t i = 1; i <= n; ++i)
            for (std::size_t j = 0; j < n; ++j) size = std::max(size, std::fabs(x[i][j] - x[0][j]) / f.ps[j].step);
        if (std::isfinite(fx[n]) && size < 1e-10 && fx[n] - fx[0] <= 1e-14 * (1 + std::fabs(fx[0]))) break;
        std::vector<double> c(n, 0.0);
        for (std::size_t i = 0; i < n; ++i)
            for (std::size_t j = 0; j < n; ++j) c[j] += x[i][j] / n;
        auto along = [&](double coef) {
            std::vector<double> y(n);
            for (std::size_t j = 0; j < n; ++j) y[j] = c[j] + coef * (x[n][j] - c[j]);
            return y;
        };
        const std::vector<double> xr = along(-1);
        const double fr = -f(xr);
        if (fr < fx[0]) {
            const std::vector<double> xe = along(-2);
            const double fe = -f(xe);
            if (fe < fr) { x[n] = xe; fx[n] = fe; } else { x[n] = xr; fx[n] = fr; }
        } else if (fr < fx[n - 1]) {
            x[n] = xr; fx[n] = fr;
        } else {
            const bool outside = fr < fx[n];
            const std::vector<double> xc = along(outside ? -0.5 : 0.5);
            const double fc = -f(xc);
            if (fc < (outside ? fr : fx[n])) {
                x[n] = xc; fx[n] = fc;
            } else {
                for (std::size_t i = 1; i <= n; ++i) {
                    for (std::size_t j = 0; j < n; ++j) x[i][j] = x[0][j] + 0.5 * (x[i][j] - x[0][j]);
                    fx[i] = -f(x[i]);
                }
            }
        }
    }
    std::size_t b = 0;
    for (std::size_t i = 1; i <= n; ++i) if (fx[i] < fx[b]) b = i;
    *best_value = -fx[b];
    return x[b];
}

MaximumLikelihood two_parameters(Objective& f) {
    MaximumLikelihood r;
    std::vector<double> t{to_search(f.ps[0].scale, f.ps[0].start), to_search(f.ps[1].scale, f.ps[1].start)};
    double value = f(t);
    // restarts guard against a simplex that collapsed before reaching the maximum
    for (int restart = 0; restart < 6; ++restart) {
        double v = -kInf;
        const std::vector<double> next = nelder_mead(f, t, &v);
        const bool moved = v > value + 1e-12 * (1 + std::fabs(value));
        if (v >= value) { t = next; value = v; }
        if (!moved && restart > 0) break;
    }
    r.theta = f.natural(t);
    r.log_likelihood = value;
    if (!(value > -kInf)) { r.evaluations = f.evaluations; return r; }
    for (std::size_t i = 0; i < 2; ++i) {
        bool upper = false;
        if (near_edge(f, t, i, &upper)) {
            r.at_boundary = true; r.boundary_parameter = static_cast<int>(i); r.boundary_upper = upper;
            r.evaluations = f.evaluations;
            return r;
        }
    }
    r.converged = polish(f, &t, &value);
    r.theta = f.natural(t);
    r.log_likelihood = value;
    r.evaluations = f.evaluations;
    return r;
}

}  // namespace

MaximumLikelihood maximise_log_likelihood(const LogLikelihood& log_likelihood,
                                          const std::vector<ParameterSearch>& parameters) {
    MaximumLikelihood r;
    if (parameters.empty() || parameters.size() > 2) return r;
    for (const auto& p : parameters) {
        const bool box = p.scale == ParameterScale::real ? p.lower < p.upper
                         : p.scale == ParameterScale::positive ? (p.lower > 0 && p.lower < p.upper)
                                                                : (p.lower > 0 && p.lower < p.upper && p.upper < 1);
        if (!box || !(p.step > 0) || !(p.start > p.lower && p.start < p.upper)) return r;
    }
    Objective f(log_likelihood, parameters);
    return parameters.size() == 1 ? one_parameter(f) : two_parameters(f);
}

}  // namespace tallyproof
