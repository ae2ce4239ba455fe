// Per-category diagnostics: Pearson residuals (O - E) / sqrt(E), adjusted residuals
// (O - E) / sqrt(E (1 - p)) which are asymptotically standard normal (Haberman 1973, Biometrics
// 29:205-220; as R's chisq.test()$stdres for a goodness-of-fit test), and exact binomial tests
// of each count against its share, adjusted as R's p.adjust. Flags use the adjusted p-value.
#include "category_diagnostics.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "binomial_test.hpp"
#include "number_format.hpp"

namespace tallyproof {
namespace {

std::string adjustment_phrase(MultiplicityMethod m) {
    switch (m) {
        case MultiplicityMethod::holm: return "Holm-adjusted";
        case MultiplicityMethod::bonferroni: return "Bonferroni-adjusted";
        case MultiplicityMethod::benjamini_hochberg: return "Benjamini-Hochberg-adjusted";
        case MultiplicityMethod::none: return "unadjusted";
    }
    return "";
}

}  // namespace

std::string drivers_summary(std::size_t drivers, std::size_t k, const std::string& test, const std::string& described,
                            const std::string& none_phrase) {
    if (drivers == 0)
        return "No single category " + none_phrase + " (" + test + " for none of the " + std::to_string(k) + " categories).";
    return std::to_string(drivers) + " of " + std::to_string(k) + (drivers == 1 ? " categories drives" : " categories drive") +
           " the result (" + test + "): " + described + ".";
}

Status category_diagnostics(const std::vector<std::string>& labels, const std::vector<double>& observed,
                            const std::vector<double>& expected, const CategoryDiagnosticsOptions& options,
                            CategoryDiagnostics* result) {
    *result = CategoryDiagnostics{};
    const std::size_t k = observed.size();
    if (k < 2) return Status::failure("Category diagnostics need at least two categories.");
    if (expected.size() != k || labels.size() != k)
        return Status::failure("There are " + std::to_string(k) + " observed counts, " +
                               std::to_string(expected.size()) + " expected counts and " +
                               std::to_string(labels.size()) + " labels; they must match.");
    if (!(options.alpha > 0 && options.alpha < 1))
        return Status::failure("The significance level α must lie between 0 and 1.");
    double n = 0, e_total = 0;
    for (std::size_t i = 0; i < k; ++i) {
        const double o = observed[i], e = expected[i];
        if (!std::isfinite(o) || o < 0 || o != std::floor(o))
            return Status::failure("The count for \"" + labels[i] + "\" must be a non-negative whole number.");
        if (!std::isfinite(e) || !(e > 0))
            return Status::failure("The expected count for \"" + labels[i] +
                                   "\" must be positive; merge or remove a category the model rules out.");
        n += o;
        e_total += e;
    }
    if (!(n > 0)) return Status::failure("All counts are zero: there is nothing to diagnose.");
    if (std::fabs(e_total - n) > 1e-9 * n)
        return Status::failure("The expected counts total " + format_significant(e_total, 10) +
                               " but the observed counts total " + format_count(n) + "; they must agree.");

    CategoryDiagnostics& r = *result;
    r.alpha = options.alpha;
    r.adjustment = options.adjustment;
    r.categories.resize(k);
    std::vector<double> p_values(k), log10_p(k);
    std::vector<double> before(k + 1, 0.0), after(k + 1, 0.0);  // expected totals before / from each cell
    for (std::size_t i = 0; i < k; ++i) before[i + 1] = before[i] + expected[i];
    for (std::size_t i = k; i-- > 0;) after[i] = after[i + 1] + expected[i];
    for (std::size_t i = 0; i < k; ++i) {
        CategoryDiagnostic& d = r.categories[i];
        const double o = observed[i], e = expected[i], share = e / e_total;
        d.label = labels[i];
        d.observed = o;
        d.expected = e;
        d.difference = o - e;
        d.observed_share = o / n;
        d.expected_share = share;
        d.contribution = d.difference * d.difference / e;
        d.pearson_residual = d.difference / std::sqrt(e);
        // 1 - p as the other cells' expected total over the total: a share within rounding of 1
        // (the others ~1e-17) would otherwise give 1 - p = 0 and a 0/0 (found by fuzz_engine).
        const double rest = before[i] + after[i + 1];
        d.adjusted_residual = d.difference / std::sqrt(e * (rest / e_total));
        d.binomial = binomial_test_two_sided(o, n, share);
        if (std::isnan(d.binomial.p)) return Status::failure("The exact binomial test failed for \"" + labels[i] + "\".");
        p_values[i] = d.binomial.p;
        log10_p[i] = d.binomial.log10_p;
        r.statistic += d.contribution;
    }
    std::vector<double> adjusted, adjusted_log10;
    Status s = adjust_p_values(p_values, options.adjustment, &adjusted);
    if (s.ok) s = adjust_log10_p_values(log10_p, options.adjustment, &adjusted_log10);
    if (!s.ok) return s;

    // Intervals at 1 - alpha. Goodman's come from alpha itself (any alpha the chi-square quantile
    // resolves); Sison-Glaz's compare a coverage with 1 - alpha, which double precision holds only
    // down to kMinSisonGlazAlpha. Sison-Glaz's cost grows with the counts (Poisson tails near their
    // centre): above kMaxSisonGlazTotal only Goodman's intervals are given, so every analysis stays
    // bounded in time. Where Sison-Glaz is not given, the note says why and Goodman's stand in.
    std::vector<ProportionInterval> goodman, sison;
    const Status gm = goodman_intervals_at_alpha(observed, options.alpha, &goodman);
    if (!gm.ok) r.warnings.push_back("Simultaneous intervals are not available: " + gm.message);
    Status sg = gm;
    if (gm.ok && n > kMaxSisonGlazTotal)
        sg = Status::failure("they are computed for totals up to " + format_count(kMaxSisonGlazTotal) +
                             " (their cost grows with the counts); Goodman's intervals are given.");
    else if (gm.ok && options.alpha < kMinSisonGlazAlpha)
        sg = Status::failure("at α = " + format_significant(options.alpha, 3) + " (below " + format_significant(kMinSisonGlazAlpha, 1) +
                             ") their coverage cannot be told from 1 − α in double precision; Goodman's intervals are given.");
    else if (gm.ok) sg = sison_glaz_intervals(observed, 1 - options.alpha, &sison, &r.sison_glaz);
    if (gm.ok && !sg.ok) r.warnings.push_back("Sison-Glaz intervals are not available: " + sg.message);

    std::string drivers;
    for (std::size_t i = 0; i < k; ++i) {
        CategoryDiagnostic& d = r.categories[i];
        d.contribution_share = r.statistic > 0 ? d.contribution / r.statistic : 0.0;
        d.adjusted = {adjusted[i], adjusted_log10[i]};
        d.goodman = gm.ok ? goodman[i] : ProportionInterval{NAN, NAN};
        d.sison_glaz = sg.ok ? sison[i] : ProportionInterval{NAN, NAN};
        d.drives_result = adjusted[i] < options.alpha;
        // Expected counts carry rounding (100 × 0.4 is 40.000000000000007): a gap within 1e-9 of E is none.
        const double tie = 1e-9 * std::max(1.0, d.expected);
        d.direction = d.difference > tie ? "more than expected" : (d.difference < -tie ? "fewer than expected" : "as expected");
        d.description = d.label + ": " + d.direction + " (" + format_count(d.observed) + " observed vs " +
                        format_significant(d.expected, 3) + " expected; " + adjustment_phrase(options.adjustment) +
                        " p = " + format_probability(d.adjusted) + ")";
        if (d.drives_result) {
            r.drivers.push_back(i);
            drivers += (drivers.empty() ? "" : "; ") + d.description;
        }
    }
    const std::string test = adjustment_phrase(options.adjustment) + " exact binomial p below " + format_plain(options.alpha);
    r.rule = test + " for the category against the rest";
    r.summary = drivers_summary(r.drivers.size(), k, test, drivers, "departs clearly from its expected share");
    return Status::success();
}

}  // namespace tallyproof
