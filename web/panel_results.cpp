// Result panels: the verdict (statistic, df, p written sensibly at every size, decision in
// plain words, effect size, method, progress of long work), validity with one-click remedies,
// the per-category table, planning and the write-up to paste.
#include <imgui.h>
#include <imgui_stdlib.h>

#include <algorithm>
#include <cmath>
#include <iterator>
#include <string>
#include <vector>

#include "density_plot.hpp"
#include "exact_bracket_text.hpp"
#include "number_format.hpp"
#include "page_bridge.hpp"
#include "panels.hpp"
#include "power_analysis.hpp"
#include "report.hpp"
#include "table_export.hpp"
#include "writeup.hpp"

namespace tallyproof::web {
namespace {

const double kWMin = 0.02, kWMax = 1.0, kPowerMin = 0.5, kPowerMax = 0.99;

std::string p_line(const TailProbability& p) {
    std::string s = "p " + format_p_report(p);
    if (p.p < 0.001) s += "  (" + format_probability(p) + ")";
    return s;
}

// The headline answers the goal chosen: the conformity p when the goal is conformity (the
// departure test's p then follows in the details line), else the departure test's.
bool conformity_leads(const Result& r) { return r.conformity && r.conformity->status.ok; }

}  // namespace

void draw_verdict_panel(AppState& s, const Theme& t) {
    const Result& r = s.result;
    if (!r.status.ok) {
        wrapped_text(r.status.message.c_str());
        return;
    }
    ImGui::PushFont(t.heading);
    const bool conformity = conformity_leads(r);
    const CurveTest shown = curve_test(r);  // for survey data, the design-corrected test the verdict rests on
    const std::string statistic = shown.symbol + " = " + format_fixed(shown.statistic, 2);
    const std::string p = conformity ? "conformity " + p_line(r.conformity->p_value)
                          : exact_bracket_is_wide(r) ? headline_p_text(r)  // a wide exact bracket: its upper end
                                                     : p_line(r.p);
    ImGui::TextUnformatted(statistic.c_str());
    explain_item("verdict statistic", statistic);
    if (ImGui::GetItemRectMax().x + 18 + ImGui::CalcTextSize(p.c_str()).x <= ImGui::GetWindowPos().x + ImGui::GetWindowContentRegionMax().x)
        ImGui::SameLine(0, 18);
    ImGui::TextUnformatted(p.c_str());
    explain_item("verdict p", p);
    ImGui::PopFont();
    explained_text("verdict details", "df = " + (shown.df == std::floor(shown.df) ? format_count(shown.df) : format_significant(shown.df, 4)) + "   ·   N = " + format_count(r.n) + "   ·   " + r.statistic_name +
                                          (conformity ? "   ·   departure test, second: " + p_line(r.p) + " (" + method_phrase(r) + ")"
                                                      : "   ·   p-value: " + method_phrase(r)));
    explained_text("critical value", "Critical value at α = " + format_plain(r.alpha) + ": " + format_fixed(conformity ? r.critical_value : shown.critical, 3));
    if (r.method != PValueMethod::asymptotic) {
        const std::string asymptotic = "asymptotic p = " + format_probability(r.upper);
        flow_next(ImGui::CalcTextSize(asymptotic.c_str()).x + 9);
        ImGui::PushStyleColor(ImGuiCol_Text, ImGui::GetStyleColorVec4(ImGuiCol_TextDisabled));
        explained_text("asymptotic p", asymptotic);
        ImGui::PopStyleColor();
    }
    ImGui::PushFont(t.strong);
    const bool good = conformity ? r.conformity->conforms : !r.reject;
    coloured_text(good ? t.accent : t.warn_ink, headline_verdict(r).c_str());  // the goal's answer leads
    ImGui::PopFont();
    if (!r.model_suggestion.empty()) wrapped_text(r.model_suggestion.c_str());
    if (r.conformity && !r.conformity->status.ok) coloured_text(t.warn_ink, conformity_verdict(r).c_str());
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.muted));
    if (r.conformity && r.conformity->status.ok) {
        const ConformityResult& c = *r.conformity;
        explained_text("conformity rule", "Conformity is shown when " + r.statistic_symbol + " is below " + format_fixed(c.critical_value, 3) +
                                              ", the α quantile of the noncentral chi-square with df " + format_count(c.df) +
                                              " and noncentrality N·w0² = " + format_significant(c.noncentrality, 4) +
                                              ". Departure test: " + verdict_sentence(r));
        if (c.plan.computed)
            explained_text("conformity plan", "To show conformity within w0 = " + format_fixed(c.margin_w, 2) + " with power " +
                                                  format_fixed(c.plan.target_power, 2) + " when the mix is exactly as stated: N = " +
                                                  format_count(c.plan.n_required) + ".");
    }
    ImGui::PopStyleColor();
    // One w leads (corrected for chance); Cohen's uncorrected w follows, named as such.
    std::string effect = "Effect size w = " + format_fixed(r.effect.estimate, 3) + " (" + r.effect.label + ", corrected for chance)";
    if (std::isfinite(r.effect.w_interval.lower))
        effect += ", 95% CI " + format_fixed(r.effect.w_interval.lower, 3) + " to " + format_fixed(r.effect.w_interval.upper, 3);
    if (r.effect.fei_defined) effect += ";  Fei (w rescaled to run from 0 to 1 for these expected shares) = " + format_fixed(r.effect.fei, 3);
    explained_text("effect sizes", effect);
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.muted));
    explained_text("uncorrected w", "Cohen's w before the correction, √(" + r.statistic_symbol + "/N) = " + format_fixed(r.effect.w, 3) +
                                        ";  lower-tail p = " + format_probability(r.exact_lower_computed ? r.exact_lower : r.lower) +
                                        (r.exact_lower_computed ? " (exact)" : " (asymptotic)"));
    if (r.df_range.shown && r.estimated_parameters > 0) wrapped_text(r.df_range.note.c_str());
    if (r.exact.computed) wrapped_text((r.exact.bracketed ? exact_bracket_sentence(r) : "Exact p-value, error bound " + format_significant(r.exact.error_bound, 2) + ".").c_str());
    if (r.monte_carlo.computed)
        explained_text("monte carlo counts", "Monte Carlo: " + format_grouped(r.monte_carlo.hits) + " of " +
                                                 format_grouped(r.monte_carlo.replicates) +
                                                 " replicates at least as extreme; standard error " +
                                                 format_significant(r.monte_carlo.standard_error, 2) + ".");
    ImGui::PopStyleColor();

    draw_reading_progress(s, t);
    if (s.work.running) {
        const char* what = s.analysis.pvalue.method == PValueMethod::exact ? "Exact p-value" : "Monte Carlo p-value";
        char label[96];
        std::snprintf(label, sizeof label, "%s: %.0f%%", what, 100 * job_fraction(s));
        ImGui::PushStyleColor(ImGuiCol_PlotHistogram, ImGui::ColorConvertU32ToFloat4(t.progress));
        ImGui::ProgressBar(static_cast<float>(job_fraction(s)), ImVec2(std::min(360.0f, ImGui::GetContentRegionAvail().x - 90), 0), label);
        ImGui::PopStyleColor();
        ImGui::SameLine();
        if (ImGui::Button("Cancel")) cancel_job(s); mark_widget("Cancel");
    }
}

// A long text being read (in slices): its progress and a way to stop; the counts on screen are
// the ones before it until it is read. Drawn above the results and above the Groups view.
void draw_reading_progress(AppState& s, const Theme& t) {
    if (!reading_running(s)) return;
    char label[160];
    if (s.streaming.running)  // a file read in chunks: how far into it, in MB
        std::snprintf(label, sizeof label, "Reading %.60s: %.0f%% (%.1f of %.1f MB)", s.streaming.file.c_str(), 100 * job_fraction(s),
                      job_fraction(s) * s.streaming.size / (1u << 20), s.streaming.size / (1u << 20));
    else
        std::snprintf(label, sizeof label, "Reading the new data: %.0f%%", 100 * job_fraction(s));
    ImGui::PushStyleColor(ImGuiCol_PlotHistogram, ImGui::ColorConvertU32ToFloat4(t.progress));
    ImGui::ProgressBar(static_cast<float>(job_fraction(s)), ImVec2(std::min(360.0f, ImGui::GetContentRegionAvail().x - 90), 0), label);
    ImGui::PopStyleColor();
    ImGui::SameLine();
    if (ImGui::Button("Cancel##reading")) cancel_paste_job(s);  // a file read in chunks too
    mark_widget("Cancel reading");
}

void draw_validity_panel(AppState& s, const Theme& t) {
    const Result& r = s.result;
    if (!r.status.ok) return;
    const bool ok = r.validity.all_at_least_5;
    const bool acceptable = ok || r.validity.cochran_holds;  // Cochran's rule: adequate, with a note
    const bool exact_or_mc = r.method != PValueMethod::asymptotic;
    ImGui::PushStyleColor(ImGuiCol_ChildBg, ImGui::ColorConvertU32ToFloat4(acceptable || exact_or_mc ? t.ok_bg : t.warn_bg));
    const ImU32 ink = acceptable || exact_or_mc ? t.ok_ink : t.warn_ink;
    std::string head = (acceptable ? "✓ " : "⚠ ") + r.validity.summary;
    if (!ok && exact_or_mc) head = "✓ " + std::string(r.method == PValueMethod::exact ? "Exact" : "Monte Carlo") +
                                   " p-value: it does not rely on the large-sample approximation. " + r.validity.summary;
    const bool buttons = !ok || r.merged;
    const float wrap = ImGui::GetContentRegionAvail().x - 2 * ImGui::GetStyle().WindowPadding.x;
    float h = ImGui::CalcTextSize(head.c_str(), nullptr, false, wrap).y + 2 * ImGui::GetStyle().WindowPadding.y + 4;
    if (r.merged) h += ImGui::CalcTextSize(r.merge_note.c_str(), nullptr, false, wrap).y + ImGui::GetStyle().ItemSpacing.y;
    if (buttons) {  // the remedy buttons, wrapped onto as many lines as the width needs
        float row = 0;
        int lines = 1;
        const float pad = 2 * ImGui::GetStyle().FramePadding.x, gap = ImGui::GetStyle().ItemSpacing.x;
        std::vector<const char*> shown;
        if (!ok && s.analysis.merge.rule == MergeRule::none) shown.push_back("Merge thin categories");
        if (!s.merge_undo.empty()) shown.push_back("Undo merge");
        if (!ok && r.method == PValueMethod::asymptotic) { shown.push_back("Use the exact p-value"); shown.push_back("Use a Monte Carlo p-value"); }
        for (const char* b : shown) {
            const float w = ImGui::CalcTextSize(b).x + pad;
            if (row > 0 && row + gap + w > wrap) { ++lines; row = w; }
            else row += (row > 0 ? gap : 0) + w;
        }
        h += ImGui::GetFrameHeightWithSpacing() * static_cast<float>(lines);
    }
    ImGui::BeginChild("validity", ImVec2(0, h), true, ImGuiWindowFlags_NoScrollbar);
    coloured_text(ink, head.c_str());
    if (r.merged) {
        coloured_text(ink, r.merge_note.c_str());
    }
    if (buttons) {
        if (!ok && s.analysis.merge.rule == MergeRule::none) {
            if (ImGui::Button("Merge thin categories")) merge_thin_cells(s, r.validity.cochran_holds ? MergeRule::all_at_least_5 : MergeRule::cochran); mark_widget("Merge thin categories");
            if (ImGui::IsItemHovered()) ImGui::SetTooltip("Joins categories with small expected counts (decided on expected counts only)");
            flow_next(ImGui::CalcTextSize("Undo merge").x + 2 * ImGui::GetStyle().FramePadding.x);
        }
        if (!s.merge_undo.empty()) {
            if (ImGui::Button("Undo merge")) undo_merge(s); mark_widget("Undo merge");
            flow_next(ImGui::CalcTextSize("Use the exact p-value").x + 2 * ImGui::GetStyle().FramePadding.x);
        }
        if (!ok && r.method == PValueMethod::asymptotic) {
            if (ImGui::Button("Use the exact p-value")) set_pvalue_method(s, PValueMethod::exact); mark_widget("Use the exact p-value");
            flow_next(ImGui::CalcTextSize("Use a Monte Carlo p-value").x + 2 * ImGui::GetStyle().FramePadding.x);
            if (ImGui::Button("Use a Monte Carlo p-value")) set_pvalue_method(s, PValueMethod::monte_carlo); mark_widget("Use a Monte Carlo p-value");
        }
    }
    ImGui::EndChild();
    ImGui::PopStyleColor();
}

void draw_categories_table(AppState& s, const Theme& t) {
    const Result& r = s.result;
    const auto& cats = r.diagnostics.categories;
    if (cats.empty()) { muted_wrapped(t, "No per-category diagnostics for this analysis."); return; }
    coloured_text(r.diagnostics.drivers.empty() ? t.muted : t.ink, r.diagnostics.summary.c_str());
    // Too narrow for eight columns (a phone): each column keeps the width of its contents and the
    // table scrolls sideways under a finger, the category column staying in view.
    const bool narrow = ImGui::GetContentRegionAvail().x < 36 * ImGui::GetFontSize();
    const ImGuiTableFlags flags = ImGuiTableFlags_RowBg | ImGuiTableFlags_BordersInnerH | ImGuiTableFlags_BordersOuter |
                                  ImGuiTableFlags_ScrollY | ImGuiTableFlags_Sortable | ImGuiTableFlags_Resizable |
                                  (narrow ? ImGuiTableFlags_ScrollX | ImGuiTableFlags_SizingFixedFit : ImGuiTableFlags_SizingStretchProp);
    const char* heads[] = {"Category", "O", "E", "O − E", "χ² share", "Adj. res.", "Holm p", "Direction"};
    const float weights[] = {1.8f, 0.8f, 0.9f, 0.9f, 1.1f, 1.1f, 1.1f, 1.9f};  // the heads "χ² share" and "Adj. res." stay whole
    constexpr int columns = static_cast<int>(std::size(heads));
    static_assert(std::size(weights) == std::size(heads), "one weight per column");
    if (!ImGui::BeginTable("diagnostics", columns, flags, ImVec2(0, ImGui::GetContentRegionAvail().y))) return;
    ImGui::TableSetupScrollFreeze(1, 1);
    for (int c = 0; c < columns; ++c)
        ImGui::TableSetupColumn(heads[c], c == 0 ? ImGuiTableColumnFlags_DefaultSort : 0, narrow ? 0.0f : weights[c]);
    // The header row drawn cell by cell: each short head explains itself on hover or tap.
    ImGui::TableNextRow(ImGuiTableRowFlags_Headers);
    for (int c = 0; c < columns; ++c) {
        if (!ImGui::TableSetColumnIndex(c)) continue;
        ImGui::TableHeader(heads[c]);
        explain_item((std::string("head ") + heads[c]).c_str(), heads[c]);
    }
    std::vector<int> order(cats.size());
    for (std::size_t i = 0; i < order.size(); ++i) order[i] = static_cast<int>(i);
    if (ImGuiTableSortSpecs* spec = ImGui::TableGetSortSpecs(); spec && spec->SpecsCount > 0) {
        const int col = spec->Specs[0].ColumnIndex;
        const bool asc = spec->Specs[0].SortDirection == ImGuiSortDirection_Ascending;
        auto key = [&](int i) -> double {
            const auto& d = cats[i];
            switch (col) {
                case 1: return d.observed;
                case 2: return d.expected;
                case 3: return d.difference;
                case 4: return d.contribution_share;
                case 5: return d.adjusted_residual;
                case 6: return d.adjusted.log10_p;
                default: return i;
            }
        };
        std::stable_sort(order.begin(), order.end(), [&](int a, int b) {
            if (col == 7) return asc ? cats[a].direction < cats[b].direction : cats[a].direction > cats[b].direction;
            return asc ? key(a) < key(b) : key(a) > key(b);
        });
    }
    for (int i : order) {
        const auto& d = cats[i];
        ImGui::TableNextRow();
        ImGui::TableNextColumn();
        if (d.drives_result) ImGui::PushFont(t.strong);
        ImGui::TextUnformatted(d.label.c_str());
        if (d.drives_result) ImGui::PopFont();
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(format_count(d.observed).c_str());
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(format_fixed(d.expected, 2).c_str());
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(format_fixed(d.difference, 2).c_str());
        ImGui::TableNextColumn();
        ImGui::Text("%s%%", format_fixed(100 * d.contribution_share, 1).c_str());
        ImGui::TableNextColumn();
        ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(residual_colour(t, d.adjusted_residual)));
        ImGui::TextUnformatted(format_fixed(d.adjusted_residual, 2).c_str());
        ImGui::PopStyleColor();
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(format_probability(d.adjusted).c_str());
        ImGui::TableNextColumn();
        const std::string direction = d.drives_result ? "◆ " + d.direction : d.direction;
        ImGui::TextUnformatted(direction.c_str());
        if (d.drives_result) explain_item(("direction " + std::to_string(i + 1)).c_str(), direction);
        else if (i == 0) mark_widget("direction 1");
    }
    ImGui::EndTable();
}

void draw_planning_panel(AppState& s, const Theme& t) {
    const Result& r = s.result;
    section_title("How large a sample do I need? (items to inspect, complaints, survey replies)", t);
    muted_wrapped(t, "Power is the chance the test detects a departure of size w (Cohen's w: 0.1 small, 0.3 medium, 0.5 large) "
                     "at α = %s with df = %s.", format_plain(r.alpha).c_str(), format_count(r.df).c_str());
    if (s.view.plan_n <= 0) s.view.plan_n = r.n;
    ImGui::SetNextItemWidth(140);
    ImGui::SliderScalar("effect size w", ImGuiDataType_Double, &s.view.plan_w, &kWMin, &kWMax, "%.3f");
    ImGui::SetNextItemWidth(140);
    number_field("##plan-n", &s.view.plan_n, "%.0f", FieldKeys::whole);
    ImGui::SameLine(0, ImGui::GetStyle().ItemInnerSpacing.x);
    ImGui::TextUnformatted("sample size N");
    ImGui::SetNextItemWidth(140);
    ImGui::SliderScalar("target power", ImGuiDataType_Double, &s.view.plan_target, &kPowerMin, &kPowerMax, "%.2f");
    const double power = gof_power(s.view.plan_w, std::max(1.0, s.view.plan_n), r.alpha, r.df);
    double need = NAN;
    const Status st = gof_sample_size(s.view.plan_w, s.view.plan_target, r.alpha, r.df, &need);
    ImGui::Spacing();
    ImGui::PushFont(t.strong);
    ImGui::Text("Power at N = %s: %s", format_count(std::max(1.0, s.view.plan_n)).c_str(), format_fixed(power, 3).c_str());
    if (st.ok) ImGui::Text("N needed for power %s: %s", format_fixed(s.view.plan_target, 2).c_str(), format_count(need).c_str());
    else wrapped_text(st.message.c_str());
    ImGui::PopFont();
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.muted));
    explained_text("planning observed w", "This analysis observed Cohen's w = " + format_fixed(r.effect.w, 3) + " (before the correction for chance) with N = " +
                                              format_count(r.n) + ".");
    ImGui::PopStyleColor();
    if (ImGui::Button("Use the observed N")) s.view.plan_n = r.n;
}

void draw_writeup_panel(AppState& s, const Theme& t) {
    muted_wrapped(t, "Ready to paste into a report, an email or a spreadsheet.");
    ImGui::RadioButton("Plain text", &s.handover.writeup_style, 0);
    mark_widget("Plain text");
    flow_next(radio_width("Markdown"));
    ImGui::RadioButton("Markdown", &s.handover.writeup_style, 1);
    mark_widget("Markdown");
    flow_next(radio_width("Spreadsheet (TSV)"));
    ImGui::RadioButton("Spreadsheet (TSV)", &s.handover.writeup_style, 2);
    explain_item("Spreadsheet (TSV)", "Spreadsheet (TSV)");
    flow_next(radio_width("decimal comma"));
    ImGui::Checkbox("decimal comma", &s.handover.decimal_comma);
    mark_widget("decimal comma");
    WriteupOptions o;
    o.style = static_cast<WriteupStyle>(s.handover.writeup_style);
    o.decimal_comma = s.handover.decimal_comma;
    std::string block = writeup(s.analysis, s.result, o);
    const float pad = 2 * ImGui::GetStyle().FramePadding.x;
    if (ImGui::Button("Copy sentence")) copy_writeup(s, true);
    mark_widget("Copy sentence");
    flow_next(ImGui::CalcTextSize("Copy block").x + pad);
    if (ImGui::Button("Copy block")) copy_writeup(s, false);
    mark_widget("Copy block");
    flow_next(ImGui::CalcTextSize("Copy table (TSV)").x + pad);
    if (ImGui::Button("Copy table (TSV)")) copy_table(s);
    explain_item("Copy table", "Copy table (TSV)");
    flow_next(ImGui::CalcTextSize("Copy full report").x + pad);
    if (ImGui::Button("Copy full report")) copy_text(s.report);
    mark_widget("Copy full report");
    if (o.style == WriteupStyle::tsv) {
        ImGui::InputTextMultiline("##writeup", &block, ImGui::GetContentRegionAvail(), ImGuiInputTextFlags_ReadOnly);
    } else {
        ImGui::BeginChild("writeup-text", ImGui::GetContentRegionAvail(), true);
        wrapped_text(block.c_str());
        ImGui::EndChild();
    }
}

}  // namespace tallyproof::web
