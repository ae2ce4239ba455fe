// Layout: a title line, a notice band for refused input, then the counts beside the verdict
// and the density plot (stacked on narrow screens).
#include "panels.hpp"

#include <algorithm>
#include <string>

#include "density_plot.hpp"
#include "number_format.hpp"
#include "report.hpp"
#include "tallyproof_version.hpp"

namespace tallyproof::web {
namespace {

void draw_title(const AppState& s, const Theme& t) {
    ImGui::PushFont(t.heading);
    ImGui::TextUnformatted("Tallyproof");
    ImGui::PopFont();
    ImGui::SameLine();
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.muted));
    ImGui::SetCursorPosY(ImGui::GetCursorPosY() + 4);
    ImGui::Text("chi-square goodness of fit · v%s · %s", TALLYPROOF_VERSION, s.source_name.c_str());
    ImGui::PopStyleColor();
}

void draw_rejection_notice(const AppState& s, const Theme& t) {
    if (s.rejected_message.empty()) return;
    ImGui::PushStyleColor(ImGuiCol_ChildBg, ImGui::ColorConvertU32ToFloat4(t.warn_bg));
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.warn_ink));
    const float h = ImGui::GetTextLineHeightWithSpacing() * 2 + ImGui::GetStyle().WindowPadding.y * 2;
    ImGui::BeginChild("rejected", ImVec2(0, h), true, ImGuiWindowFlags_NoScrollbar);
    ImGui::PushFont(t.strong);
    ImGui::TextWrapped("Paste not used: %s", s.rejected_message.c_str());
    ImGui::PopFont();
    ImGui::TextUnformatted("The analysis below is still the previous one. Fix the line and paste again.");
    ImGui::EndChild();
    ImGui::PopStyleColor(2);
}

void draw_counts(const AppState& s, const Theme& t) {
    const Result& r = s.result;
    ImGui::PushFont(t.strong);
    ImGui::TextUnformatted("Counts");
    ImGui::PopFont();
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.muted));
    ImGui::TextWrapped("Paste lines of label ⇥ count from a spreadsheet (Ctrl+V / ⌘V) anywhere on the page.");
    ImGui::PopStyleColor();
    if (!r.status.ok) return;
    const ImGuiTableFlags flags = ImGuiTableFlags_RowBg | ImGuiTableFlags_BordersInnerH | ImGuiTableFlags_BordersOuter |
                                  ImGuiTableFlags_ScrollY | ImGuiTableFlags_SizingStretchProp;
    if (ImGui::BeginTable("counts", 4, flags, ImVec2(0, ImGui::GetContentRegionAvail().y))) {
        ImGui::TableSetupScrollFreeze(0, 1);
        ImGui::TableSetupColumn("Category", ImGuiTableColumnFlags_WidthStretch, 2.2f);
        ImGui::TableSetupColumn("Observed", ImGuiTableColumnFlags_WidthStretch, 1.0f);
        ImGui::TableSetupColumn("Expected", ImGuiTableColumnFlags_WidthStretch, 1.0f);
        ImGui::TableSetupColumn("(O−E)²/E", ImGuiTableColumnFlags_WidthStretch, 1.0f);
        ImGui::TableHeadersRow();
        ImGuiListClipper clipper;
        clipper.Begin(static_cast<int>(r.observed.size()));
        while (clipper.Step()) {
            for (int i = clipper.DisplayStart; i < clipper.DisplayEnd; ++i) {
                ImGui::TableNextRow();
                ImGui::TableNextColumn();
                ImGui::TextUnformatted(r.categories[i].c_str());
                ImGui::TableNextColumn();
                ImGui::TextUnformatted(format_count(r.observed[i]).c_str());
                ImGui::TableNextColumn();
                ImGui::TextUnformatted(format_fixed(r.expected_counts[i], 2).c_str());
                ImGui::TableNextColumn();
                ImGui::TextUnformatted(format_fixed(r.contributions[i], 3).c_str());
            }
        }
        ImGui::TableNextRow();
        ImGui::TableNextColumn();
        ImGui::PushFont(t.strong);
        ImGui::TextUnformatted("Total");
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(format_count(r.n).c_str());
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(format_count(r.n).c_str());
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(format_fixed(r.statistic, 3).c_str());
        ImGui::PopFont();
        ImGui::EndTable();
    }
}

void draw_verdict(const AppState& s, const Theme& t) {
    const Result& r = s.result;
    if (!r.status.ok) {
        ImGui::TextWrapped("%s", r.status.message.c_str());
        return;
    }
    ImGui::PushFont(t.heading);
    ImGui::Text("χ² = %s", format_fixed(r.statistic, 2).c_str());
    ImGui::PopFont();
    ImGui::SameLine(0, 24);
    ImGui::SetCursorPosY(ImGui::GetCursorPosY() + 4);
    ImGui::Text("df = %s     p = %s     N = %s", format_count(r.df).c_str(), format_probability(r.upper).c_str(),
                format_count(r.n).c_str());
    ImGui::Text("Critical value at α = %s: %s", format_plain(r.alpha).c_str(), format_fixed(r.critical_value, 3).c_str());
    ImGui::PushFont(t.strong);
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(r.reject ? t.warn_ink : t.accent));
    ImGui::TextWrapped("%s", verdict_sentence(r).c_str());
    ImGui::PopStyleColor();
    ImGui::PopFont();
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.muted));
    ImGui::TextWrapped("Expected mix: equal shares across %zu categories (Pearson's X², df = k − 1).",
                       r.observed.size());
    for (const auto& w : r.warnings) ImGui::TextWrapped("Note: %s", w.c_str());
    ImGui::PopStyleColor();
}

}  // namespace

void draw_screen(AppState& s, const Theme& t) {
    const ImGuiViewport* vp = ImGui::GetMainViewport();
    ImGui::SetNextWindowPos(vp->Pos);
    ImGui::SetNextWindowSize(vp->Size);
    ImGui::Begin("Tallyproof", nullptr,
                 ImGuiWindowFlags_NoDecoration | ImGuiWindowFlags_NoMove | ImGuiWindowFlags_NoSavedSettings |
                     ImGuiWindowFlags_NoBringToFrontOnFocus);
    draw_title(s, t);
    draw_rejection_notice(s, t);

    const ImVec2 avail = ImGui::GetContentRegionAvail();
    const bool wide = avail.x >= 760;
    const float gap = ImGui::GetStyle().ItemSpacing.x;
    const float counts_w = wide ? std::clamp(avail.x * 0.36f, 300.0f, 520.0f) : avail.x;
    const float counts_h = wide ? avail.y : std::max(200.0f, avail.y * 0.38f);

    ImGui::BeginChild("counts-panel", ImVec2(counts_w, counts_h), true);
    draw_counts(s, t);
    ImGui::EndChild();
    if (wide) ImGui::SameLine(0, gap);

    ImGui::BeginChild("result-panel", ImVec2(0, wide ? avail.y : 0), true);
    draw_verdict(s, t);
    ImGui::Spacing();
    const ImVec2 plot = ImGui::GetContentRegionAvail();
    if (s.result.status.ok) draw_density_plot(s.curve, s.result, ImVec2(plot.x, std::max(180.0f, plot.y)), t);
    ImGui::EndChild();
    ImGui::End();
}

}  // namespace tallyproof::web
