// p-value adjustment transcribed from R 4.2's p.adjust (stats package): Holm
// pmin(1, cummax((m - i + 1) p_(i))), Bonferroni pmin(1, m p), Benjamini-Hochberg
// pmin(1, cummin(m / i p_(i))) from the largest down (Holm 1979; Benjamini and Hochberg 1995).
// The log10 form applies the same monotone steps to logarithms, so it never underflows.
#include "multiplicity.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numeric>

namespace tallyproof {
namespace {

// Indices sorting `v` ascending; ties keep their input order (as R's order()).
std::vector<std::size_t> ascending_order(const std::vector<double>& v) {
    std::vector<std::size_t> o(v.size());
    std::iota(o.begin(), o.end(), 0);
    std::stable_sort(o.begin(), o.end(), [&](std::size_t a, std::size_t b) { return v[a] < v[b]; });
    return o;
}

}  // namespace

const char* multiplicity_method_name(MultiplicityMethod method) {
    switch (method) {
        case MultiplicityMethod::holm: return "holm";
        case MultiplicityMethod::bonferroni: return "bonferroni";
        case MultiplicityMethod::benjamini_hochberg: return "BH";
        case MultiplicityMethod::none: return "none";
    }
    return "none";
}

bool multiplicity_method_from_name(const std::string& name, MultiplicityMethod* method) {
    for (MultiplicityMethod m : {MultiplicityMethod::holm, MultiplicityMethod::bonferroni,
                                 MultiplicityMethod::benjamini_hochberg, MultiplicityMethod::none})
        if (name == multiplicity_method_name(m)) {
            *method = m;
            return true;
        }
    if (name == "fdr") {  // R's alias for BH
        *method = MultiplicityMethod::benjamini_hochberg;
        return true;
    }
    return false;
}

Status adjust_p_values(const std::vector<double>& p, MultiplicityMethod method, std::vector<double>* adjusted) {
    adjusted->clear();
    for (std::size_t i = 0; i < p.size(); ++i)
        if (!(p[i] >= 0 && p[i] <= 1)) {
            char buf[120];
            std::snprintf(buf, sizeof buf, "p-value %g (number %zu) must lie between 0 and 1.", p[i], i + 1);
            return Status::failure(buf);
        }
    const std::size_t m = p.size();
    const double md = static_cast<double>(m);
    std::vector<double> out(m);
    switch (method) {
        case MultiplicityMethod::none: out = p; break;
        case MultiplicityMethod::bonferroni:
            for (std::size_t i = 0; i < m; ++i) out[i] = std::min(1.0, md * p[i]);
            break;
        case MultiplicityMethod::holm: {
            const auto o = ascending_order(p);
            double running = 0;
            for (std::size_t i = 0; i < m; ++i) {
                running = std::max(running, static_cast<double>(m - i) * p[o[i]]);
                out[o[i]] = std::min(1.0, running);
            }
            break;
        }
        case MultiplicityMethod::benjamini_hochberg: {
            const auto o = ascending_order(p);
            double running = INFINITY;
            for (std::size_t r = m; r-- > 0;) {  // rank r + 1, from the largest p down
                running = std::min(running, md / static_cast<double>(r + 1) * p[o[r]]);
                out[o[r]] = std::min(1.0, running);
            }
            break;
        }
    }
    *adjusted = std::move(out);
    return Status::success();
}

Status adjust_log10_p_values(const std::vector<double>& log10_p, MultiplicityMethod method,
                             std::vector<double>* adjusted) {
    adjusted->clear();
    for (std::size_t i = 0; i < log10_p.size(); ++i)
        if (!(log10_p[i] <= 0)) {
            char buf[120];
            std::snprintf(buf, sizeof buf, "log10 p-value %g (number %zu) must be at most 0.", log10_p[i], i + 1);
            return Status::failure(buf);
        }
    const std::size_t m = log10_p.size();
    const double lm = std::log10(static_cast<double>(m));
    std::vector<double> out(m);
    switch (method) {
        case MultiplicityMethod::none: out = log10_p; break;
        case MultiplicityMethod::bonferroni:
            for (std::size_t i = 0; i < m; ++i) out[i] = std::min(0.0, lm + log10_p[i]);
            break;
        case MultiplicityMethod::holm: {
            const auto o = ascending_order(log10_p);
            double running = -INFINITY;
            for (std::size_t i = 0; i < m; ++i) {
                running = std::max(running, std::log10(static_cast<double>(m - i)) + log10_p[o[i]]);
                out[o[i]] = std::min(0.0, running);
            }
            break;
        }
        case MultiplicityMethod::benjamini_hochberg: {
            const auto o = ascending_order(log10_p);
            double running = INFINITY;
            for (std::size_t r = m; r-- > 0;) {
                running = std::min(running, lm - std::log10(static_cast<double>(r + 1)) + log10_p[o[r]]);
                out[o[r]] = std::min(0.0, running);
            }
            break;
        }
    }
    *adjusted = std::move(out);
    return Status::success();
}

}  // namespace tallyproof
