// Maps the points core/ computed (density_curve) to pixels; axes get "nice" ticks (steps of
// 1, 2 or 5 times a power of ten, common practice for chart axes).
#include "density_plot.hpp"

#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

#include "chi_square_tail.hpp"
#include "number_format.hpp"

namespace tallyproof::web {
namespace {

std::vector<double> nice_ticks(double lo, double hi, int max_ticks) {
    std::vector<double> ticks;
    if (!(hi > lo) || max_ticks < 2) return ticks;
    const double raw = (hi - lo) / max_ticks;
    const double mag = std::pow(10.0, std::floor(std::log10(raw)));
    double step = mag;
    for (double m : {1.0, 2.0, 5.0, 10.0}) {
        step = m * mag;
        if (step >= raw) break;
    }
    for (double v = std::ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) ticks.push_back(std::fabs(v) < step * 1e-9 ? 0 : v);
    return ticks;
}

std::string tick_label(double v) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%g", v);
    return buf;
}

}  // namespace

void draw_density_plot(const DensityCurve& curve, const Result& result, ImVec2 size, const Theme& theme) {
    ImDrawList* dl = ImGui::GetWindowDrawList();
    const ImVec2 origin = ImGui::GetCursorScreenPos();
    ImGui::InvisibleButton("density-plot", size);
    const bool hovered = ImGui::IsItemHovered();
    if (curve.x.size() < 2 || size.x < 80 || size.y < 60) return;

    const float left = 52, right = 14, top = 28, bottom = 40;
    const ImVec2 p0(origin.x + left, origin.y + top);
    const ImVec2 p1(origin.x + size.x - right, origin.y + size.y - bottom);
    const double xmax = curve.x_max, ymax = curve.y_max;
    auto px = [&](double x) { return static_cast<float>(p0.x + (p1.x - p0.x) * (x / xmax)); };
    auto py = [&](double y) { return static_cast<float>(p1.y - (p1.y - p0.y) * (y / ymax)); };

    dl->AddRectFilled(origin, ImVec2(origin.x + size.x, origin.y + size.y), theme.paper, 6.0f);
    ImGui::PushFont(theme.strong);
    dl->AddText(ImVec2(origin.x + 12, origin.y + 6), theme.ink, ("Chi-square density, df = " + format_count(result.df)).c_str());
    ImGui::PopFont();

    // Grid and ticks
    const float th = ImGui::GetTextLineHeight();
    for (double t : nice_ticks(0, xmax, std::max(2, static_cast<int>((p1.x - p0.x) / 70)))) {
        const float x = px(t);
        dl->AddLine(ImVec2(x, p1.y), ImVec2(x, p1.y + 5), theme.rule);
        const std::string s = tick_label(t);
        const float w = ImGui::CalcTextSize(s.c_str()).x;
        dl->AddText(ImVec2(x - w / 2, p1.y + 7), theme.muted, s.c_str());
    }
    for (double t : nice_ticks(0, ymax, std::max(2, static_cast<int>((p1.y - p0.y) / 50)))) {
        const float y = py(t);
        dl->AddLine(ImVec2(p0.x, y), ImVec2(p1.x, y), IM_COL32(0, 0, 0, 18));
        const std::string s = tick_label(t);
        const float w = ImGui::CalcTextSize(s.c_str()).x;
        dl->AddText(ImVec2(p0.x - w - 6, y - th / 2), theme.muted, s.c_str());
    }
    const char* xlabel = "χ² value";
    dl->AddText(ImVec2((p0.x + p1.x) / 2 - ImGui::CalcTextSize(xlabel).x / 2, p1.y + 9 + th), theme.muted, xlabel);

    // Shaded areas: rejection region beyond the critical value, observed tail beyond the statistic.
    auto shade_from = [&](double from, ImU32 colour) {
        const ImDrawListFlags saved = dl->Flags;
        dl->Flags &= ~ImDrawListFlags_AntiAliasedFill;  // adjacent strips must not show seams
        for (std::size_t i = 0; i + 1 < curve.x.size(); ++i) {
            const double xa = std::max(curve.x[i], from), xb = curve.x[i + 1];
            if (xb <= from) continue;
            const double t = (xa - curve.x[i]) / (curve.x[i + 1] - curve.x[i]);
            const double ya = curve.y[i] + t * (curve.y[i + 1] - curve.y[i]);
            dl->AddQuadFilled(ImVec2(px(xa), p1.y), ImVec2(px(xa), py(ya)), ImVec2(px(xb), py(curve.y[i + 1])),
                              ImVec2(px(xb), p1.y), colour);
        }
        dl->Flags = saved;
    };
    if (std::isfinite(result.critical_value)) shade_from(result.critical_value, theme.reject_fill);
    shade_from(result.statistic, theme.tail_fill);

    std::vector<ImVec2> pts;
    pts.reserve(curve.x.size());
    for (std::size_t i = 0; i < curve.x.size(); ++i) pts.emplace_back(px(curve.x[i]), py(curve.y[i]));
    dl->AddPolyline(pts.data(), static_cast<int>(pts.size()), theme.curve, 0, 2.25f);
    dl->AddLine(ImVec2(p0.x, p1.y), ImVec2(p1.x, p1.y), theme.ink, 1.0f);
    dl->AddLine(ImVec2(p0.x, p0.y), ImVec2(p0.x, p1.y), theme.ink, 1.0f);

    // Critical value: dashed line with its label.
    if (std::isfinite(result.critical_value) && result.critical_value <= xmax) {
        const float x = px(result.critical_value);
        for (float y = p0.y; y < p1.y; y += 8) dl->AddLine(ImVec2(x, y), ImVec2(x, std::min(y + 4, p1.y)), theme.warn_ink, 1.5f);
        const std::string s = "critical " + format_fixed(result.critical_value, 2);
        dl->AddText(ImVec2(x + 4, p0.y), theme.warn_ink, s.c_str());
    }
    // Observed statistic: solid marker with its value.
    if (result.statistic <= xmax) {
        const float x = px(result.statistic);
        dl->AddLine(ImVec2(x, p0.y + th + 4), ImVec2(x, p1.y), theme.marker, 2.5f);
        dl->AddTriangleFilled(ImVec2(x - 6, p0.y + th + 2), ImVec2(x + 6, p0.y + th + 2), ImVec2(x, p0.y + th + 11), theme.marker);
        const std::string s = "observed χ² = " + format_fixed(result.statistic, 2);
        ImGui::PushFont(theme.strong);
        const float w = ImGui::CalcTextSize(s.c_str()).x;
        const float tx = x + 8 + w > p1.x ? x - 8 - w : x + 8;
        dl->AddText(ImVec2(tx, p0.y + th + 8), theme.marker, s.c_str());
        ImGui::PopFont();
    }

    if (hovered) {
        const double x = (ImGui::GetIO().MousePos.x - p0.x) / (p1.x - p0.x) * xmax;
        if (x >= 0 && x <= xmax) {
            ImGui::BeginTooltip();
            ImGui::Text("χ² = %s", format_significant(x, 4).c_str());
            ImGui::Text("density %s", format_significant(chi_square_density(x, result.df), 3).c_str());
            ImGui::Text("P(χ² ≥ x) = %s", format_probability(chi_square_upper_tail(x, result.df)).c_str());
            ImGui::EndTooltip();
        }
    }
}

}  // namespace tallyproof::web
