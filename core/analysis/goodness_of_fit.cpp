// The goodness-of-fit analysis: null model, merging of thin cells on expected counts, the
// power-divergence statistic (Cressie and Read 1984; Pearson 1900 for lambda = 1) referred to
// chi2(k - 1 - m) in complement form, with validity (Cochran 1954), diagnostics (Haberman 1973),
// effect sizes (Cohen 1988; Ben-Shachar et al. 2023) and power (Cohen 1988, ch. 7).
#include "goodness_of_fit.hpp"

#include <cmath>
#include <cstdio>

#include "fit_category_values.hpp"
#include "conformity_analysis.hpp"
#include "digit_laws.hpp"
#include "exact_lower_tail.hpp"
#include "mean_absolute_deviation.hpp"
#include "label_text.hpp"
#include "merge_categories.hpp"
#include "null_model.hpp"
#include "number_format.hpp"
#include "power_analysis.hpp"
#include "power_divergence.hpp"
#include "reference_sample_analysis.hpp"
#include "survey_analysis.hpp"

namespace tallyproof {
namespace {

// A refusal that leaves nothing of the analysis behind (no warnings gathered so far).
Status refused(Result* r, std::string message) {
    *r = Result{};
    return Status::failure(std::move(message));
}

std::string statistic_name(double lambda, bool williams) {
    const std::string named = power_lambda_name(lambda);
    if (lambda == 1) return "Pearson χ²";
    if (lambda == 0) return williams ? "likelihood ratio G² (Williams-corrected)" : "likelihood ratio G²";
    if (!named.empty()) return named + " (power divergence, λ = " + lambda_value_text(lambda) + ")";
    return "power divergence, λ = " + lambda_value_text(lambda);
}

// Labels of merged whole-number cells from their integer ranges ("2 or more", "3–4").
void relabel_integer_groups(const std::vector<std::string>& original, const std::vector<std::vector<std::size_t>>& groups,
                            std::vector<std::string>* labels) {
    std::vector<IntegerBin> bins;
    if (!integer_bins_from_labels(original, &bins).ok) return;
    for (std::size_t g = 0; g < groups.size() && g < labels->size(); ++g) {
        if (groups[g].size() < 2) continue;
        const double lo = bins[groups[g].front()].lo, hi = bins[groups[g].back()].hi;
        if (std::isinf(hi)) (*labels)[g] = format_plain(lo) + " or more";
        else if (std::isinf(lo)) (*labels)[g] = format_plain(hi) + " or fewer";
        else (*labels)[g] = format_plain(lo) + "–" + format_plain(hi);
    }
}

void add_cautions(const Analysis& a, Result* r) {
    if (a.design.requested)
        r->cautions.push_back("The design-corrected test assumes the design is described fully (weights, strata, clusters) and "
                              "treats the clusters as drawn with replacement within strata, which overstates the variance a "
                              "little when a large share of the clusters was sampled.");
    else
        r->cautions.push_back("The test assumes independent observations from a random sample, and counts, not percentages or rates.");
    if (model_is_digit_law(a.model.kind))
        r->cautions.push_back("A digit test that fails is a reason to look closer, never proof of fabrication: many genuine "
                              "data sets do not follow these laws (rounding, thresholds, assigned numbers, small ranges).");
    r->cautions.push_back("Decisions that affect people or suppliers (rejecting a lot, questioning a source) should follow "
                          "your local rules and professional review, not this test alone.");
}

// Planning: power and sample size (Cohen 1988, ch. 7; the same for a 2 x k table, with N both samples).
void add_plan(const Analysis& a, double n, Result* r) {
    if (!a.plan.requested) return;
    PlanOutcome& pl = r->plan;
    pl.requested = true;
    pl.w = std::isfinite(a.plan.w) ? a.plan.w : r->effect.w;
    pl.alpha = std::isfinite(a.plan.alpha) ? a.plan.alpha : a.alpha;
    pl.df = std::isfinite(a.plan.df) ? a.plan.df : r->df;
    pl.n = std::isfinite(a.plan.n) ? a.plan.n : n;
    pl.target_power = std::isfinite(a.plan.target_power) ? a.plan.target_power : 0.8;
    pl.power = gof_power(pl.w, pl.n, pl.alpha, pl.df);
    pl.status = gof_sample_size(pl.w, pl.target_power, pl.alpha, pl.df, &pl.n_required);
    if (!pl.status.ok) pl.n_required = NAN;
    if (std::isnan(pl.power)) pl.status = Status::failure("Power needs w > 0, N > 0, 0 < α < 1 and df ≥ 1.");
}

// The counts as read: labels, look-alikes, whole non-negative counts and their total N.
Status read_counts(const Analysis& a, Result* r) {
    const std::size_t k = a.observed.size();
    if (k == 0) return refused(r, "There are no categories: paste lines of label and count.");
    if (a.categories.size() != k)
        return refused(r, "There are " + std::to_string(a.categories.size()) + " labels but " + std::to_string(k) + " counts.");
    if (k < 2) return refused(r, "Only one category (\"" + a.categories[0] + "\"): a goodness-of-fit test needs at least two.");
    if (!(a.alpha > 0 && a.alpha < 1)) return refused(r, "The significance level α must lie between 0 and 1.");
    if (!std::isfinite(a.statistic.lambda)) return refused(r, "The power-divergence λ must be a finite number.");
    r->categories = a.categories;
    r->look_alike_labels = look_alike_groups(a.categories);
    if (!r->look_alike_labels.empty()) r->warnings.push_back(look_alike_warning(a.categories, r->look_alike_labels));
    r->observed = a.observed;
    r->alpha = a.alpha;
    double n = 0;
    for (std::size_t i = 0; i < k; ++i) {
        const double o = a.observed[i];
        // With a survey design the counts are weighted shares times n, not whole numbers.
        if (!std::isfinite(o) || o < 0 || (o != std::floor(o) && !a.design.requested) || o >= 9007199254740992.0)
            return refused(r, "The count for \"" + a.categories[i] + "\" must be a non-negative whole number.");
        n += o;
    }
    if (n <= 0) return refused(r, "All counts are zero: there is nothing to test.");
    r->n = n;
    if (n > 9007199254740992.0)
        r->warnings.push_back("The counts total more than 2^53 (about 9.007 × 10¹⁵): the total is held to 16 significant "
                              "digits, so N = " + format_count(n) + " may differ from the exact sum in its last digits "
                              "(the statistic and p-value are not affected at that precision).");
    // Whole counts that total 100 are counts far more often than percentages (decimals, % signs
    // and a percent header are caught where the paste is read): a quiet question, not a warning.
    if (n == 100 && !a.design.requested)
        r->questions.push_back("The counts total 100: are they counts of items, not percentages? A test needs the counts.");
    return Status::success();
}

// The tested cells: categories with a positive expected share (a share of zero must not be
// observed), merged by the rule asked for on their expected counts.
struct Cells {
    std::vector<std::string> labels;
    std::vector<double> obs, exp;
};

Status tested_cells(const Analysis& a, Result* r, Cells* c) {
    const std::size_t k = a.observed.size();
    std::vector<std::size_t> kept;
    for (std::size_t i = 0; i < k; ++i) {
        if (!(r->expected_counts[i] > 0)) {
            if (a.observed[i] > 0)
                return refused(r, "Category \"" + a.categories[i] + "\" has an expected share of zero but was observed " +
                                       format_count(a.observed[i]) + " times: the stated mix rules it out.");
            r->warnings.push_back("Category \"" + a.categories[i] + "\" has an expected share of zero and no observations; it is left out of the test.");
            continue;
        }
        c->labels.push_back(a.categories[i]);
        c->obs.push_back(a.observed[i]);
        c->exp.push_back(r->expected_counts[i]);
        kept.push_back(i);
    }
    if (c->labels.size() < 2) return refused(r, "Fewer than two categories have a positive expected share.");
    Status s = check_validity(c->exp, &r->validity_before_merge);
    if (!s.ok) return s;
    if (a.merge.rule == MergeRule::none) {
        for (std::size_t j : kept) r->merge_map.push_back({j});
        return Status::success();
    }
    MergeOptions mo;
    mo.rule = a.merge.rule;
    mo.minimum = a.merge.minimum;
    mo.ordered = a.ordered || model_is_fitted(a.model.kind) || model_is_digit_law(a.model.kind);
    MergeResult mr;
    s = merge_categories(c->labels, c->obs, c->exp, mo, &mr);
    if (!s.ok) return s;
    r->merged = mr.merged;
    r->merge_note = mr.note;
    for (const auto& g : mr.groups) {
        std::vector<std::size_t> orig;
        for (std::size_t j : g) orig.push_back(kept[j]);
        r->merge_map.push_back(orig);
    }
    c->labels = mr.labels;
    const bool whole_numbers = model_is_fitted(a.model.kind) && a.model.kind != ModelKind::normal &&
                               a.model.kind != ModelKind::lognormal && a.model.kind != ModelKind::exponential;
    if (whole_numbers) relabel_integer_groups(a.categories, r->merge_map, &c->labels);
    c->obs = mr.observed;
    c->exp = mr.expected;
    return Status::success();
}

// Parameters estimated: the p-values at both ends of the Chernoff and Lehmann df range.
void add_df_range(const Analysis& a, double cells, int model_parameters, Result* r) {
    if (r->estimated_parameters <= 0) return;
    r->df_range.lower_df = r->df;
    r->df_range.upper_df = cells - 1 - model_parameters;
    r->df_range.p_at_lower_df = r->upper;
    r->df_range.shown = true;
    if (a.extra_estimated_parameters > 0) {
        r->df_range.p_at_upper_df = chi_square_upper_tail(r->statistic, r->df_range.upper_df);
        r->df_range.note = "Parameters estimated from the raw data put the true p-value between the p at df " +
                           format_count(r->df_range.lower_df) + " and at df " + format_count(r->df_range.upper_df) +
                           " (Chernoff and Lehmann 1954).";
        return;
    }
    // Estimated from these grouped counts by maximum likelihood: df = k - 1 - m exactly
    // (asymptotically); the range is shown for reference if they had come from raw data.
    r->df_range.upper_df = cells - 1;
    r->df_range.p_at_upper_df = chi_square_upper_tail(r->statistic, r->df_range.upper_df);
    r->df_range.note = "The parameters were fitted to these grouped counts, so df = k − 1 − m = " + format_count(r->df) +
                       ". Had they been estimated from the raw values, the p-value would lie between this and the p at df " +
                       format_count(r->df_range.upper_df) + " (Chernoff and Lehmann 1954).";
}

// The statistic on the tested cells and its asymptotic p-value.
Status add_statistic(const Analysis& a, const Cells& c, Result* r) {
    const double cells = static_cast<double>(c.labels.size());
    r->df = cells - 1 - r->estimated_parameters;
    if (r->df < 1)
        return refused(r, "No degrees of freedom are left: " + format_count(cells) + " cells less 1 less " +
                               std::to_string(r->estimated_parameters) + " estimated parameter(s) gives " + format_count(r->df) +
                               ". Use more categories or give the parameters.");
    PowerDivergenceOptions po;
    po.lambda = a.statistic.lambda;
    po.williams_correction = a.statistic.williams;
    PowerDivergence pd;
    Status s = power_divergence(c.obs, c.exp, po, &pd);
    if (!s.ok) return s;
    r->lambda = pd.lambda;
    r->williams_q = pd.williams_q;
    r->statistic = pd.statistic;
    r->contributions = pd.contributions;
    r->statistic_name = statistic_name(a.statistic.lambda, a.statistic.williams);
    r->statistic_symbol = statistic_symbol(a.statistic.lambda);
    r->upper = chi_square_upper_tail(r->statistic, r->df);
    r->lower = chi_square_lower_tail(r->statistic, r->df);
    r->critical_value = chi_square_critical_value(a.alpha, r->df);
    r->method = PValueMethod::asymptotic;
    r->p = r->upper;
    r->reject = r->p.p <= a.alpha;
    r->exact.requested = a.pvalue.method == PValueMethod::exact;
    r->monte_carlo.requested = a.pvalue.method == PValueMethod::monte_carlo;
    return Status::success();
}

// Diagnostics per tested cell, effect sizes and the "too good a fit" check.
void add_diagnostics_and_effects(const Analysis& a, const Cells& c, Result* r) {
    CategoryDiagnosticsOptions dopt;
    dopt.alpha = a.alpha;
    const Status s = category_diagnostics(c.labels, c.obs, c.exp, dopt, &r->diagnostics);
    if (!s.ok) r->warnings.push_back("Per-category diagnostics were not computed: " + s.message);
    r->warnings.insert(r->warnings.end(), r->diagnostics.warnings.begin(), r->diagnostics.warnings.end());

    // Effect sizes (95% intervals by inverting the noncentral chi-square; the reported w is chance-corrected)
    double p_min = 1;
    for (double e : c.exp) p_min = std::min(p_min, e / r->n);
    r->effect = effect_outcome(r->statistic, r->n, r->df, p_min);
    // A fit closer than chance allows (lower tail; Fisher's remark on Mendel's data is the classic case).
    // At small N the chi-square lower tail is far off (X² = 0 at N = 15 has exact probability 0.053,
    // chi2 gives 0), so the exact P(T <= statistic) decides there; otherwise it is named asymptotic.
    r->exact_lower_computed = r->lambda > -1 && exact_lower_tail(c.obs, c.exp, r->lambda, &r->exact_lower).ok;
    const TailProbability& closeness = r->exact_lower_computed ? r->exact_lower : r->lower;
    if (closeness.p < 0.001 && r->df >= 2)
        r->warnings.push_back(std::string("The counts sit closer to the stated mix than chance usually allows (") +
                              (r->exact_lower_computed ? "exact" : "asymptotic") + " lower-tail p = " +
                              format_probability(closeness) + "): check how the counts were recorded before relying on them.");
    if (r->reject && r->effect.estimate < 0.1)
        r->warnings.push_back("The departure is statistically significant but very small (w = " + format_fixed(r->effect.estimate, 3) +
                              "): with N = " + format_count(r->n) + ", even a negligible difference is detected.");
}

// Digit laws: mean absolute deviation with Nigrini's bands.
void add_digit_deviation(const Analysis& a, Result* r) {
    DigitTest test;
    if (!digit_test_of(a.model.kind, &test) || r->merged) return;
    const MeanAbsoluteDeviation mad = mean_absolute_deviation(a.observed, test);
    if (!mad.status.ok) return;
    r->digits.computed = true;
    r->digits.mad = mad.mad;
    r->digits.band = mad.band == Conformity::not_applicable ? "" : mad.label;
}

// Whole-number categories in order (0, 1, 2, ...) tested against equal shares: counts per unit
// like these are usually tested against a fitted count model, which the verdict suggests.
void suggest_count_models(const Analysis& a, Result* r) {
    if (a.model.kind != ModelKind::equal) return;
    std::vector<IntegerBin> bins;
    if (!integer_bins_from_labels(a.categories, &bins).ok || bins.size() < 3) return;
    r->model_suggestion = "The categories are whole numbers in order (" + a.categories.front() + " to " + a.categories.back() +
                          "): counts per unit such as these (defects per item, events per day, plants per plot) are "
                          "usually tested against a count model fitted to them (Poisson, binomial or negative "
                          "binomial), not against equal shares. Choose one under the expected mix.";
}

}  // namespace

Result analyse(const Analysis& asked) {
    Result r;
    // Survey data: the weighted shares are tested, then corrected for the design (survey_analysis).
    Analysis designed;
    if (asked.design.requested) {
        const Status prepared = prepare_design_analysis(asked, &designed);
        if (!prepared.ok) { r.status = prepared; return r; }
    }
    const Analysis& a = asked.design.requested ? designed : asked;
    Status s = read_counts(a, &r);
    if (!s.ok) { r.status = s; return r; }
    // Survey rows: n is the number of respondents exactly (the weighted counts n p̂ may sum to it
    // only up to rounding).
    if (asked.design.requested && !asked.design.sample.weight.empty()) r.n = static_cast<double>(asked.design.sample.weight.size());
    const double n = r.n;

    if (a.model.kind == ModelKind::reference_sample) {  // 2 x k homogeneity: core/analysis/reference_sample_analysis
        analyse_reference_sample(a, &r);
        if (!r.status.ok) return r;
        r.statistic_name = statistic_name(a.statistic.lambda, false);
        r.statistic_symbol = statistic_symbol(a.statistic.lambda);
        add_plan(a, r.reference->n_total, &r);
        add_conformity(a, &r);
        add_cautions(a, &r);
        return r;
    }

    // Null model and expected counts
    NullModel model;
    s = null_model(a, n, &model);
    if (!s.ok) { r.status = s; return r; }
    const std::size_t k = a.observed.size();
    r.expected_shares = model.shares;
    r.expected_counts.resize(k);
    for (std::size_t i = 0; i < k; ++i) r.expected_counts[i] = n * model.shares[i];
    r.model_description = model.description;
    r.estimates = model.parameters;
    r.estimated_parameters = model.estimated_parameters + a.extra_estimated_parameters;
    r.warnings.insert(r.warnings.end(), model.warnings.begin(), model.warnings.end());

    Cells cells;
    s = tested_cells(a, &r, &cells);
    if (!s.ok) { r.status = s; return r; }
    r.tested_categories = cells.labels;
    r.tested_observed = cells.obs;
    r.tested_expected = cells.exp;
    s = check_validity(cells.exp, &r.validity);
    if (!s.ok) { r.status = s; return r; }

    s = add_statistic(a, cells, &r);
    if (!s.ok) { r.status = s; return r; }
    add_df_range(a, static_cast<double>(cells.labels.size()), model.estimated_parameters, &r);
    add_diagnostics_and_effects(a, cells, &r);
    if (a.design.requested) {
        add_design_correction(a, &r);
        if (!r.status.ok) return r;
        if (asked.conformity.requested)
            r.warnings.push_back("The conformity test is not offered for survey data: its margin would need the design's "
                                 "own distribution. Only the test of departure is corrected for the design.");
    }
    add_plan(a, r.design ? r.design->effective_n : n, &r);  // survey data: power at the effective n
    add_digit_deviation(a, &r);
    suggest_count_models(a, &r);
    add_conformity(a, &r);
    add_cautions(a, &r);
    return r;
}

}  // namespace tallyproof
