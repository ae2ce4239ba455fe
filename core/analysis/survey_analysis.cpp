// Design-corrected goodness of fit in an analysis: Rao and Scott (1981, JASA 76:221-230; 1984,
// Ann. Stat. 12:46-60) through core/survey/rao_scott, with the effect size's interval taken on the
// effective sample size n/δ̄ (Kish 1965, s. 8.2).
#include "survey_analysis.hpp"

#include <algorithm>
#include <cmath>

#include "number_format.hpp"
#include "power_divergence.hpp"

namespace tallyproof {

Status prepare_design_analysis(const Analysis& a, Analysis* tested) {
    *tested = a;
    const DesignChoice& d = a.design;
    if (model_is_fitted(a.model.kind) || model_is_digit_law(a.model.kind) || a.model.kind == ModelKind::reference_sample)
        return Status::failure("The design correction covers a stated mix (equal, shares, ratio or counts); a fitted "
                               "model, a digit law or a previous sample is not corrected for a survey design here.");
    if (a.merge.rule != MergeRule::none)
        return Status::failure("Merging thin categories is not offered with a survey design: merge them in the data and test again.");
    if (a.pvalue.method != PValueMethod::asymptotic)
        return Status::failure("Exact and Monte Carlo p-values assume a simple random sample of whole counts; with a survey "
                               "design the Rao–Scott correction gives the p-value.");
    if (a.statistic.lambda != power_lambda::pearson || a.statistic.williams)
        return Status::failure("The design correction applies to Pearson's χ² (λ = 1).");
    // The conformity test's margin would need the design's own noncentral distribution: not offered.
    tested->conformity = ConformityChoice{};
    if (a.extra_estimated_parameters != 0)
        return Status::failure("Extra estimated parameters are not combined with a survey design.");
    const bool tier2 = !d.category_design_effects.empty();
    const bool tier3 = d.kish || std::isfinite(d.overall_design_effect);
    if (tier2 && tier3) return Status::failure("Give either one design effect per category or one overall design effect, not both.");
    if (d.kish && d.sample.weight.empty())
        return Status::failure("Kish's design effect needs the respondents' weights (a weight column).");
    if (!d.sample.weight.empty()) {
        const Status s = check_survey_sample(d.sample);
        if (!s.ok) return s;
        // The counts tested: the weighted shares times the number of respondents.
        std::vector<double> totals(d.sample.categories.size(), 0.0);
        double sum = 0;
        for (std::size_t i = 0; i < d.sample.weight.size(); ++i) {
            totals[d.sample.category[i]] += d.sample.weight[i];
            sum += d.sample.weight[i];
        }
        const double n = static_cast<double>(d.sample.weight.size());
        // The counts as read must be the respondents per category (a document could say otherwise).
        std::vector<double> respondents(d.sample.categories.size(), 0.0);
        for (std::size_t c : d.sample.category) respondents[c] += 1;
        if (a.observed != respondents || a.categories != d.sample.categories)
            return Status::failure("The counts and categories do not match the survey design's respondents: \"observed\" must "
                                   "hold the respondents per category, in the order of \"categories\".");
        tested->categories = d.sample.categories;
        tested->observed.clear();
        for (double t : totals) tested->observed.push_back(n * t / sum);
    } else if (!tier2 && !tier3) {
        return Status::failure("A survey design needs respondent rows, one design effect per category, or an overall design effect.");
    }
    return Status::success();
}

void add_design_correction(const Analysis& a, Result* r) {
    const DesignChoice& d = a.design;
    const std::vector<double>& p0 = r->expected_shares;
    DesignCorrection c;
    if (!d.category_design_effects.empty()) {
        c = rao_scott_category_effects(r->observed, r->n, d.category_design_effects, p0);
        r->design_decided_on = "first-order";
    } else if (d.kish || std::isfinite(d.overall_design_effect)) {
        const double D = d.kish ? kish_design_effect(d.sample.weight) : d.overall_design_effect;
        c = crude_design_correction(r->observed, r->n, D, p0, d.kish);
        if (c.status.ok && !d.sample.weight.empty()) {
            c.kish_design_effect = kish_design_effect(d.sample.weight);
            c.clusters = survey_psu_count(d.sample);
            c.strata = survey_stratum_count(d.sample);
            c.clustered = !d.sample.cluster.empty();
        }
        r->design_decided_on = "crude";
    } else {
        c = rao_scott_respondents(d.sample, p0);
        r->design_decided_on = "second-order";
    }
    if (!c.status.ok) {
        const Status refused = c.status;
        *r = Result{};
        r->status = refused;
        return;
    }
    const DesignTest& decided = c.second_order.available ? c.second_order : c.first_order;
    r->p = decided.p;
    r->reject = r->p.p <= a.alpha;
    r->critical_value = chi_square_critical_value(a.alpha, decided.df);
    // Effect size: w of the weighted shares, its interval on the effective sample size.
    if (c.mean_design_effect > 0 && std::isfinite(c.mean_design_effect)) {
        double p_min = 1;
        for (double e : p0) if (e > 0) p_min = std::min(p_min, e);
        // The same Cohen's w, sqrt(X²/n); the chance correction and the intervals on n/δ̄.
        r->effect = effect_outcome(c.first_order.statistic, c.effective_n, c.first_order.df, p_min);
    }
    r->warnings.push_back("Survey design: the test is the " + c.correction + "; the uncorrected χ² = " +
                          format_fixed(c.uncorrected_statistic, 2) + " (p = " + format_probability(c.uncorrected_p) +
                          ") treats the weighted shares as a simple random sample of " + format_count(c.n) +
                          " and so overstates the evidence when the design effect exceeds 1 (mean design effect " +
                          format_significant(c.mean_design_effect, 3) + ", effective n " + format_significant(c.effective_n, 4) + ").");
    // Per-category diagnostics assume whole counts from a simple random sample: not given here
    // (with the weighted counts of respondent rows they are not computed at all).
    const std::vector<std::string> diagnostic_notes = r->diagnostics.warnings;
    r->warnings.erase(std::remove_if(r->warnings.begin(), r->warnings.end(),
                                     [&](const std::string& w) {
                                         return w.rfind("Per-category diagnostics were not computed", 0) == 0 ||
                                                std::find(diagnostic_notes.begin(), diagnostic_notes.end(), w) != diagnostic_notes.end();
                                     }),
                      r->warnings.end());
    r->diagnostics = CategoryDiagnostics{};
    r->warnings.push_back("Per-category residuals and intervals are not given for survey data (they assume a simple random "
                          "sample of whole counts); the table shows each category's weighted count n p̂ and its share of "
                          "the uncorrected χ². The validity check uses the nominal n.");
    r->design = std::move(c);
}

}  // namespace tallyproof
