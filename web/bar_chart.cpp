// Bars are observed counts; the expected count is a dark bar-wide tick, so both read against one
// axis. Colour follows the adjusted residual (Haberman 1973): neutral near 0, deepening to clay
// (more than expected) or blue (fewer) as |r| grows towards 3.
#include "bar_chart.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

#include "axis_ticks.hpp"
#include "chart_frame.hpp"
#include "number_format.hpp"

namespace tallyproof::web {
namespace {

std::string fit_label(const std::string& s, float width) {
    if (ImGui::CalcTextSize(s.c_str()).x <= width) return s;
    std::string t = s;
    while (!t.empty() && ImGui::CalcTextSize((t + "…").c_str()).x > width) {
        t.pop_back();
        while (!t.empty() && (static_cast<unsigned char>(t.back()) & 0xC0) == 0x80) t.pop_back();  // whole code points
        if (!t.empty() && (static_cast<unsigned char>(t.back()) & 0xC0) == 0xC0) t.pop_back();
    }
    return t.empty() ? "" : t + "…";
}

}  // namespace

void draw_bar_chart(const Result& r, ImVec2 size, const Theme& theme) {
    const std::size_t k = r.tested_observed.size();
    const std::string title = "Observed counts against expected";
    ChartFrame f;
    if (!begin_chart("bar-chart", title, size, ImVec2(80, 60), theme, &f) || k == 0) return;
    ImDrawList* dl = f.dl;
    const bool hovered = f.hovered;
    const float th = f.line;
    const float legend_bottom = draw_legend(f, title, {{"fewer than expected", theme.fewer}, {"more than expected", theme.more},
                                                       {"expected", theme.expected_mark, true}}, theme);
    set_plot_area(&f, 56, 16, legend_bottom - f.origin.y, 30);
    const ImVec2 p0 = f.p0, p1 = f.p1;
    double vmax = 0;
    for (std::size_t i = 0; i < k; ++i) vmax = std::max({vmax, r.tested_observed[i], r.tested_expected[i]});
    const std::vector<double> ticks = nice_ticks(0, vmax * 1.05, std::max(2, static_cast<int>((p1.y - p0.y) / 60)));
    const double ytop = ticks.size() >= 2 && ticks.back() >= vmax ? ticks.back() : nice_ceiling(vmax * 1.05);
    auto py = [&](double v) { return static_cast<float>(p1.y - (p1.y - p0.y) * (v / ytop)); };
    draw_value_grid(f, nice_ticks(0, ytop, std::max(2, static_cast<int>((p1.y - p0.y) / 60))), py, theme);

    const float slot = (p1.x - p0.x) / static_cast<float>(k);
    const float bar = std::max(2.0f, std::min(slot * 0.66f, 64.0f));
    const int label_every = std::max(1, static_cast<int>(std::ceil(42.0f / slot)));
    int hover_index = -1;
    for (std::size_t i = 0; i < k; ++i) {
        const float cx = p0.x + slot * (static_cast<float>(i) + 0.5f);
        const double adj = i < r.diagnostics.categories.size() ? r.diagnostics.categories[i].adjusted_residual : 0;
        const bool driver = i < r.diagnostics.categories.size() && r.diagnostics.categories[i].drives_result;
        dl->AddRectFilled(ImVec2(cx - bar / 2, py(r.tested_observed[i])), ImVec2(cx + bar / 2, p1.y), residual_colour(theme, adj), 2.0f);
        const float ey = py(r.tested_expected[i]);
        dl->AddRectFilled(ImVec2(cx - bar / 2 - 3, ey - 1.5f), ImVec2(cx + bar / 2 + 3, ey + 1.5f), theme.expected_mark);
        if (driver) {
            const char* mark = adj > 0 ? "▲" : "▼";
            const float my = std::min(py(r.tested_observed[i]), ey) - th - 4;
            ImGui::PushFont(theme.strong);
            dl->AddText(ImVec2(cx - ImGui::CalcTextSize(mark).x / 2, my), adj > 0 ? theme.more : theme.fewer, mark);
            ImGui::PopFont();
        }
        if (static_cast<int>(i) % label_every == 0) {
            const std::string lab = fit_label(r.tested_categories[i], slot * label_every - 4);
            const float w = ImGui::CalcTextSize(lab.c_str()).x;
            ImGui::PushFont(driver ? theme.strong : theme.body);
            dl->AddText(ImVec2(cx - w / 2, p1.y + 6), driver ? theme.ink : theme.muted, lab.c_str());
            ImGui::PopFont();
        }
        const ImVec2 m = ImGui::GetIO().MousePos;
        if (hovered && m.x >= cx - slot / 2 && m.x < cx + slot / 2) hover_index = static_cast<int>(i);
    }
    draw_axes(f, false, theme);

    if (hover_index >= 0) {
        const std::size_t i = static_cast<std::size_t>(hover_index);
        ImGui::BeginTooltip();
        ImGui::PushFont(theme.strong);
        ImGui::TextUnformatted(r.tested_categories[i].c_str());
        ImGui::PopFont();
        ImGui::Text("observed %s, expected %s", format_count(r.tested_observed[i]).c_str(), format_fixed(r.tested_expected[i], 2).c_str());
        if (i < r.diagnostics.categories.size()) {
            const auto& d = r.diagnostics.categories[i];
            ImGui::Text("adjusted residual %s", format_fixed(d.adjusted_residual, 2).c_str());
            ImGui::Text("adjusted p %s", format_probability(d.adjusted).c_str());
        }
        ImGui::EndTooltip();
    }
}

}  // namespace tallyproof::web
