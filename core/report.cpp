// Report wording follows common practice for significance tests: a result is "not consistent
// with" or shows "no evidence against" the stated mix; a test never proves a mix.
#include "report.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "json_writer.hpp"
#include "number_format.hpp"
#include "tallyproof_version.hpp"

namespace tallyproof {
namespace {

std::string pad(const std::string& s, std::size_t width) {
    std::size_t cps = 0;  // width in code points, so labels with accents or Greek line up
    for (unsigned char c : s) cps += (c & 0xC0) != 0x80;
    return cps >= width ? s + " " : s + std::string(width - cps, ' ');
}

std::string interval_text(const EffectSizeInterval& iv) {
    if (!std::isfinite(iv.lower) || !std::isfinite(iv.upper)) return "";
    return ", 95% CI [" + format_fixed(iv.lower, 3) + ", " + format_fixed(iv.upper, 3) + "]";
}

std::string grouped(std::uint64_t v) {  // 100000 -> "100,000"
    std::string s = std::to_string(v);
    for (int i = static_cast<int>(s.size()) - 3; i > 0; i -= 3) s.insert(static_cast<std::size_t>(i), ",");
    return s;
}

void write_tail(JsonWriter& j, const char* key, const TailProbability& t) { j.key(key).value(t.p); }

}  // namespace

std::string verdict_sentence(const Result& r) {
    const std::string at = "at α = " + format_plain(r.alpha);
    const char* mix = r.estimates.empty() ? "the stated mix" : "the fitted model";
    if (r.reject) return std::string("The counts are not consistent with ") + mix + " " + at + ".";
    return std::string("No evidence against ") + mix + " " + at + ".";
}

std::string method_phrase(const Result& r) {
    switch (r.method) {
        case PValueMethod::exact: return "exact";
        case PValueMethod::monte_carlo:
            return "Monte Carlo, B = " + grouped(r.monte_carlo.replicates) + ", seed " + std::to_string(r.monte_carlo.seed);
        case PValueMethod::asymptotic: break;
    }
    return "asymptotic";
}

std::string report_text(const Analysis& a, const Result& r) {
    (void)a;
    if (!r.status.ok) return "Not analysed: " + r.status.message + "\n";
    std::string s;
    s += "Chi-square goodness of fit: " + r.statistic_name + ", " + r.model_description + "\n";
    s += "N = " + format_count(r.n) + ", k = " + std::to_string(r.observed.size());
    if (r.merged) s += " (" + std::to_string(r.tested_categories.size()) + " after merging)";
    s += "\n";
    s += r.statistic_symbol + " = " + format_fixed(r.statistic, 2) + ", df = " + format_count(r.df) + ", p = " + format_probability(r.p) +
         " (" + method_phrase(r) + ")\n";
    if (r.method != PValueMethod::asymptotic) s += "Asymptotic p = " + format_probability(r.upper) + "\n";
    if (r.exact.computed) s += "Exact p error bound: " + format_significant(r.exact.error_bound, 2) + "\n";
    if (r.monte_carlo.computed)
        s += "Monte Carlo: " + grouped(r.monte_carlo.hits) + " of " + grouped(r.monte_carlo.replicates) +
             " replicates at least as extreme; standard error " + format_significant(r.monte_carlo.standard_error, 2) + "\n";
    s += "Critical value at α = " + format_plain(r.alpha) + ": " + format_fixed(r.critical_value, 3) + "\n";
    s += verdict_sentence(r) + "\n";
    s += "Effect size: w = " + format_fixed(r.effect.w, 3) + " (" + r.effect.w_label + ")" + interval_text(r.effect.w_interval);
    if (r.effect.fei_defined) s += "; Fei = " + format_fixed(r.effect.fei, 3) + interval_text(r.effect.fei_interval);
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
            s += "Power at w = " + format_fixed(r.plan.w, 3) + ", N = " + format_count(r.plan.n) + ": " +
                 format_fixed(r.plan.power, 3) + "; N for power " + format_fixed(r.plan.target_power, 2) + ": " +
                 format_count(r.plan.n_required) + "\n";
        else s += "Planning: " + r.plan.status.message + "\n";
    }
    for (const auto& w : r.warnings) s += "Note: " + w + "\n";
    for (const auto& c : r.cautions) s += "Caution: " + c + "\n";

    std::size_t wl = 8;
    for (const auto& c : r.tested_categories) wl = std::max(wl, std::min<std::size_t>(c.size(), 28));
    s += "\n" + pad("Category", wl + 2) + pad("Observed", 10) + pad("Expected", 10) + pad("Contribution", 14) + "Adj. residual\n";
    for (std::size_t i = 0; i < r.tested_categories.size(); ++i) {
        const double adj = i < r.diagnostics.categories.size() ? r.diagnostics.categories[i].adjusted_residual : NAN;
        s += pad(r.tested_categories[i], wl + 2) + pad(format_count(r.tested_observed[i]), 10) +
             pad(format_fixed(r.tested_expected[i], 2), 10) + pad(format_fixed(r.contributions[i], 3), 14) +
             format_fixed(adj, 2) + "\n";
    }
    return s;
}

std::string report_json(const Analysis& a, const Result& r) {
    JsonWriter j;
    j.begin_object();
    j.key("format").value("tallyproof/1");
    j.key("version").value(TALLYPROOF_VERSION);
    if (!r.status.ok) {
        j.key("error").value(r.status.message);
        if (r.status.line > 0) j.key("error_line").value(static_cast<double>(r.status.line));
        if (r.status.column > 0) j.key("error_column").value(static_cast<double>(r.status.column));
        j.key("warnings").strings(r.warnings);
        j.end_object();
        return j.str();
    }
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
    j.key("critical_value").value(r.critical_value);
    j.key("reject").value(r.reject);
    j.key("expected_shares").numbers(r.expected_shares);
    j.key("expected_counts").numbers(r.expected_counts);
    j.key("tested_categories").strings(r.tested_categories);
    j.key("tested_observed").numbers(r.tested_observed);
    j.key("tested_expected").numbers(r.tested_expected);
    j.key("contributions").numbers(r.contributions);
    std::vector<double> pres, ares, cp, cpa, sh;
    std::vector<std::string> dirs;
    for (const auto& d : r.diagnostics.categories) {
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
    j.key("contribution_shares").numbers(sh);
    j.key("directions").strings(dirs);
    j.key("p_adjustment").value(multiplicity_method_name(r.diagnostics.adjustment));
    j.key("drivers").begin_array();
    for (std::size_t i : r.diagnostics.drivers) j.value(static_cast<double>(i));
    j.end_array();
    j.key("intervals").begin_object();
    j.key("method").value("Sison-Glaz");
    j.key("level").value(1 - r.alpha);
    j.key("lower").begin_array();
    for (const auto& d : r.diagnostics.categories) j.value(d.sison_glaz.lower);
    j.end_array().key("upper").begin_array();
    for (const auto& d : r.diagnostics.categories) j.value(d.sison_glaz.upper);
    j.end_array().key("goodman_lower").begin_array();
    for (const auto& d : r.diagnostics.categories) j.value(d.goodman.lower);
    j.end_array().key("goodman_upper").begin_array();
    for (const auto& d : r.diagnostics.categories) j.value(d.goodman.upper);
    j.end_array().end_object();
    j.key("effect_size").begin_object();
    j.key("w").value(r.effect.w).key("w_label").value(r.effect.w_label);
    j.key("w_interval").begin_array().value(r.effect.w_interval.lower).value(r.effect.w_interval.upper).end_array();
    if (r.effect.fei_defined) {
        j.key("fei").value(r.effect.fei);
        j.key("fei_interval").begin_array().value(r.effect.fei_interval.lower).value(r.effect.fei_interval.upper).end_array();
    } else {
        j.key("fei").null();
    }
    j.key("level").value(0.95).end_object();
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
    if (r.exact.requested) {
        j.key("exact").begin_object();
        if (r.exact.computed) j.key("p_value").value(r.exact.p.p).key("log10_p_value").value(r.exact.p.log10_p)
                                  .key("error_bound").value(r.exact.error_bound).key("work_units").value(r.exact.work_units)
                                  .key("method").value(r.exact.method);
        else j.key("refusal").value(r.exact.refusal);
        j.end_object();
    }
    if (r.monte_carlo.requested) {
        j.key("monte_carlo").begin_object();
        if (r.monte_carlo.computed)
            j.key("p_value").value(r.monte_carlo.p).key("se").value(r.monte_carlo.standard_error)
                .key("replicates").value(static_cast<double>(r.monte_carlo.replicates))
                .key("hits").value(static_cast<double>(r.monte_carlo.hits))
                .key("seed").value(static_cast<double>(r.monte_carlo.seed))
                .key("refit").value(r.monte_carlo.refit);
        else j.key("refusal").value(r.monte_carlo.refusal);
        j.end_object();
    }
    if (r.digits.computed) {
        j.key("mad").value(r.digits.mad);
        j.key("mad_band").value(r.digits.band);
    }
    if (r.plan.requested) {
        j.key("plan").begin_object().key("w").value(r.plan.w).key("n").value(r.plan.n).key("alpha").value(r.plan.alpha)
            .key("df").value(r.plan.df).key("target_power").value(r.plan.target_power)
            .key("power").value(r.plan.power).key("n_required").value(r.plan.n_required);
        if (!r.plan.status.ok) j.key("error").value(r.plan.status.message);
        j.end_object();
    }
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
    j.key("warnings").strings(r.warnings);
    j.key("cautions").strings(r.cautions);
    j.end_object();
    return j.str();
}

}  // namespace tallyproof
