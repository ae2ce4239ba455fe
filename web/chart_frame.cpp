// The frame shared by the charts (see chart_frame.hpp); nothing here knows what a chart shows.
#include "chart_frame.hpp"

#include <algorithm>

#include "axis_ticks.hpp"

namespace tallyproof::web {

bool begin_chart(const char* id, const std::string& title, ImVec2 size, ImVec2 min_size, const Theme& t, ChartFrame* f) {
    *f = ChartFrame{};
    f->dl = ImGui::GetWindowDrawList();
    f->origin = ImGui::GetCursorScreenPos();
    f->size = size;
    ImGui::InvisibleButton(id, size);
    f->hovered = ImGui::IsItemHovered();
    f->clicked = ImGui::IsItemClicked();
    f->line = ImGui::GetTextLineHeight();
    if (size.x < min_size.x || size.y < min_size.y) return false;
    f->dl->AddRectFilled(f->origin, ImVec2(f->origin.x + size.x, f->origin.y + size.y), t.paper, 6.0f);
    ImGui::PushFont(t.strong);
    f->dl->AddText(ImVec2(f->origin.x + 12, f->origin.y + 7), t.ink, title.c_str());
    ImGui::PopFont();
    return true;
}

void set_plot_area(ChartFrame* f, float left, float right, float top, float bottom) {
    f->p0 = ImVec2(f->origin.x + left, f->origin.y + top);
    f->p1 = ImVec2(f->origin.x + f->size.x - right, f->origin.y + f->size.y - bottom);
}

void draw_value_grid(const ChartFrame& f, const std::vector<double>& ticks, const AxisMap& py, const Theme& t) {
    for (double v : ticks) {
        const float y = py(v);
        f.dl->AddLine(ImVec2(f.p0.x, y), ImVec2(f.p1.x, y), t.grid);
        const std::string s = tick_label(v);
        f.dl->AddText(ImVec2(f.p0.x - ImGui::CalcTextSize(s.c_str()).x - 6, y - f.line / 2), t.muted, s.c_str());
    }
}

void draw_x_ticks(const ChartFrame& f, const std::vector<double>& ticks, const AxisMap& px, const std::string& name, const Theme& t) {
    for (double v : ticks) {
        const float x = px(v);
        f.dl->AddLine(ImVec2(x, f.p1.y), ImVec2(x, f.p1.y + 5), t.rule);
        const std::string s = tick_label(v);
        f.dl->AddText(ImVec2(x - ImGui::CalcTextSize(s.c_str()).x / 2, f.p1.y + 7), t.muted, s.c_str());
    }
    if (!name.empty())
        f.dl->AddText(ImVec2((f.p0.x + f.p1.x) / 2 - ImGui::CalcTextSize(name.c_str()).x / 2, f.p1.y + 9 + f.line), t.muted, name.c_str());
}

void draw_axes(const ChartFrame& f, bool y_axis, const Theme& t) {
    f.dl->AddLine(ImVec2(f.p0.x, f.p1.y), ImVec2(f.p1.x, f.p1.y), t.ink, 1.0f);
    if (y_axis) f.dl->AddLine(ImVec2(f.p0.x, f.p0.y), ImVec2(f.p0.x, f.p1.y), t.ink, 1.0f);
}

float draw_legend(const ChartFrame& f, const std::string& title, const std::vector<LegendItem>& items, const Theme& t) {
    const float th = f.line;
    std::vector<float> item_w;
    float legend_w = 0;
    for (std::size_t i = 0; i < items.size(); ++i) {
        item_w.push_back(16 + ImGui::CalcTextSize(items[i].text).x);
        legend_w += item_w.back() + (i ? 14 : 0);
    }
    ImGui::PushFont(t.strong);
    const float title_w = ImGui::CalcTextSize(title.c_str()).x;
    ImGui::PopFont();
    const ImVec2 o = f.origin;
    const bool beside = 12 + title_w + 24 + legend_w + 16 <= f.size.x;
    float lx = beside ? o.x + f.size.x - 16 - legend_w : o.x + 12, ly = o.y + (beside ? 8 : 10 + th);
    for (std::size_t i = 0; i < items.size(); ++i) {
        if (!beside && lx + item_w[i] > o.x + f.size.x - 8 && lx > o.x + 12) {
            lx = o.x + 12;
            ly += th + 4;
        }
        if (items[i].line) f.dl->AddRectFilled(ImVec2(lx, ly + th / 2 - 1), ImVec2(lx + 12, ly + th / 2 + 2), items[i].colour);
        else f.dl->AddRectFilled(ImVec2(lx, ly + 2), ImVec2(lx + 12, ly + th - 2), items[i].colour, 2);
        f.dl->AddText(ImVec2(lx + 16, ly), t.muted, items[i].text);
        lx += item_w[i] + 14;
    }
    return beside ? o.y + 34 + th : ly + th + 20;
}

}  // namespace tallyproof::web
