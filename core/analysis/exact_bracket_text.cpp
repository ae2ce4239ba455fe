// Words for the grid bracket (exact_grid_bracket; decision-aimed refinement after Keich &
// Nagarajan 2006, J. Comput. Graph. Stat. 15:779-802): the test is decided exactly when
// p_upper <= α (reject) or p_lower > α (do not reject); the Monte Carlo offer is the one the
// exact refusal made before (docs/methods.md).
#include "exact_bracket_text.hpp"

#include <algorithm>
#include <cmath>

#include "exact_grid_bracket.hpp"
#include "number_format.hpp"

namespace tallyproof {

std::string bracket_bound_text(double x, int digits, bool upper) {
    if (!(x > 0)) return "0";
    if (x >= 1) return "1";
    const double e = std::floor(std::log10(x)) - digits + 1;
    const double scale = std::pow(10.0, -e);
    // A relative nudge of 1e-12 keeps a bound already on the decimal grid from moving a step.
    double v = upper ? std::ceil(x * scale * (1 - 1e-12)) / scale : std::floor(x * scale * (1 + 1e-12)) / scale;
    if (upper) v = std::min(1.0, std::max(v, x));
    else v = std::min(v, x);
    return format_significant(v, digits);
}

int bracket_digits(double p_lower, double p_upper) {
    const double mid = 0.5 * (p_lower + p_upper), width = p_upper - p_lower;
    if (!(mid > 0) || !(width > 0)) return 7;
    return std::clamp(static_cast<int>(std::ceil(std::log10(mid / width))) + 1, 2, 7);
}

std::string exact_bracket_interval(const ExactOutcome& e) {
    const int d = bracket_digits(e.p_lower, e.p_upper);
    return "[" + bracket_bound_text(e.p_lower, d, false) + ", " + bracket_bound_text(e.p_upper, d, true) + "]";
}

std::string exact_bracket_sentence(const Result& r) {
    const ExactOutcome& e = r.exact;
    if (!e.computed || !e.bracketed) return "";
    const std::string at = "α = " + format_plain(r.alpha);
    if (e.decides_at_alpha)
        return "Exact p bracket " + exact_bracket_interval(e) + " (certified): exact decision at " + at + ", the whole bracket " +
               (e.p_upper <= r.alpha ? "at or below α." : "above α.");
    return "Exact p bracket " + exact_bracket_interval(e) + " (certified), budget ended: it does not decide the test at " + at +
           " (the decision shown uses its midpoint); use the Monte Carlo p-value for a tighter estimate.";
}

bool exact_bracket_is_wide(const Result& r) {
    return r.method == PValueMethod::exact && r.exact.computed && r.exact.bracketed && r.exact.p_upper > 10 * r.exact.p_lower;
}

std::string headline_p_text(const Result& r) {
    if (exact_bracket_is_wide(r)) return "p ≤ " + bracket_bound_text(r.exact.p_upper, 2, true);
    return "p = " + format_probability(r.p);
}

}  // namespace tallyproof
