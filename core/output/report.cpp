// Report wording follows common practice for significance tests: a result is "not consistent
// with" or shows "no evidence against" the stated mix; a test never proves a mix.
#include "report.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "exact_bracket_text.hpp"
#include "glossary.hpp"
#include "json_writer.hpp"
#include "number_format.hpp"
#include "tallyproof_version.hpp"

namespace tallyproof {
namespace {

// A list member, or null where the list is empty (not given for this kind of result).
void numbers_or_null(JsonWriter& j, const char* key, const std::vector<double>& v) {
    j.key(key);
    if (v.empty()) j.null();
    else j.numbers(v);
}

std::string pad(const std::string& s, std::size_t width) {
    std::size_t cps = 0;  // width in code points, so labels with accents or Greek line up
    for (unsigned char c : s) cps += (c & 0xC0) != 0x80;
    return cps >= width ? s + " " : s + std::string(width - cps, ' ');
}

std::string interval_text(const EffectSizeInterval& iv) {
    if (!std::isfinite(iv.lower) || !std::isfinite(iv.upper)) return "";
    return ", 95% CI [" + format_fixed(iv.lower, 3) + ", " + format_fixed(iv.upper, 3) + "]";
}

std::string grouped(std::uint64_t v) { return format_grouped(v); }

void write_tail(JsonWriter& j, const char* key, const TailProbability& t) { j.key(key).value(t.p); }

}  // namespace

std::string verdict_sentence(const Result& r) {
    const std::string at = "at α = " + format_plain(r.alpha);
    if (r.reference) {
        const std::string prev = "the previous sample (N = " + format_count(r.reference->n_reference) + ")";
        if (r.reject) return "The mix differs from " + prev + " " + at + ".";
        return "No evidence that the mix differs from " + prev + " " + at + ".";
    }
    const char* mix = r.estimates.empty() ? "the stated mix" : "the fitted model";
    if (r.reject) return std::string("The counts are not consistent with ") + mix + " " + at + ".";
    return std::string("No evidence against ") + mix + " " + at + ".";
}

namespace {
// "w0 = 0.10 (a shift of 3.5 percentage points between the two smallest categories)"
std::string margin_text(double w, double points) {
    std::string s = "w < " + format_fixed(w, 2);
    if (std::isfinite(points)) s += ", a shift of up to " + format_significant(points, 2) + " percentage points between two categories";
    return s;
}
}  // namespace

std::string conformity_verdict(const Result& r) {
    if (!r.conformity) return "";
    const ConformityResult& c = *r.conformity;
    if (!c.status.ok) return "Conformity not tested: " + c.status.message;
    const std::string within = "within " + margin_text(c.margin_w, c.margin_points);
    if (c.conforms) return "The counts conform to the stated mix " + within + " (conformity p = " + format_probability(c.p_value) + ").";
    std::string s = "Conformity " + within + " is not shown (conformity p = " + format_probability(c.p_value) + ")";
    if (std::isfinite(c.smallest_margin_w))
        s += "; with N = " + format_count(c.n) + " the data allow only " + margin_text(c.smallest_margin_w, c.smallest_margin_points);
    return s + ".";
}

std::string headline_verdict(const Result& r) {
    if (r.conformity && r.conformity->status.ok) return conformity_verdict(r);
    return verdict_sentence(r);
}

std::string method_phrase(const Result& r) {
    switch (r.method) {
        case PValueMethod::exact:
            return !r.exact.bracketed ? "exact" : exact_bracket_is_wide(r) ? "exact, the upper end of its certified bracket"
                                                                            : "exact, the midpoint of its certified bracket";
        case PValueMethod::monte_carlo:
            return "Monte Carlo, " + grouped(r.monte_carlo.replicates) + " replicates, seed " + std::to_string(r.monte_carlo.seed);
        case PValueMethod::asymptotic: break;
    }
    return "asymptotic";
}

std::string design_report_text(const Result& r) {
    if (!r.design) return "";
    const DesignCorrection& d = *r.design;
    std::string s = "Survey design: " + d.correction + "\n";
    if (d.second_order.available)
        s += "Second order (Satterthwaite): χ²/(δ̄(1 + a²)) = " + format_fixed(d.second_order.statistic, 3) + ", df = " +
             format_significant(d.second_order.df, 4) + ", p = " + format_probability(d.second_order.p) +
             (r.design_decided_on == "second-order" ? " (decides)" : "") + "\n";
    const char* first_name = d.tier == DesignTier::overall_design_effect ? "Crude (χ² / overall design effect)" : "First order (χ²/δ̄)";
    s += std::string(first_name) + " = " + format_fixed(d.first_order.statistic, 3) + ", df = " + format_count(d.first_order.df) +
         ", p = " + format_probability(d.first_order.p) + (r.design_decided_on != "second-order" ? " (decides)" : "") + "\n";
    if (d.f_form.available)
        s += "F form: F = " + format_fixed(d.f_form.statistic, 3) + " on " + format_significant(d.f_form.numerator_df, 4) + " and " +
             format_significant(d.f_form.denominator_df, 4) + " df (PSUs − strata = " +
             format_count(static_cast<double>(d.clusters) - static_cast<double>(d.strata)) + "), p = " + format_probability(d.f_form.p) + "\n";
    if (!d.second_order.available) s += "Second order not offered: " + d.second_order.reason + "\n";
    s += (d.tier == DesignTier::overall_design_effect ? "Overall design effect = " : "Mean design effect δ̄ = ") +
         format_significant(d.mean_design_effect, 4);
    if (!d.generalised_design_effects.empty()) {
        s += " (generalised design effects";
        for (double e : d.generalised_design_effects) s += " " + format_significant(e, 3);
        s += "; a² = " + format_significant(d.cv2, 3) + ")";
    }
    s += "; effective n = " + format_significant(d.effective_n, 4) + " of " + format_count(d.n) + "\n";
    if (!d.design_effects.empty()) {
        s += "Design effects per category:";
        for (std::size_t j = 0; j < d.design_effects.size() && j < r.categories.size(); ++j)
            s += std::string(j ? "," : "") + " " + r.categories[j] + " " +
                 (std::isfinite(d.design_effects[j]) ? format_significant(d.design_effects[j], 3) : "not defined (share 0 or 1)");
        s += "\n";
    }
    if (std::isfinite(d.kish_design_effect)) s += "Kish's design effect of the weights (1 + CV²): " + format_significant(d.kish_design_effect, 4) + "\n";
    if (d.clusters > 0) {
        const std::string strata = format_count(static_cast<double>(d.strata)) + (d.strata == 1 ? " stratum" : " strata");
        s += d.clustered ? "PSUs: " + format_count(static_cast<double>(d.clusters)) + " clusters in " + strata + "\n"
                         : "PSUs: each respondent its own (no cluster column), in " + strata + "\n";
    }
    s += "Uncorrected: " + r.statistic_symbol + " = " + format_fixed(d.uncorrected_statistic, 2) + ", df = " + format_count(d.uncorrected_df) +
         ", p = " + format_probability(d.uncorrected_p) + ". It treats the weighted shares as a simple random sample of " +
         format_count(d.n) + " independent respondents, so where weighting and clustering make the shares vary more than "
         "that (a design effect above 1) it overstates the evidence.\n";
    return s;
}

std::string report_text(const Analysis& a, const Result& r) {
    (void)a;
    if (!r.status.ok) return "Not analysed: " + r.status.message + "\n";
    std::string s;
    if (r.reference)
        s += "Chi-square test of homogeneity: " + r.statistic_name + ", compared with the previous sample of N = " +
             format_count(r.reference->n_reference) + "\n";
    else s += "Chi-square goodness of fit: " + r.statistic_name + ", " + r.model_description + "\n";
    const bool conformity_goal = r.conformity && r.conformity->status.ok;
    if (conformity_goal) s += "Answer (the goal is conformity): " + conformity_verdict(r) + "\nThe test of departure, second:\n";
    s += "N = " + format_count(r.n) + (r.reference ? " (both samples " + format_count(r.reference->n_total) + ")" : "") +
         ", k = " + std::to_string(r.observed.size()) + " categories";
    if (r.merged) s += " (" + std::to_string(r.tested_categories.size()) + " after merging)";
    s += "\n";
    if (r.design) s += design_report_text(r);
    else
    s += r.statistic_symbol + " = " + format_fixed(r.statistic, 2) + ", df = " + format_count(r.df) + ", " + headline_p_text(r) +
         " (" + method_phrase(r) + ")\n";
    if (r.method != PValueMethod::asymptotic) s += "Asymptotic p = " + format_probability(r.upper) + "\n";
    if (r.exact.computed && r.exact.bracketed) s += exact_bracket_sentence(r) + "\n";
    else if (r.exact.computed) s += "Exact p error bound: " + format_significant(r.exact.error_bound, 2) + "\n";
    if (r.monte_carlo.computed)
        s += "Monte Carlo: " + grouped(r.monte_carlo.hits) + " of " + grouped(r.monte_carlo.replicates) +
             " replicates at least as extreme; standard error " + format_significant(r.monte_carlo.standard_error, 2) + "\n";
    if (!r.design) s += "Lower-tail p (how often chance gives a fit this close or closer; a tiny value means too good a fit): " +
         format_probability(r.exact_lower_computed ? r.exact_lower : r.lower) + (r.exact_lower_computed ? " (exact)\n" : " (asymptotic)\n");
    if (!r.design) s += "Critical value at α = " + format_plain(r.alpha) + ": " + format_fixed(r.critical_value, 3) + "\n";
    s += verdict_sentence(r) + "\n";
    if (!r.model_suggestion.empty()) s += "Suggestion: " + r.model_suggestion + "\n";
    s += "Effect size: w = " + format_fixed(r.effect.estimate, 3) + " (" + r.effect.label + ", corrected for chance)" +
         interval_text(r.effect.w_interval) + "; Cohen's w before the correction, √(" + r.statistic_symbol + "/N) = " +
         format_fixed(r.effect.w, 3) + ", averages about √(df/N) = " + format_fixed(std::sqrt(r.df / (r.reference ? r.reference->n_total : r.n)), 3) + " even when the mix holds";
    if (r.effect.fei_defined) s += "; Fei (w rescaled to run from 0 to 1 for these expected shares) = " + format_fixed(r.effect.fei, 3) + interval_text(r.effect.fei_interval);
    s += "\n";
    s += "Validity: " + r.validity.summary + "\n";
    if (r.df_range.shown) s += r.df_range.note + " p at df " + format_count(r.df_range.upper_df) + ": " +
                               format_probability(r.df_range.p_at_upper_df) + "\n";
    if (r.merged) s += "Merged: " + r.merge_note + "\n";
    if (!r.diagnostics.summary.empty()) s += "Where it differs: " + r.diagnostics.summary + "\n";
    if (r.digits.computed) {
        s += "Mean absolute deviation: " + format_significant(r.digits.mad, 3);
        if (!r.digits.band.empty()) s += " (" + r.digits.band + ", Nigrini 2012)";
        s += "\n";
    }
    if (r.plan.requested) {
        if (r.plan.status.ok)
            s += "Power at w = " + format_fixed(r.plan.w, 3) + (r.design ? ", effective n = " + format_significant(r.plan.n, 4) : ", N = " + format_count(r.plan.n)) + ": " +
                 format_fixed(r.plan.power, 3) + "; " + (r.design ? "effective n" : "N") + " for power " + format_fixed(r.plan.target_power, 2) + ": " +
                 format_count(r.plan.n_required) + (r.design ? " (times the mean design effect for the respondents needed)" : "") + "\n";
        else s += "Planning: " + r.plan.status.message + "\n";
    }
    if (r.conformity) {
        if (!conformity_goal) s += conformity_verdict(r) + "\n";
        const ConformityResult& c = *r.conformity;
        if (c.status.ok) {
            s += "Conformity margin w0 = " + format_fixed(c.margin_w, 3) + ": conform when " + r.statistic_symbol + " < " +
                 format_fixed(c.critical_value, 3) + " (α quantile of the noncentral chi-square, df " + format_count(c.df) +
                 ", noncentrality " + format_significant(c.noncentrality, 4) + "); smallest margin shown " +
                 format_fixed(c.smallest_margin_w, 3) + "\n";
            if (c.plan.computed)
                s += "To show conformity within w0 = " + format_fixed(c.margin_w, 2) + " with power " + format_fixed(c.plan.target_power, 2) +
                     " when the true w is " + format_fixed(c.plan.true_w, 2) + ": N = " + format_count(c.plan.n_required) +
                     " (power at N = " + format_count(c.n) + ": " + format_fixed(c.plan.power_at_n, 3) + ")\n";
            else s += "Conformity planning: " + c.plan.status.message + "\n";
        }
    }
    for (const auto& w : r.warnings) s += "Note: " + w + "\n";
    for (const auto& q : r.questions) s += "Check: " + q + "\n";
    for (const auto& c : r.cautions) s += "Caution: " + c + "\n";

    std::size_t wl = 8;
    for (const auto& c : r.tested_categories) wl = std::max(wl, std::min<std::size_t>(c.size(), 28));
    const bool two = r.reference.has_value();  // a comparison shows the previous sample's column too
    s += "\n" + pad("Category", wl + 2) + pad("Observed", 10) + (two ? pad("Previous", 10) : "") + pad("Expected", 10) +
         pad("Contribution", 14) + "Adj. residual\n";
    for (std::size_t i = 0; i < r.tested_categories.size(); ++i) {
        const double adj = i < r.diagnostics.categories.size() ? r.diagnostics.categories[i].adjusted_residual : NAN;
        s += pad(r.tested_categories[i], wl + 2) + pad(r.design ? format_fixed(r.tested_observed[i], 2) : format_count(r.tested_observed[i]), 10) +
             (two ? pad(format_count(r.reference->tested_reference[i]), 10) : "") +
             pad(format_fixed(r.tested_expected[i], 2), 10) + pad(format_fixed(r.contributions[i], 3), 14) +
             format_fixed(adj, 2) + "\n";
    }
    return s;
}

bool begin_result_document(JsonWriter& j, const Status& status) {
    j.begin_object();
    j.key("format").value("tallyproof/1");
    j.key("version").value(TALLYPROOF_VERSION);
    if (status.ok) return true;
    j.key("error").value(status.message);
    if (status.line > 0) j.key("error_line").value(static_cast<double>(status.line));
    if (status.column > 0) j.key("error_column").value(static_cast<double>(status.column));
    return false;
}

namespace {

void write_test(JsonWriter& j, const Analysis& a, const Result& r) {
    j.key("categories").strings(r.categories);
    j.key("observed").numbers(r.observed);
    j.key("ordered").value(a.ordered);
    j.key("model").begin_object().key("kind").value(model_kind_name(a.model.kind)).key("description").value(r.model_description).end_object();
    j.key("n").value(r.n);
    j.key("alpha").value(r.alpha);
    j.key("statistic_name").value(r.statistic_name);
    j.key("lambda").value(r.lambda);
    j.key("williams_q").value(r.williams_q);
    j.key("statistic").value(r.statistic);
    j.key("df").value(r.df);
    j.key("method").value(pvalue_method_name(r.method));
    write_tail(j, "p_value", r.p);
    j.key("log10_p_value").value(r.p.log10_p);
    write_tail(j, "asymptotic_p_value", r.upper);
    j.key("asymptotic_log10_p_value").value(r.upper.log10_p);
    write_tail(j, "lower_p_value", r.lower);
    j.key("log10_lower_p_value").value(r.lower.log10_p);
    if (r.exact_lower_computed)
        j.key("exact_lower_p_value").value(r.exact_lower.p).key("log10_exact_lower_p_value").value(r.exact_lower.log10_p);
    else
        j.key("exact_lower_p_value").null().key("log10_exact_lower_p_value").null();
    j.key("critical_value").value(r.critical_value);
    j.key("reject").value(r.reject);
}

void write_categories(JsonWriter& j, const Result& r) {
    j.key("expected_shares").numbers(r.expected_shares);
    j.key("expected_counts").numbers(r.expected_counts);
    j.key("tested_categories").strings(r.tested_categories);
    j.key("tested_observed").numbers(r.tested_observed);
    j.key("tested_expected").numbers(r.tested_expected);
    j.key("contributions").numbers(r.contributions);
    std::vector<double> pres, ares, cp, cpa, sh;
    std::vector<std::string> dirs, cpa_text;
    for (const auto& d : r.diagnostics.categories) {
        cpa_text.push_back(format_probability(d.adjusted));
        pres.push_back(d.pearson_residual);
        ares.push_back(d.adjusted_residual);
        cp.push_back(d.binomial.p);
        cpa.push_back(d.adjusted.p);
        sh.push_back(d.contribution_share);
        dirs.push_back(d.direction);
    }
    j.key("pearson_residuals").numbers(pres);
    j.key("adjusted_residuals").numbers(ares);
    j.key("category_p_values").numbers(cp);
    j.key("category_p_adjusted").numbers(cpa);
    j.key("category_p_adjusted_text").strings(cpa_text);
    j.key("contribution_shares").numbers(sh);
    j.key("directions").strings(dirs);
    j.key("p_adjustment").value(multiplicity_method_name(r.diagnostics.adjustment));
    j.key("drivers").begin_array();
    for (std::size_t i : r.diagnostics.drivers) j.value(static_cast<double>(i));
    j.end_array();
    j.key("drivers_rule").value(r.diagnostics.rule);
}

void write_intervals(JsonWriter& j, const Result& r) {
    j.key("intervals").begin_object();
    j.key("method").value("Sison-Glaz");
    j.key("level").value(1 - r.alpha);
    j.key("alpha").value(r.alpha);
    j.key("lower").begin_array();
    for (const auto& d : r.diagnostics.categories) j.value(d.sison_glaz.lower);
    j.end_array().key("upper").begin_array();
    for (const auto& d : r.diagnostics.categories) j.value(d.sison_glaz.upper);
    j.end_array().key("goodman_lower").begin_array();
    for (const auto& d : r.diagnostics.categories) j.value(d.goodman.lower);
    j.end_array().key("goodman_upper").begin_array();
    for (const auto& d : r.diagnostics.categories) j.value(d.goodman.upper);
    j.end_array();
    if (r.reference)
        j.key("note").value("Simultaneous intervals for one sample's shares do not apply to a comparison with a previous sample.");
    else if (!r.diagnostics.warnings.empty()) j.key("note").value(r.diagnostics.warnings.front());
    j.end_object();
}

void write_interval(JsonWriter& j, const char* key, const EffectSizeInterval& iv) {
    j.key(key).begin_array().value(iv.lower).value(iv.upper).end_array();
}

// w, w_interval and fei, fei_interval are the chance-corrected estimate (the one the page leads
// with, inside its interval); cohen_w is the uncorrected sqrt(statistic / N), kept for reference.
void write_effect_size(JsonWriter& j, const EffectOutcome& e) {
    j.key("effect_size").begin_object();
    j.key("w").value(e.estimate).key("w_label").value(e.label);
    write_interval(j, "w_interval", e.w_interval);
    j.key("cohen_w").value(e.w).key("cohen_w_label").value(e.w_label);
    if (e.fei_defined) {
        j.key("fei").value(e.fei);
        write_interval(j, "fei_interval", e.fei_interval);
    } else {
        j.key("fei").null();
    }
    j.key("level").value(0.95).end_object();
}

void write_model_fit(JsonWriter& j, const Result& r) {
    j.key("estimates").begin_object();
    for (const auto& p : r.estimates) j.key(p.name).value(p.value);
    j.end_object();
    j.key("estimated").begin_array();
    for (const auto& p : r.estimates) if (p.estimated) j.value(p.name);
    j.end_array();
    j.key("estimated_parameters").value(static_cast<double>(r.estimated_parameters));
    if (r.df_range.shown) {
        j.key("df_range").begin_object().key("lower_df").value(r.df_range.lower_df).key("upper_df").value(r.df_range.upper_df)
            .key("p_at_lower_df").value(r.df_range.p_at_lower_df.p).key("p_at_upper_df").value(r.df_range.p_at_upper_df.p)
            .key("note").value(r.df_range.note).end_object();
    }
    j.key("merged").value(r.merged);
    j.key("merge_map").begin_array();
    for (const auto& g : r.merge_map) {
        j.begin_array();
        for (std::size_t i : g) j.value(static_cast<double>(i));
        j.end_array();
    }
    j.end_array();
}

void write_pvalue_methods(JsonWriter& j, const Analysis& a, const Result& r) {
    const char* ordering = a.pvalue.ordering == ExactOrdering::probability ? "probability" : "statistic";
    if (r.exact.requested) {
        j.key("exact").begin_object().key("ordering").value(ordering);
        if (r.exact.computed) j.key("p_value").value(r.exact.p.p).key("log10_p_value").value(r.exact.p.log10_p)
                                  .key("error_bound").value(r.exact.error_bound).key("work_units").value(r.exact.work_units)
                                  .key("method").value(r.exact.method)
                                  .key("bracket").begin_object().key("lower").value(r.exact.p_lower).key("upper").value(r.exact.p_upper)
                                  .key("alpha").value(r.alpha).key("decides_at_alpha").value(r.exact.decides_at_alpha)
                                  .key("budget_ended").value(r.exact.bracketed && !r.exact.decides_at_alpha).end_object();
        else {
            j.key("refusal").value(r.exact.refusal);
            if (!r.exact.method.empty()) j.key("method").value(r.exact.method);
        }
        j.end_object();
    }
    if (r.monte_carlo.requested) {
        j.key("monte_carlo").begin_object().key("ordering").value(ordering);
        if (r.monte_carlo.computed)
            j.key("p_value").value(r.monte_carlo.p).key("se").value(r.monte_carlo.standard_error)
                .key("replicates").value(static_cast<double>(r.monte_carlo.replicates))
                .key("hits").value(static_cast<double>(r.monte_carlo.hits))
                .key("seed").value(static_cast<double>(r.monte_carlo.seed))
                .key("refit").value(r.monte_carlo.refit);
        else j.key("refusal").value(r.monte_carlo.refusal);
        j.end_object();
    }
}

void write_plan(JsonWriter& j, const Result& r) {
    if (r.digits.computed) {
        j.key("mad").value(r.digits.mad);
        j.key("mad_band").value(r.digits.band);
    }
    if (!r.plan.requested) return;
    j.key("plan").begin_object().key("w").value(r.plan.w).key("n").value(r.plan.n).key("alpha").value(r.plan.alpha)
        .key("df").value(r.plan.df).key("target_power").value(r.plan.target_power)
        .key("power").value(r.plan.power).key("n_required").value(r.plan.n_required);
    if (!r.plan.status.ok) j.key("error").value(r.plan.status.message);
    j.end_object();
}

void write_reference_sample(JsonWriter& j, const Result& r) {
    if (!r.reference) return;
    const ReferenceSampleOutcome& ref = *r.reference;
    std::vector<double> cp, lp;
    for (const auto& t : ref.category_p) { cp.push_back(t.p); lp.push_back(t.log10_p); }
    j.key("reference_sample").begin_object()
        .key("observed").numbers(ref.reference).key("n").value(ref.n_reference).key("n_total").value(ref.n_total)
        .key("tested_observed").numbers(ref.tested_reference).key("tested_expected").numbers(ref.expected_reference)
        .key("pooled_shares").numbers(ref.pooled_shares).key("adjusted_residuals").numbers(ref.adjusted_residuals)
        .key("category_p_values").numbers(cp).key("category_p_adjusted").numbers(ref.category_p_adjusted)
        .key("exact_tables").value(ref.exact_tables)
        .key("validity_current").begin_object().key("min_expected").value(ref.validity_current.min_expected)
            .key("below_5").value(static_cast<double>(ref.validity_current.below_5)).end_object()
        .key("validity_reference").begin_object().key("min_expected").value(ref.validity_reference.min_expected)
            .key("below_5").value(static_cast<double>(ref.validity_reference.below_5)).end_object()
        .end_object();
}

void write_conformity(JsonWriter& j, const Result& r) {
    if (!r.conformity) return;
    const ConformityResult& c = *r.conformity;
    j.key("conformity").begin_object().key("margin_w").value(c.margin_w).key("margin_points").value(c.margin_points);
    if (c.status.ok) {
        j.key("p_value").value(c.p_value.p).key("log10_p_value").value(c.p_value.log10_p).key("conforms").value(c.conforms)
            .key("smallest_margin_w").value(c.smallest_margin_w).key("smallest_margin_points").value(c.smallest_margin_points)
            .key("critical_value").value(c.critical_value)
            .key("noncentrality").value(c.noncentrality).key("verdict").value(conformity_verdict(r));
        j.key("plan").begin_object().key("true_w").value(c.plan.true_w).key("target_power").value(c.plan.target_power)
            .key("n_required").value(c.plan.n_required).key("power_at_n").value(c.plan.power_at_n);
        if (!c.plan.status.ok) j.key("error").value(c.plan.status.message);
        j.end_object();
    } else {
        j.key("error").value(c.status.message);
    }
    j.end_object();
}

void write_validity(JsonWriter& j, const Result& r) {
    j.key("validity").begin_object()
        .key("min_expected").value(r.validity.min_expected)
        .key("below_5").value(static_cast<double>(r.validity.below_5))
        .key("below_1").value(static_cast<double>(r.validity.below_1))
        .key("all_at_least_5").value(r.validity.all_at_least_5)
        .key("cochran").value(r.validity.cochran_holds)
        .key("summary").value(r.validity.summary)
        .key("before_merge").begin_object()
            .key("min_expected").value(r.validity_before_merge.min_expected)
            .key("below_5").value(static_cast<double>(r.validity_before_merge.below_5))
            .key("below_1").value(static_cast<double>(r.validity_before_merge.below_1))
            .key("all_at_least_5").value(r.validity_before_merge.all_at_least_5)
            .key("cochran").value(r.validity_before_merge.cochran_holds).end_object()
        .end_object();
}

// The answer to the goal chosen, first: the conformity test when it was asked for (and could
// be computed), else the test of departure.
void write_answer(JsonWriter& j, const Result& r) {
    const bool conformity = r.conformity && r.conformity->status.ok;
    j.key("goal").value(conformity ? "conformity" : "departure");
    j.key("answer").begin_object().key("test").value(conformity ? "conformity" : "departure")
        .key("verdict").value(headline_verdict(r))
        .key("p_value").value(conformity ? r.conformity->p_value.p : r.p.p)
        .key("log10_p_value").value(conformity ? r.conformity->p_value.log10_p : r.p.log10_p).end_object();
}

}  // namespace

namespace {

void write_design_test(JsonWriter& j, const char* key, const DesignTest& t) {
    j.key(key);
    if (!t.available) { j.null(); return; }
    j.begin_object().key("statistic").value(t.statistic).key("df").value(t.df).key("p_value").value(t.p.p)
        .key("log10_p_value").value(t.p.log10_p).end_object();
}

// The survey design's correction (Rao and Scott 1981, 1984): both orders, the F form, the design effects.
void write_design(JsonWriter& j, const Analysis& a, const Result& r) {
    if (!r.design) return;
    const DesignCorrection& d = *r.design;
    j.key("design").begin_object();
    j.key("tier").value(design_tier_name(d.tier));
    j.key("correction").value(d.correction);
    j.key("decided_on").value(r.design_decided_on);
    j.key("uncorrected").begin_object().key("statistic").value(d.uncorrected_statistic).key("df").value(d.uncorrected_df)
        .key("p_value").value(d.uncorrected_p.p).key("log10_p_value").value(d.uncorrected_p.log10_p).end_object();
    write_design_test(j, "first_order", d.first_order);
    write_design_test(j, "second_order", d.second_order);
    if (!d.second_order.available) j.key("second_order_reason").value(d.second_order.reason);
    j.key("f_form");
    if (d.f_form.available)
        j.begin_object().key("statistic").value(d.f_form.statistic).key("numerator_df").value(d.f_form.numerator_df)
            .key("denominator_df").value(d.f_form.denominator_df).key("p_value").value(d.f_form.p.p).end_object();
    else j.null();
    if (!d.f_form.available) j.key("f_form_reason").value(d.f_form.reason);
    j.key("mean_design_effect").value(d.mean_design_effect);
    numbers_or_null(j, "design_effects", d.design_effects);
    numbers_or_null(j, "generalised_design_effects", d.generalised_design_effects);
    j.key("cv2_design_effects").value(d.cv2);
    j.key("effective_n").value(d.effective_n);
    j.key("nominal_n").value(d.n);
    j.key("total_weight").value(d.total_weight);
    j.key("kish_design_effect").value(d.kish_design_effect);
    j.key("weighted_shares").numbers(d.shares);
    numbers_or_null(j, "standard_errors", d.standard_errors);
    j.key("clusters");
    if (d.clusters > 0) j.value(static_cast<double>(d.clusters)); else j.null();
    j.key("strata");
    if (d.strata > 0) j.value(static_cast<double>(d.strata)); else j.null();
    const SurveySample& s = a.design.sample;
    j.key("columns").begin_object().key("category").value(s.category_column).key("weight").value(s.weight_column)
        .key("stratum").value(s.stratum_column).key("cluster").value(s.cluster_column).end_object();
    j.end_object();
}

}  // namespace

std::string report_json(const Analysis& a, const Result& r) {
    JsonWriter j;
    if (!begin_result_document(j, r.status)) {
        j.key("warnings").strings(r.warnings);
        j.end_object();
        return j.str();
    }
    write_answer(j, r);
    write_test(j, a, r);
    write_categories(j, r);
    write_intervals(j, r);
    write_effect_size(j, r.effect);
    write_model_fit(j, r);
    write_pvalue_methods(j, a, r);
    write_plan(j, r);
    write_reference_sample(j, r);
    write_conformity(j, r);
    write_validity(j, r);
    write_design(j, a, r);
    j.key("warnings").strings(r.warnings);
    j.key("questions").strings(r.questions);
    if (!r.model_suggestion.empty()) j.key("model_suggestion").value(r.model_suggestion);
    j.key("cautions").strings(r.cautions);
    // What each abbreviation and symbol of the report text means (the form view lists them).
    j.key("glossary").begin_array();
    for (const GlossaryEntry* e : glossary_terms_in(report_text(a, r)))
        j.begin_object().key("term").value(std::string(e->term)).key("meaning").value(std::string(e->meaning)).end_object();
    j.end_array();
    j.end_object();
    return j.str();
}

}  // namespace tallyproof
