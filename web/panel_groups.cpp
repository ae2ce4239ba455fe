// The Groups view: the screen's summary and settings, a table of every group sortable by each
// column (a row opens that group's full analysis), and the funnel chart: each group a point at
// its size N and effect size w, flagged groups marked, with the curve of the w a group of that N
// needs to be flagged. Tapping or hovering a point names the group; clicking it opens it.
#include <imgui.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

#include "axis_ticks.hpp"
#include "chart_frame.hpp"
#include "number_format.hpp"
#include "page_bridge.hpp"
#include "panels.hpp"
#include "screen_report.hpp"

namespace tallyproof::web {
namespace {

const char* adjust_label(MultiplicityMethod m) {
    switch (m) {
        case MultiplicityMethod::benjamini_hochberg: return "BH (false discovery rate)";
        case MultiplicityMethod::holm: return "Holm";
        case MultiplicityMethod::bonferroni: return "Bonferroni";
        case MultiplicityMethod::none: return "none";
    }
    return "";
}

void draw_screen_settings(AppState& s, const Theme& t) {
    ScreenChoice c = s.groups.choice;
    bool changed = false;
    ImGui::AlignTextToFramePadding();
    ImGui::TextUnformatted("Each group against");
    flow_next(radio_width("the expected mix"));
    int against = c.against == ScreenAgainst::rest ? 1 : 0;
    changed |= ImGui::RadioButton("the expected mix", &against, 0);
    mark_widget("against the model");
    flow_next(radio_width("the other groups pooled"));
    changed |= ImGui::RadioButton("the other groups pooled", &against, 1);
    mark_widget("against the rest");
    c.against = against == 1 ? ScreenAgainst::rest : ScreenAgainst::model;
    ImGui::AlignTextToFramePadding();
    ImGui::TextUnformatted("Adjusted by");
    ImGui::SameLine();
    ImGui::SetNextItemWidth(std::min(240.0f, ImGui::GetContentRegionAvail().x - 8));
    const bool open = ImGui::BeginCombo("##adjust", adjust_label(c.adjust));
    explain_item("adjustment", adjust_label(c.adjust));
    if (open) {
        begin_menu_items(t);
        for (MultiplicityMethod m : {MultiplicityMethod::benjamini_hochberg, MultiplicityMethod::holm, MultiplicityMethod::bonferroni,
                                     MultiplicityMethod::none}) {
            if (ImGui::Selectable(adjust_label(m), m == c.adjust) && m != c.adjust) { c.adjust = m; changed = true; }
            explain_item(adjust_label(m), adjust_label(m));
        }
        end_menu_items(t);
        ImGui::EndCombo();
    }
    flow_next(ImGui::CalcTextSize("flag at q ≤").x + 90 + ImGui::GetStyle().ItemSpacing.x);  // wraps on a phone
    ImGui::AlignTextToFramePadding();
    ImGui::TextUnformatted("flag at q ≤");
    explain_item("q label", "flag at q ≤");
    ImGui::SameLine();
    double q = c.q;
    ImGui::SetNextItemWidth(90);
    if (number_field("##screen-q", &q, "%g")) { c.q = q; changed = true; }
    mark_widget("screen q");
    if (changed) set_screen_choice(s, c);
}

const char* kHeads[] = {"Group", "N", "χ²", "df", "p", "q", "w", "Flag"};
const GroupColumn kColumns[] = {GroupColumn::name, GroupColumn::n, GroupColumn::statistic, GroupColumn::df,
                                GroupColumn::p, GroupColumn::q, GroupColumn::w, GroupColumn::flag};

void draw_groups_table(AppState& s, const Theme& t, ImVec2 size) {
    GroupsView& v = s.groups;
    const auto& rows = v.result.groups;
    const bool narrow = size.x < 40 * ImGui::GetFontSize();
    const ImGuiTableFlags flags = ImGuiTableFlags_RowBg | ImGuiTableFlags_BordersInnerH | ImGuiTableFlags_BordersOuter |
                                  ImGuiTableFlags_ScrollY | ImGuiTableFlags_Sortable | ImGuiTableFlags_Resizable |
                                  (narrow ? ImGuiTableFlags_ScrollX | ImGuiTableFlags_SizingFixedFit : ImGuiTableFlags_SizingStretchProp);
    constexpr int columns = static_cast<int>(std::size(kHeads));
    const float weights[] = {1.6f, 0.8f, 0.9f, 0.5f, 1.0f, 1.0f, 0.7f, 2.6f};
    static_assert(std::size(weights) == std::size(kHeads), "one weight per column");
    if (!ImGui::BeginTable("groups", columns, flags, size)) return;
    ImGui::TableSetupScrollFreeze(1, 1);
    for (int c = 0; c < columns; ++c) {
        ImGuiTableColumnFlags f = c == 5 ? ImGuiTableColumnFlags_DefaultSort : 0;
        ImGui::TableSetupColumn(c == 2 ? v.result.statistic_symbol.c_str() : kHeads[c], f, narrow ? 0.0f : weights[c]);
    }
    ImGui::TableNextRow(ImGuiTableRowFlags_Headers);
    for (int c = 0; c < columns; ++c) {
        if (!ImGui::TableSetColumnIndex(c)) continue;
        const char* head = c == 2 ? v.result.statistic_symbol.c_str() : kHeads[c];
        ImGui::TableHeader(head);
        explain_item((std::string("group head ") + kHeads[c]).c_str(), head);
    }
    if (ImGuiTableSortSpecs* spec = ImGui::TableGetSortSpecs(); spec && spec->SpecsDirty) {
        if (spec->SpecsCount > 0)
            sort_groups(s, kColumns[spec->Specs[0].ColumnIndex], spec->Specs[0].SortDirection == ImGuiSortDirection_Ascending);
        spec->SpecsDirty = false;
    }
    ImGuiListClipper clipper;  // thousands of groups: only the rows in view are laid out
    clipper.Begin(static_cast<int>(v.order.size()));
    while (clipper.Step()) {
        for (int r = clipper.DisplayStart; r < clipper.DisplayEnd; ++r) {
            const int gi = v.order[static_cast<std::size_t>(r)];
            const GroupRow& g = rows[static_cast<std::size_t>(gi)];
            ImGui::TableNextRow();
            ImGui::TableNextColumn();
            ImGui::PushID(gi);
            if (g.flagged) ImGui::PushFont(t.strong);
            // A row is a 44 px tap target on touch screens (the selectable spans the row).
            const float row_h = t.touch ? 44 - 2 * ImGui::GetStyle().CellPadding.y : 0;
            if (ImGui::Selectable(g.name.c_str(), false, ImGuiSelectableFlags_SpanAllColumns | ImGuiSelectableFlags_AllowItemOverlap, ImVec2(0, row_h))) open_group(s, gi);
            if (g.flagged) ImGui::PopFont();
            if (r < 3) mark_widget(("group row " + std::to_string(r + 1)).c_str());
            if (ImGui::IsItemHovered()) ImGui::SetTooltip("Open %s's full analysis", g.name.c_str());
            ImGui::PopID();
            ImGui::TableNextColumn();
            ImGui::TextUnformatted(format_count(g.n).c_str());
            if (!g.tested) {
                ImGui::TableNextColumn();
                ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.muted));
                ImGui::TextUnformatted("not tested");
                ImGui::PopStyleColor();
                for (int c = 3; c < columns - 1; ++c) ImGui::TableNextColumn();
                ImGui::TableNextColumn();
                ImGui::TextUnformatted(g.note.c_str());
                continue;
            }
            ImGui::TableNextColumn();
            ImGui::TextUnformatted(format_fixed(g.statistic, 2).c_str());
            ImGui::TableNextColumn();
            ImGui::TextUnformatted(format_count(g.df).c_str());
            ImGui::TableNextColumn();
            ImGui::TextUnformatted(format_probability(g.p).c_str());
            ImGui::TableNextColumn();
            ImGui::TextUnformatted(format_probability(g.q).c_str());
            ImGui::TableNextColumn();
            ImGui::TextUnformatted(format_fixed(g.w, 3).c_str());
            ImGui::TableNextColumn();
            std::string flag = g.flagged ? "◆ flagged" : "";
            if (g.flagged && !g.drivers.empty()) {
                flag += ": ";
                for (std::size_t d = 0; d < g.drivers.size() && d < 3; ++d)
                    flag += (d ? ", " : "") + g.drivers[d].category + " " + (g.drivers[d].direction.rfind("more", 0) == 0 ? "more" : "fewer");
            }
            if (g.thin) flag += std::string(flag.empty() ? "" : "; ") + (g.method == PValueMethod::asymptotic ? "thin" : "thin: exact or simulated p");
            ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(g.flagged ? t.warn_ink : t.muted));
            ImGui::TextUnformatted(flag.c_str());
            ImGui::PopStyleColor();
        }
    }
    ImGui::EndTable();
}

}  // namespace

// Evidence against size: each group at (N, w) on a log N axis; the funnel curve is the w needed
// at each N for a flag, so points above it are the flagged ones.
void draw_funnel(AppState& s, const Theme& t, ImVec2 size) {
    const GroupsView& v = s.groups;
    ChartFrame f;
    const bool drawn = begin_chart("funnel", "Effect size w against group size N", size, ImVec2(120, 100), t, &f);
    mark_widget("funnel chart");
    if (!drawn) return;
    ImDrawList* dl = f.dl;
    const bool hovered = f.hovered, clicked = f.clicked;
    const float th = f.line;
    set_plot_area(&f, 56, 16, 34 + th, 44);
    const ImVec2 p0 = f.p0, p1 = f.p1;
    double nlo = INFINITY, nhi = 0, wmax = 0;
    for (const GroupRow& g : v.result.groups)
        if (g.tested && g.n > 0) { nlo = std::min(nlo, g.n); nhi = std::max(nhi, g.n); wmax = std::max(wmax, g.w); }
    if (!(nhi > 0)) return;
    if (nhi <= nlo * 1.0001) { nlo /= 1.5; nhi *= 1.5; }
    const double pad = std::pow(nhi / nlo, 0.06);  // a little room either side of the outermost groups
    nlo /= pad;
    nhi *= pad;
    const double lx0 = std::log10(nlo), lx1 = std::log10(nhi);
    const double ytop = nice_ceiling(std::max(0.05, wmax * 1.1));
    auto px = [&](double n) { return static_cast<float>(p0.x + (p1.x - p0.x) * ((std::log10(n) - lx0) / (lx1 - lx0))); };
    auto py = [&](double w) { return static_cast<float>(p1.y - (p1.y - p0.y) * std::min(1.0, w / ytop)); };
    draw_value_grid(f, nice_ticks(0, ytop, std::max(2, static_cast<int>((p1.y - p0.y) / 50))), py, t);
    std::vector<double> xticks;  // 1, 2, 5 per decade; every digit where the range is narrow
    for (const std::vector<double>& steps : {std::vector<double>{1, 2, 5}, std::vector<double>{1, 2, 3, 4, 5, 6, 7, 8, 9}}) {
        xticks.clear();
        for (int e = static_cast<int>(std::floor(lx0)); e <= static_cast<int>(std::ceil(lx1)); ++e)
            for (double m : steps)
                if (const double n = m * std::pow(10.0, e); n >= nlo && n <= nhi) xticks.push_back(n);
        if (xticks.size() >= 3) break;
    }
    if (xticks.size() < 3) xticks = nice_ticks(nlo, nhi, 5);
    draw_x_ticks(f, xticks, px, "group size N (log scale)", t);
    draw_axes(f, true, t);
    if (v.funnel.drawn) {  // the curve leaves the plot at the top where small groups would need w beyond it
        std::vector<ImVec2> line;
        for (std::size_t i = 0; i < v.funnel.n.size(); ++i)
            line.emplace_back(px(v.funnel.n[i]), static_cast<float>(p1.y - (p1.y - p0.y) * (v.funnel.w[i] / ytop)));
        dl->PushClipRect(p0, p1, true);
        dl->AddPolyline(line.data(), static_cast<int>(line.size()), t.warn_ink, 0, 2.0f);
        dl->PopClipRect();
        const std::string lab = "flagged above this line";
        dl->AddText(ImVec2(p1.x - ImGui::CalcTextSize(lab.c_str()).x, p0.y - th - 2), t.warn_ink, lab.c_str());
    }
    int near = -1, marked = 0;
    float best = 14 * 14;  // a finger's reach
    const ImVec2 m = ImGui::GetIO().MousePos;
    for (std::size_t i = 0; i < v.result.groups.size(); ++i) {
        const GroupRow& g = v.result.groups[i];
        if (!g.tested || !(g.n > 0)) continue;
        const ImVec2 c(px(g.n), py(g.w));
        if (g.flagged) {  // squares: flagged (the first few marked, so tests and tools can find them)
            dl->AddRectFilled(ImVec2(c.x - 4.5f, c.y - 4.5f), ImVec2(c.x + 4.5f, c.y + 4.5f), t.warn_ink);
            if (++marked <= 20) mark_area(("funnel point " + g.name).c_str(), c.x - 4.5f, c.y - 4.5f, c.x + 4.5f, c.y + 4.5f);
        }
        else dl->AddCircle(c, 4.0f, t.curve, 12, 1.5f);                                                              // rings: not flagged
        const float d2 = (m.x - c.x) * (m.x - c.x) + (m.y - c.y) * (m.y - c.y);
        if (hovered && d2 < best) { best = d2; near = static_cast<int>(i); }
    }
    if (near >= 0) {
        const GroupRow& g = v.result.groups[static_cast<std::size_t>(near)];
        const std::string tip = g.name + "\nN = " + format_count(g.n) + ", w = " + format_fixed(g.w, 3) + ", q = " + format_probability(g.q) +
                                (g.flagged ? "\nflagged" : "") + "\nclick or tap to open its analysis";
        ImGui::SetTooltip("%s", tip.c_str());
        note_tooltip(tip);
        if (clicked) open_group(s, near);
    }
}


void draw_groups_view(AppState& s, const Theme& t) {
    GroupsView& v = s.groups;
    const ScreenResult& r = v.result;
    draw_reading_progress(s, t);  // new data being read: the screen below stays until it is read
    if (v.screening) {  // testing in slices: progress and a way to stop
        char label[96];
        std::snprintf(label, sizeof label, "Testing %zu groups: %.0f%%", v.counts.groups.size(), 100 * v.job.progress.fraction);
        ImGui::PushStyleColor(ImGuiCol_PlotHistogram, ImGui::ColorConvertU32ToFloat4(t.progress));
        ImGui::ProgressBar(static_cast<float>(v.job.progress.fraction), ImVec2(std::min(360.0f, ImGui::GetContentRegionAvail().x - 90), 0), label);
        ImGui::PopStyleColor();
        ImGui::SameLine();
        if (ImGui::Button("Cancel")) cancel_screen(s);
        mark_widget("Cancel screen");
    } else if (!r.status.ok) {
        wrapped_text(("Not screened: " + r.status.message).c_str());
    } else {
        ImGui::PushFont(t.strong);
        explained_text("screen summary", screen_summary(r));
        ImGui::PopFont();
        std::string how = std::to_string(r.groups.size()) + " groups of " + std::to_string(r.categories.size()) + " categories, read from " +
                          v.counts.group_column_name + " (" + group_shape_name(v.counts.shape) + " table); " + std::to_string(r.thin) +
                          " thin (exact or simulated p where needed)";
        muted_wrapped(t, "%s", how.c_str());
    }
    draw_screen_settings(s, t);
    if (!v.counts.look_alike_groups.empty()) {  // names differing only by case, spaces or invisible characters
        const std::string note = group_look_alike_note(v.counts.groups, v.counts.look_alike_groups);
        ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.warn_ink));
        wrapped_text(note.c_str());
        ImGui::PopStyleColor();
        if (ImGui::Button("Join the look-alike groups")) merge_look_alike_groups(s);
        mark_widget("Join look-alike groups");
    }
    if (!v.text.empty()) {  // the reading: which column names the groups, and the table's shape
        ImGui::AlignTextToFramePadding();
        ImGui::TextUnformatted("Group column");
        ImGui::SameLine();
        std::string by = v.read.by.empty() ? std::to_string(v.counts.group_column) : v.read.by;
        ImGui::SetNextItemWidth(110);
        const bool done = text_field("##group-column", &by, FieldKeys::text, ImGuiInputTextFlags_EnterReturnsTrue) ||
                          ImGui::IsItemDeactivatedAfterEdit();
        mark_widget("group column");
        if (ImGui::IsItemHovered()) ImGui::SetTooltip("The header name or the number (1 = first) of the column naming the groups");
        flow_next(ImGui::CalcTextSize("as a").x + 160 + ImGui::GetStyle().ItemSpacing.x);
        ImGui::AlignTextToFramePadding();
        ImGui::TextUnformatted("as a");
        ImGui::SameLine();
        GroupShape shape = v.read.shape.value_or(v.counts.shape);
        ImGui::SetNextItemWidth(160);
        bool reshape = false;
        if (ImGui::BeginCombo("##group-shape", (std::string(group_shape_name(shape)) + " table").c_str())) {
            begin_menu_items(t);
            for (GroupShape g : {GroupShape::long_table, GroupShape::wide_table, GroupShape::raw_values})
                if (ImGui::Selectable((std::string(group_shape_name(g)) + " table").c_str(), g == shape) && g != shape) { shape = g; reshape = true; }
            end_menu_items(t);
            ImGui::EndCombo();
        }
        mark_widget("group shape");
        // The first row: read as a header (naming the categories, such as the digits 0-9 of a wide
        // table) or as a group; detected, shown, and changeable here.
        flow_next(ImGui::GetFrameHeight() + ImGui::CalcTextSize("First row is a header").x + 2 * ImGui::GetStyle().ItemSpacing.x);
        bool header = v.read.header.value_or(v.counts.header);
        const bool reheader = ImGui::Checkbox("First row is a header", &header);
        mark_widget("first row is a header");
        if (ImGui::IsItemHovered())
            ImGui::SetTooltip(v.counts.numbered_header ? "Detected: its cells under the categories are numbered (digits, years, sizes) while the group column's is text"
                                                       : "Untick to read the first row as a group of counts");
        if ((done && by != (v.read.by.empty() ? std::to_string(v.counts.group_column) : v.read.by)) || reshape || reheader) {
            GroupReadOptions read = v.read;
            read.by = by;
            if (reshape) read.shape = shape;
            if (reheader) read.header = header;
            const std::string text = v.text;
            std::string why;
            if (!open_groups(s, text, read, &why)) {
                s.input_error = why;
                publish_error(why);
            }
        }
        flow_next(ImGui::CalcTextSize("Read as one sample instead").x + 2 * ImGui::GetStyle().FramePadding.x);
    }
    if (ImGui::Button("Read as one sample instead")) leave_groups(s);
    mark_widget("Read as one sample");
    if (r.status.ok) {  // what leaves the page: the summary to paste, the table for a spreadsheet
        const float pad = 2 * ImGui::GetStyle().FramePadding.x;
        flow_next(ImGui::CalcTextSize("Copy summary").x + pad);
        if (ImGui::Button("Copy summary")) copy_screen_summary(s);
        mark_widget("Copy summary");
        flow_next(ImGui::CalcTextSize("Copy table (TSV)").x + pad);
        if (ImGui::Button("Copy table (TSV)")) copy_groups_table(s);
        explain_item("Copy groups table", "Copy table (TSV)");
        flow_next(ImGui::CalcTextSize("Download table (CSV)").x + pad);
        if (ImGui::Button("Download table (CSV)")) download_groups_table(s);
        explain_item("Download groups table", "Download table (CSV)");
        flow_next(ImGui::CalcTextSize("Download workbook (.xlsx)").x + pad);
        if (ImGui::Button("Download workbook (.xlsx)")) download_groups_workbook(s);
        mark_widget("Download groups workbook");
    }
    if (!s.input_error.empty()) {
        ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.warn_ink));
        wrapped_text(("Not applied: " + s.input_error).c_str());
        ImGui::PopStyleColor();
    }
    if (ImGui::IsItemHovered()) ImGui::SetTooltip("All groups' counts added together, tested as one sample");
    if (!r.status.ok) return;
    float notes_h = 0;
    const float wrap = ImGui::GetContentRegionAvail().x;
    for (const auto& c : r.cautions) notes_h += ImGui::CalcTextSize(c.c_str(), nullptr, false, wrap).y + ImGui::GetStyle().ItemSpacing.y;
    const ImVec2 area(ImGui::GetContentRegionAvail().x, std::max(220.0f, ImGui::GetContentRegionAvail().y - notes_h - ImGui::GetFrameHeightWithSpacing() - 8));
    if (ImGui::BeginTabBar("groups-views")) {
        const bool table = ImGui::BeginTabItem("Groups table");
        mark_widget("Groups table");
        if (table) { draw_groups_table(s, t, area); ImGui::EndTabItem(); }
        const bool funnel = ImGui::BeginTabItem("Funnel chart");
        mark_widget("Funnel chart");
        if (funnel) { draw_funnel(s, t, area); ImGui::EndTabItem(); }
        ImGui::EndTabBar();
    }
    for (const auto& c : r.cautions) muted_wrapped(t, "Caution: %s", c.c_str());
}

void draw_group_banner(AppState& s, const Theme& t) {
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.accent));
    explained_text("group banner", group_banner(s));
    ImGui::PopStyleColor();
    if (compact_button("← Back to all groups", t)) back_to_groups(s);
    mark_widget("Back to all groups");
    ImGui::Separator();
}

}  // namespace tallyproof::web
