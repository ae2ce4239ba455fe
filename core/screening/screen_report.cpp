// Wording follows the one-sample reports: a group "departs from" the model when flagged; a screen
// never proves anything about a group. Numbers are the ScreenResult's, rounded for print only.
#include "screen_report.hpp"

#include <algorithm>
#include <cmath>

#include "analysis_document.hpp"
#include "json_writer.hpp"
#include "number_format.hpp"
#include "report.hpp"
#include "screen_document.hpp"

namespace tallyproof {
namespace {

std::string pad(const std::string& s, std::size_t width) {
    std::size_t cps = 0;
    for (unsigned char c : s) cps += (c & 0xC0) != 0x80;
    return cps >= width ? s + " " : s + std::string(width - cps, ' ');
}

std::string percent(double q) { return format_plain(100 * q) + "%"; }

// Flagged groups by q-value (then input order).
std::vector<std::size_t> flagged_order(const ScreenResult& s) {
    std::vector<std::size_t> at;
    for (std::size_t g = 0; g < s.groups.size(); ++g)
        if (s.groups[g].flagged) at.push_back(g);
    std::stable_sort(at.begin(), at.end(), [&](std::size_t a, std::size_t b) { return s.groups[a].q.log10_p < s.groups[b].q.log10_p; });
    return at;
}

std::string drivers_text(const GroupRow& g) {
    std::string t;
    for (const auto& d : g.drivers) t += (t.empty() ? "" : "; ") + d.category + ": " + d.direction;
    return t;
}

}  // namespace

std::string screen_level_phrase(const ScreenChoice& c) {
    switch (c.adjust) {
        case MultiplicityMethod::benjamini_hochberg: return "a false discovery rate of " + percent(c.q);
        case MultiplicityMethod::holm: return "a family-wise error rate of " + percent(c.q) + " (Holm)";
        case MultiplicityMethod::bonferroni: return "a family-wise error rate of " + percent(c.q) + " (Bonferroni)";
        case MultiplicityMethod::none: return "an unadjusted level of " + percent(c.q);
    }
    return "";
}

std::string screen_summary(const ScreenResult& s) {
    const std::size_t total = s.groups.size();
    std::string t = std::to_string(s.flagged) + " of " + std::to_string(total) + " groups " +
                    (s.flagged == 1 ? "departs" : "depart") + " from " + s.model_description + " at " + screen_level_phrase(s.choice);
    if (s.tested < total) t += " (" + std::to_string(total - s.tested) + " not tested)";
    const std::vector<std::size_t> at = flagged_order(s);
    if (at.empty()) return t + ".";
    t += ": ";
    for (std::size_t i = 0; i < at.size() && i < 10; ++i)
        t += (i ? ", " : "") + s.groups[at[i]].name + " (q = " + format_probability(s.groups[at[i]].q) + ")";
    if (at.size() > 10) t += " and " + std::to_string(at.size() - 10) + " more";
    return t + ".";
}

std::string screen_report_text(const ScreenResult& s) {
    std::string t = "Screen of " + std::to_string(s.groups.size()) + " groups against " + s.model_description + " (" +
                    s.statistic_symbol + ", " + (s.choice.against == ScreenAgainst::rest ? "each group against the other groups pooled, "
                                                                                        : "each group against the model, ") +
                    "adjusted by " + multiplicity_method_name(s.choice.adjust) + ", flagged at q <= " + format_plain(s.choice.q) + ")\n";
    t += screen_summary(s) + "\n\n";
    const bool mad = std::any_of(s.groups.begin(), s.groups.end(), [](const GroupRow& g) { return g.digits; });
    std::size_t width = 5;
    for (const auto& g : s.groups) width = std::max(width, std::min<std::size_t>(g.name.size() + 1, 30));
    t += pad("group", width) + pad("N", 9) + pad(s.statistic_symbol, 10) + pad("df", 5) + pad("p", 14) + pad("q", 14) + pad("w", 7) +
         (mad ? pad("MAD", 8) : "") + "flag\n";
    for (const auto& g : s.groups) {
        t += pad(g.name, width) + pad(format_count(g.n), 9);
        if (!g.tested) { t += g.note + "\n"; continue; }
        t += pad(format_fixed(g.statistic, 2), 10) + pad(format_plain(g.df), 5) + pad(format_probability(g.p), 14) +
             pad(format_probability(g.q), 14) + pad(format_fixed(g.w, 3), 7) + (mad ? pad(g.digits ? format_fixed(g.mad, 4) : "", 8) : "") +
             (g.flagged ? "FLAGGED" : "") + (g.thin ? std::string(g.flagged ? ", " : "") + g.note : "");
        if (g.flagged && !g.drivers.empty()) t += " (" + drivers_text(g) + ")";
        t += "\n";
    }
    if (!s.notes.empty()) t += "\n";
    for (const auto& n : s.notes) t += "Note: " + n + "\n";
    t += "\n";
    for (const auto& c : s.cautions) t += "Caution: " + c + "\n";
    return t;
}

std::string screen_writeup(const ScreenResult& s) {
    std::string t = screen_summary(s) + "\n";
    t += "Each of the " + std::to_string(s.tested) + " tested groups was compared with " + s.model_description + " by a " +
         s.statistic_symbol + " test";
    if (s.choice.against == ScreenAgainst::rest) t += " of homogeneity (the group against all other groups pooled)";
    t += "; the p-values were adjusted for testing many groups (" + std::string(multiplicity_method_name(s.choice.adjust)) + ").";
    if (s.thin > 0) t += " " + std::to_string(s.thin) + " thin groups " + (s.choice.against == ScreenAgainst::model ? "were given exact or Monte Carlo p-values." : "are marked thin.");
    t += "\n";
    for (const std::size_t g : flagged_order(s))
        if (!s.groups[g].drivers.empty()) t += s.groups[g].name + ": " + drivers_text(s.groups[g]) + ".\n";
    for (const auto& c : s.cautions) t += c + "\n";
    return t;
}

std::string screen_print_text(const ScreenResult& s, std::size_t max_listed) {
    std::string t = "Screen of " + std::to_string(s.groups.size()) + " groups against " + s.model_description + " (" +
                    s.statistic_symbol + ", adjusted by " + multiplicity_method_name(s.choice.adjust) + ", flagged at q <= " +
                    format_plain(s.choice.q) + ")\n" + screen_summary(s) + "\n\n";
    const std::vector<std::size_t> flagged = flagged_order(s);
    if (flagged.empty()) t += "No group was flagged.\n";
    else t += "Flagged groups, smallest q first:\n";
    for (std::size_t i = 0; i < flagged.size() && i < max_listed; ++i) {
        const GroupRow& g = s.groups[flagged[i]];
        t += "  " + g.name + ": N = " + format_count(g.n) + ", q = " + format_probability(g.q) + ", w = " + format_fixed(g.w, 3);
        if (!g.drivers.empty()) t += "; driven by " + drivers_text(g);
        if (g.thin) t += " (" + g.note + ")";
        t += "\n";
    }
    if (flagged.size() > max_listed)
        t += "  ... and " + std::to_string(flagged.size() - max_listed) +
             " more flagged groups: every group is in the table (Download CSV/TSV or the analysis file).\n";
    t += "\n";
    for (const auto& c : s.cautions) t += "Caution: " + c + "\n";
    return t;
}

std::vector<std::vector<TableCell>> group_rows(const ScreenResult& s) {
    std::vector<std::vector<TableCell>> rows;
    rows.push_back({text_cell("group"), text_cell("n"), text_cell("statistic"), text_cell("df"), text_cell("p_value"),
                    text_cell("q_value"), text_cell("w"), text_cell("mad"), text_cell("mad_band"), text_cell("flagged"),
                    text_cell("thin"), text_cell("method"), text_cell("drivers"), text_cell("note")});
    const double na = std::nan("");
    for (const auto& g : s.groups) {
        rows.push_back({text_cell(g.name), count_cell(g.n), number_cell(g.tested ? g.statistic : na),
                        number_cell(g.tested ? g.df : na), g.tested ? probability_cell(g.p) : number_cell(na),
                        g.tested ? probability_cell(g.q) : number_cell(na), number_cell(g.tested ? g.w : na),
                        number_cell(g.digits ? g.mad : na), text_cell(g.band), text_cell(g.flagged ? "yes" : "no"),
                        text_cell(g.thin ? "yes" : "no"), text_cell(g.tested ? pvalue_method_name(g.method) : ""),
                        text_cell(drivers_text(g)), text_cell(g.note)});
    }
    return rows;
}

std::string group_table(const ScreenResult& s, const TableExportOptions& o) { return write_table(group_rows(s), o); }

namespace {
// One group's object of the result document's "groups" list.
void write_group_row(JsonWriter& j, const GroupedCounts& counts, const ScreenResult& s, std::size_t gi) {
    const std::size_t k = s.categories.size();
    const double na = std::nan("");
    const GroupRow& g = s.groups[gi];
    j.begin_object();
    j.key("name").value(g.name);
    if (counts.counts.size() == s.groups.size() * k)
        j.key("observed").numbers(std::vector<double>(counts.counts.begin() + static_cast<std::ptrdiff_t>(gi * k),
                                                      counts.counts.begin() + static_cast<std::ptrdiff_t>((gi + 1) * k)));
    j.key("n").value(g.n);
    j.key("tested").value(g.tested);
    j.key("statistic").value(g.tested ? g.statistic : na);
    j.key("df").value(g.tested ? g.df : na);
    j.key("method").value(g.tested ? pvalue_method_name(g.method) : "");
    j.key("p_value").value(g.tested ? g.p.p : na);
    j.key("log10_p_value").value(g.tested ? g.p.log10_p : na);
    j.key("q_value").value(g.tested ? g.q.p : na);
    j.key("log10_q_value").value(g.tested ? g.q.log10_p : na);
    j.key("w").value(g.tested ? g.w : na);  // chance-corrected, as effect_size.w of a single analysis
    j.key("cohen_w").value(g.tested ? g.cohen_w : na);
    if (g.digits) j.key("mad").value(g.mad).key("mad_band").value(g.band);
    else j.key("mad").null();
    j.key("thin").value(g.thin);
    j.key("flagged").value(g.flagged);
    j.key("drivers").begin_array();
    for (const auto& d : g.drivers)
        j.begin_object().key("category").value(d.category).key("direction").value(d.direction)
            .key("observed").value(d.observed).key("expected").value(d.expected)
            .key("adjusted_residual").value(d.adjusted_residual).end_object();
    j.end_array();
    if (!g.note.empty()) j.key("note").value(g.note);
    if (g.line > 0) j.key("line").value(static_cast<double>(g.line));
    j.end_object();
}
}  // namespace

std::string screen_group_rows_json(const GroupedCounts& counts, const ScreenResult& s, const std::vector<std::size_t>& groups) {
    JsonWriter j;
    j.begin_array();
    for (const std::size_t gi : groups)
        if (gi < s.groups.size()) write_group_row(j, counts, s, gi);
    j.end_array();
    return j.str();
}

std::string screen_json(const Analysis& base, const GroupedCounts& counts, const ScreenResult& s, const ScreenView* view, bool list_groups) {
    JsonWriter j;
    if (!begin_result_document(j, s.status)) {
        j.end_object();
        return j.str();
    }
    j.key("categories").strings(s.categories);
    if (!counts.group_column_name.empty()) j.key("by").value(counts.group_column_name);
    // The settings as the analysis document writes them, so the result reads back as the same screen.
    Analysis settings = base;
    settings.conformity = ConformityChoice{};
    settings.plan = PlanChoice{};
    write_analysis_settings(j, settings, s.model_description);
    j.key("statistic_symbol").value(s.statistic_symbol);
    j.key("lambda").value(base.statistic.lambda);
    begin_screen_settings(j, counts, s.choice, view ? *view : ScreenView{});
    j.key("groups").value(static_cast<double>(s.groups.size()))
        .key("tested").value(static_cast<double>(s.tested))
        .key("flagged").value(static_cast<double>(s.flagged))
        .key("thin").value(static_cast<double>(s.thin))
        .key("summary").value(screen_summary(s));
    if (!list_groups) j.key("groups_listed").value(false);
    j.end_object();
    j.key("groups").begin_array();
    if (list_groups)
        for (std::size_t gi = 0; gi < s.groups.size(); ++gi) write_group_row(j, counts, s, gi);
    j.end_array();
    j.key("notes").strings(s.notes);
    j.key("reading_notes").strings(counts.notes);
    j.key("cautions").strings(s.cautions);
    j.end_object();
    return j.str();
}

}  // namespace tallyproof
