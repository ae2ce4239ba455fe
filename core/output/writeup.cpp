// Results write-up in the reporting style that is common practice for chi-square tests (APA-like:
// statistic to two decimals, exact p to three decimals with no leading zero and "p < .001" below,
// effect size with its 95% interval; American Psychological Association 2020, Publication Manual
// 7th ed., sec. 6.36-6.44, from memory). Symbols of the power-divergence family follow Read and
// Cressie (1988), Goodness-of-Fit Statistics for Discrete Multivariate Data (from memory).
#include "writeup.hpp"

#include <algorithm>
#include <cmath>
#include <vector>

#include "exact_bracket_text.hpp"
#include "number_format.hpp"
#include "power_divergence.hpp"
#include "report.hpp"  // conformity_verdict
#include "table_export.hpp"

namespace tallyproof {
namespace {

struct Style {
    bool comma = false;
    bool markdown = false;
};

std::string mark(std::string s, const Style& st) {
    if (st.comma)
        for (char& c : s) if (c == '.') c = ',';
    return s;
}

std::string fixed(double x, int decimals, const Style& st) {
    std::string s = format_fixed(x, decimals);
    if (s.size() > 1 && s[0] == '-' && s.find_first_not_of("-0.") == std::string::npos) s.erase(0, 1);  // no "-0.00"
    return mark(s, st);
}

// Thousands grouped: "100,000" (APA 6.38), or with a narrow no-break space when the decimal mark
// is a comma (SI Brochure, 9th ed., 5.4.4), so a comma never means two things.
std::string grouped(double v, const Style& st) {
    if (!(std::isfinite(v) && v == std::floor(v) && std::fabs(v) < 1e15)) return mark(format_count(v), st);
    std::string s = format_count(v);
    const std::string sep = st.comma ? "\u202F" : ",";
    const int stop = s[0] == '-' ? 1 : 0;
    for (int i = static_cast<int>(s.size()) - 3; i > stop; i -= 3) s.insert(static_cast<std::size_t>(i), sep);
    return s;
}

std::string list_sep(const Style& st) { return st.comma ? "; " : ", "; }

std::string p_report(const TailProbability& p, const Style& st) {  // "= .043", "< .001"
    return mark(format_p_report(p), st);
}

std::string alpha_text(double alpha, const Style& st) {  // ".05": alpha cannot exceed 1, so no leading zero
    std::string s = format_plain(alpha);
    if (s.rfind("0.", 0) == 0) s.erase(0, 1);
    return mark(s, st);
}

// Markdown: backslash-escape the punctuation CommonMark gives meaning to inside a paragraph or
// table cell, and flatten line breaks, so labels cannot open links, HTML, code or new cells.
std::string md(const std::string& s) {
    std::string out;
    for (char c : s) {
        if (c == '\n' || c == '\r' || c == '\t') { out += ' '; continue; }
        if (static_cast<unsigned char>(c) < 0x20 || c == 0x7F) { out += ' '; continue; }
        if (std::string_view("\\`*_[]{}()<>&|#!~$").find(c) != std::string_view::npos) out += '\\';
        out += c;
    }
    return out;
}

std::string user_text(const std::string& s, const Style& st) { return st.markdown ? md(s) : s; }

std::string one_sample_test_name(const Result& r);

// A comparison with a previous sample is a test of homogeneity of the same family.
std::string test_name(const Result& r) {
    std::string name = one_sample_test_name(r);
    const std::string gof = "goodness-of-fit test";
    if (r.reference && name.find(gof) != std::string::npos) name.replace(name.find(gof), gof.size(), "test of homogeneity");
    return name;
}

std::string one_sample_test_name(const Result& r) {
    if (r.lambda == power_lambda::pearson) return "A chi-square goodness-of-fit test";
    if (r.lambda == power_lambda::log_likelihood)
        return r.williams_q != 1 ? "A likelihood-ratio goodness-of-fit test with Williams' correction"
                                 : "A likelihood-ratio goodness-of-fit test";
    if (r.lambda == power_lambda::freeman_tukey) return "A Freeman-Tukey goodness-of-fit test";
    if (r.lambda == power_lambda::mod_log_likelihood) return "A modified likelihood-ratio goodness-of-fit test";
    if (r.lambda == power_lambda::neyman) return "A Neyman modified chi-square goodness-of-fit test";
    return "A Cressie-Read power-divergence goodness-of-fit test (λ = " + format_significant(r.lambda, 3) + ")";
}

std::string method_text(const Result& r, const Style& st) {
    switch (r.method) {
        case PValueMethod::exact: return "exact";
        case PValueMethod::monte_carlo:
            return "Monte Carlo" + list_sep(st) + grouped(static_cast<double>(r.monte_carlo.replicates), st) + " replicates" +
                   list_sep(st) + "seed " + std::to_string(r.monte_carlo.seed);
        case PValueMethod::asymptotic: break;
    }
    return "asymptotic";
}

std::string joined_labels(const std::vector<std::string>& labels) {  // "A", "A and B", "A, B and C"
    std::string s;
    for (std::size_t i = 0; i < labels.size(); ++i) {
        if (i) s += i + 1 == labels.size() ? " and " : ", ";
        s += labels[i];
    }
    return s;
}

std::string rule_text(const Analysis& a, const Style& st) {
    switch (a.merge.rule) {
        case MergeRule::cochran: return "no expected count is below 1 and at most 20% are below 5 (Cochran's rule)";
        case MergeRule::custom_minimum: return "every expected count is at least " + mark(format_plain(a.merge.minimum), st);
        case MergeRule::all_at_least_5:
        case MergeRule::none: break;
    }
    return "every expected count is at least 5";
}

std::vector<std::string> notes(const Analysis& a, const Result& r, const Style& st) {
    std::vector<std::string> out;
    if (r.merged) {
        std::vector<std::string> groups;
        for (const auto& g : r.merge_map) {
            if (g.size() < 2) continue;
            std::vector<std::string> labels;
            for (std::size_t i : g) labels.push_back(user_text(i < r.categories.size() ? r.categories[i] : "?", st));
            groups.push_back(joined_labels(labels));
        }
        if (groups.size() == 1)
            out.push_back("Categories " + groups[0] + " were merged so that " + rule_text(a, st) + ".");
        else {
            std::string joined;
            for (std::size_t i = 0; i < groups.size(); ++i) joined += (i ? "; " : "") + groups[i];
            out.push_back("Categories were merged in " + std::to_string(groups.size()) + " groups (" + joined + ") so that " +
                          rule_text(a, st) + ".");
        }
    }
    if (r.estimated_parameters > 0) {
        const double cells = static_cast<double>(r.tested_categories.size());
        out.push_back("The expected counts come from a fitted model (" + user_text(r.model_description, st) + "); " +
                      std::to_string(r.estimated_parameters) + (r.estimated_parameters == 1 ? " parameter was" : " parameters were") +
                      " estimated, so df = " + format_count(cells) + " − 1 − " + std::to_string(r.estimated_parameters) +
                      " = " + format_count(r.df) + ".");
    }
    if (r.method == PValueMethod::asymptotic && !r.validity.cochran_holds)
        out.push_back("Some expected counts are small (the smallest is " + fixed(r.validity.min_expected, 2, st) +
                      "), so the asymptotic p-value may be inaccurate; an exact or Monte Carlo p-value is safer.");
    if (r.conformity && !r.conformity->status.ok) out.push_back(conformity_verdict(r));  // a conformity answer leads the sentence
    if (!r.diagnostics.drivers.empty()) {
        std::vector<std::string> named;
        for (std::size_t i : r.diagnostics.drivers)
            if (i < r.diagnostics.categories.size()) {
                const CategoryDiagnostic& d = r.diagnostics.categories[i];
                named.push_back(user_text(d.label, st) + " (" + d.direction + ")");
            }
        out.push_back(std::string(named.size() == 1 ? "The category that drives the result (" : "The categories that drive the result (") +
                      user_text(r.diagnostics.rule, st) + "): " + joined_labels(named) + ".");
    }
    if (r.exact.computed && r.exact.bracketed) out.push_back(user_text(exact_bracket_sentence(r), st));
    if (r.exact.requested && !r.exact.computed)
        out.push_back("An exact p-value was not computed" + (r.exact.refusal.empty() ? std::string() : " (" + r.exact.refusal + ")") +
                      "; the p-value shown is asymptotic.");
    if (r.monte_carlo.requested && !r.monte_carlo.computed)
        out.push_back("A Monte Carlo p-value was not computed" +
                      (r.monte_carlo.refusal.empty() ? std::string() : " (" + r.monte_carlo.refusal + ")") +
                      "; the p-value shown is asymptotic.");
    return out;
}

// A fitted distribution is not a mix anyone stated, so it is named as what it is.
std::string mix_phrase(const Analysis& a) {
    if (a.model.kind == ModelKind::reference_sample) return "the previous sample's mix";
    return model_is_fitted(a.model.kind) ? "the fitted model" : "the stated mix";
}

std::string sentence(const Analysis& a, const Result& r, const Style& st, const std::string& subject_raw) {
    if (!r.status.ok) return "Not analysed: " + user_text(r.status.message, st);
    // When the goal is conformity its answer leads; the test of departure follows.
    const std::string lead = r.conformity && r.conformity->status.ok ? user_text(conformity_verdict(r), st) + " " : "";
    const std::string subject = user_text(subject_raw.empty() ? "the counts" : subject_raw, st);
    const std::string at = r.alpha == 0.05 ? "" : " at α = " + alpha_text(r.alpha, st);
    std::string s = test_name(r) + " found ";
    if (r.reference) {
        s = test_name(r) + ", compared with the previous sample of N = " + grouped(r.reference->n_reference, st) + ", found ";
        s += (r.reject ? "that the mix of " : "no evidence that the mix of ") + subject + " had changed" + at;
    } else {
        s += r.reject ? "that " + subject + " were not consistent with " + mix_phrase(a) + at
                      : "no evidence against " + mix_phrase(a) + " for " + subject + at;
    }
    const std::string sep = list_sep(st);
    const double n_all = r.reference ? r.reference->n_total : r.n;  // a 2 x k table reports both samples' N
    if (r.design) {
        // Survey data: the corrected statistic on its (possibly fractional) df, the correction named.
        const DesignCorrection& d = *r.design;
        const DesignTest& t = d.second_order.available ? d.second_order : d.first_order;
        std::string df = t.df == std::floor(t.df) ? format_count(t.df) : format_significant(t.df, 3);
        if (st.comma) std::replace(df.begin(), df.end(), '.', ',');
        s += ", design-corrected " + statistic_symbol(r.lambda) + "(" + df + ", n = " + grouped(d.n, st) + ") = " + fixed(t.statistic, 2, st);
        s += sep + "p " + p_report(r.p, st);
        s += sep + "w = " + fixed(r.effect.estimate, 2, st);
        s += " (" + user_text(d.correction, st) + "; mean design effect " + fixed(d.mean_design_effect, 2, st) +
             "; uncorrected " + statistic_symbol(r.lambda) + " = " + fixed(d.uncorrected_statistic, 2, st) + ", p " +
             p_report(d.uncorrected_p, st) + ").";
        return lead + s;
    }
    s += ", " + statistic_symbol(r.lambda) + "(" + format_count(r.df) + ", N = " + grouped(n_all, st) + ") = " + fixed(r.statistic, 2, st);
    s += sep + "p " + p_report(r.p, st);
    s += sep + "w = " + fixed(r.effect.estimate, 2, st);
    const EffectSizeInterval& iv = r.effect.w_interval;
    if (std::isfinite(iv.lower) && std::isfinite(iv.upper))
        s += sep + "95% CI " + (st.markdown ? "\\[" : "[") + fixed(iv.lower, 2, st) + sep + fixed(iv.upper, 2, st) +
             (st.markdown ? "\\]" : "]");
    s += " (" + method_text(r, st) + ").";
    return lead + s;
}

std::string p_cell_text(const TailProbability& p, const Style& st) {  // ".043", "< .001", "> .999"
    std::string s = p_report(p, st);
    if (s.rfind("= ", 0) == 0) s.erase(0, 2);
    return s;
}

std::string markdown_table(const Result& r, const Style& st) {
    std::string s = "| Category | Observed | Expected | Contribution | Adjusted residual | Adjusted p | Direction |\n"
                    "|:--|--:|--:|--:|--:|--:|:--|\n";
    for (std::size_t i = 0; i < r.tested_categories.size(); ++i) {
        const bool d = i < r.diagnostics.categories.size();
        const CategoryDiagnostic* c = d ? &r.diagnostics.categories[i] : nullptr;
        s += "| " + md(r.tested_categories[i]) + " | " + (r.design ? fixed(i < r.tested_observed.size() ? r.tested_observed[i] : NAN, 2, st)
                                               : grouped(i < r.tested_observed.size() ? r.tested_observed[i] : NAN, st)) +
             " | " + fixed(i < r.tested_expected.size() ? r.tested_expected[i] : NAN, 2, st) + " | " +
             fixed(i < r.contributions.size() ? r.contributions[i] : NAN, 2, st) + " | " +
             (c ? fixed(c->adjusted_residual, 2, st) : "n/a") + " | " + (c ? p_cell_text(c->adjusted, st) : "n/a") + " | " +
             (c ? md(c->direction) : "") + " |\n";
    }
    return s;
}

TableCell fixed_cell(double x, int decimals) {  // a number cell at print precision
    if (!std::isfinite(x)) return TableCell{true, ""};
    Style plain;
    return TableCell{true, fixed(x, decimals, plain), x};  // printed rounded; the value kept whole for a workbook
}

// The quantities of the write-up as (name, value) rows: the TSV style's first block and the
// workbook's "Numbers" sheet.
std::vector<std::vector<TableCell>> quantity_rows(const Analysis& a, const Result& r, const WriteupOptions& o) {
    Style st;
    st.comma = o.decimal_comma;
    std::vector<std::vector<TableCell>> rows;
    if (!r.status.ok) {
        rows.push_back({text_cell("Not analysed"), text_cell(r.status.message)});
        return rows;
    }
    const EffectSizeInterval& iv = r.effect.w_interval;
    rows.push_back({text_cell("Test"), text_cell(test_name(r).substr(2))});
    rows.push_back({text_cell("Statistic"), text_cell(statistic_symbol(r.lambda))});
    rows.push_back({text_cell("Value"), fixed_cell(r.statistic, 2)});
    rows.push_back({text_cell("df"), count_cell(r.df)});
    rows.push_back({text_cell("N"), count_cell(r.n)});
    rows.push_back({text_cell("p"), probability_cell(r.p)});
    rows.push_back({text_cell("p-value method"), text_cell(method_text(r, st))});
    if (r.design) {
        const DesignCorrection& d = *r.design;
        const DesignTest& t = d.second_order.available ? d.second_order : d.first_order;
        rows.push_back({text_cell("Design correction"), text_cell(d.correction)});
        rows.push_back({text_cell("Corrected statistic"), fixed_cell(t.statistic, 2)});
        rows.push_back({text_cell("Corrected df"), fixed_cell(t.df, 3)});
        rows.push_back({text_cell("Mean design effect"), fixed_cell(d.mean_design_effect, 3)});
        rows.push_back({text_cell("Effective n"), fixed_cell(d.effective_n, 1)});
        rows.push_back({text_cell("Uncorrected p"), probability_cell(d.uncorrected_p)});
    }
    rows.push_back({text_cell("Lower-tail p (fit too good?)"), probability_cell(r.exact_lower_computed ? r.exact_lower : r.lower)});
    rows.push_back({text_cell("w (corrected for chance)"), fixed_cell(r.effect.estimate, 2)});
    rows.push_back({text_cell("Cohen's w before the correction, √(χ²/N)"), fixed_cell(r.effect.w, 2)});
    rows.push_back({text_cell("w, 95% CI lower"), fixed_cell(iv.lower, 2)});
    rows.push_back({text_cell("w, 95% CI upper"), fixed_cell(iv.upper, 2)});
    rows.push_back({text_cell("Conclusion"), text_cell((r.reject ? "not consistent with " : "no evidence against ") + mix_phrase(a))});
    rows.push_back({text_cell("Sentence"), text_cell(sentence(a, r, st, o.subject))});
    for (const auto& n : notes(a, r, st)) rows.push_back({text_cell("Note"), text_cell(n)});
    return rows;
}

std::string tsv_block(const Analysis& a, const Result& r, const WriteupOptions& o) {
    TableExportOptions t;
    t.format = TableFormat::tsv;
    t.decimal_comma = o.decimal_comma;
    std::vector<std::vector<TableCell>> rows = quantity_rows(a, r, o);
    if (!r.status.ok) return write_table(rows, t);
    rows.push_back({});
    rows.push_back({text_cell("Category"), text_cell("Observed"), text_cell("Expected"), text_cell("Contribution"),
                    text_cell("Adjusted residual"), text_cell("Adjusted p"), text_cell("Direction")});
    for (std::size_t i = 0; i < r.tested_categories.size(); ++i) {
        const CategoryDiagnostic* c = i < r.diagnostics.categories.size() ? &r.diagnostics.categories[i] : nullptr;
        rows.push_back({text_cell(r.tested_categories[i]),
                        r.design ? fixed_cell(i < r.tested_observed.size() ? r.tested_observed[i] : NAN, 2)
                                 : count_cell(i < r.tested_observed.size() ? r.tested_observed[i] : NAN),
                        fixed_cell(i < r.tested_expected.size() ? r.tested_expected[i] : NAN, 2),
                        fixed_cell(i < r.contributions.size() ? r.contributions[i] : NAN, 2),
                        fixed_cell(c ? c->adjusted_residual : NAN, 2), c ? probability_cell(c->adjusted) : count_cell(NAN),
                        text_cell(c ? c->direction : "")});
    }
    return write_table(rows, t);
}

}  // namespace

std::string writeup_sentence(const Analysis& a, const Result& r, const WriteupOptions& o) {
    Style st;
    st.comma = o.decimal_comma;
    st.markdown = o.style == WriteupStyle::markdown;
    return sentence(a, r, st, o.subject);
}

std::vector<std::vector<TableCell>> writeup_quantities(const Analysis& a, const Result& r, const WriteupOptions& o) {
    return quantity_rows(a, r, o);
}

std::string writeup(const Analysis& a, const Result& r, const WriteupOptions& o) {
    if (o.style == WriteupStyle::tsv) return tsv_block(a, r, o);
    Style st;
    st.comma = o.decimal_comma;
    st.markdown = o.style == WriteupStyle::markdown;
    std::string s = sentence(a, r, st, o.subject) + "\n";
    if (!r.status.ok) return s;
    for (const auto& n : notes(a, r, st)) s += (st.markdown ? "\n" : "") + n + "\n";
    if (st.markdown) s += "\n" + markdown_table(r, st);
    return s;
}

}  // namespace tallyproof
