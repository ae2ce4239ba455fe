// Maps the points core/ computed (density_curve) to pixels; axes get "nice" ticks (steps of
// 1, 2 or 5 times a power of ten, common practice for chart axes). A statistic far beyond the
// curve is drawn past a break in the axis, with its own label, so the curve keeps its shape.
#include "density_plot.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

#include "axis_ticks.hpp"
#include "chart_frame.hpp"
#include "chi_square_tail.hpp"
#include "noncentral_chi_square.hpp"
#include "noncentral_chi_square_density_curve.hpp"
#include "number_format.hpp"

namespace tallyproof::web {

CurveTest curve_test(const Result& r) {
    CurveTest ct{r.statistic, r.df, r.critical_value, r.statistic_symbol, ""};
    if (r.design && r.design->status.ok) {  // survey data: the curve of the test the verdict rests on
        const DesignTest& d = r.design->second_order.available ? r.design->second_order : r.design->first_order;
        if (d.available && d.df > 0) {
            ct.statistic = d.statistic;
            ct.df = d.df;
            // r.critical_value is already the corrected test's (survey_analysis), so it stays.
            ct.symbol = "corrected " + r.statistic_symbol;
            ct.title_note = r.design->second_order.available ? " (design-corrected: Rao–Scott second order)"
                                                             : " (design-corrected: " + r.design_decided_on + ")";
        }
    }
    return ct;
}

namespace {

// The hover tip at statistic value x: the density there and the tail area from it.
void show_density_tip(const CurveTest& ct, double x, bool conform, double lambda) {
    ImGui::BeginTooltip();
    const char* sym = ct.symbol.c_str();
    ImGui::Text("%s = %s", sym, format_significant(x, 4).c_str());
    if (conform) {
        ImGui::Text("density %s", format_significant(noncentral_chi_square_density(x, ct.df, lambda), 3).c_str());
        ImGui::Text("chance of %s at most this: %s", sym, format_significant(noncentral_chi_square_lower_tail(x, ct.df, lambda), 3).c_str());
    } else {
        ImGui::Text("density %s", format_significant(chi_square_density(x, ct.df), 3).c_str());
        ImGui::Text("chance of %s at least this: %s", sym, format_probability(chi_square_upper_tail(x, ct.df)).c_str());
    }
    ImGui::EndTooltip();
}

// A statistic far beyond the curve: an axis break (two slanted strokes), then the statistic
// marked on its own short stretch of axis right of the plot, with its value and a label.
void draw_statistic_past_break(const ChartFrame& f, const CurveTest& ct, const Theme& theme) {
    ImDrawList* dl = f.dl;
    const ImVec2 p0 = f.p0, p1 = f.p1;
    const float th = f.line;
    const float bx = p1.x + 14;
    dl->AddLine(ImVec2(p1.x, p1.y), ImVec2(bx - 4, p1.y), theme.ink);
    for (float d : {0.0f, 6.0f}) dl->AddLine(ImVec2(bx - 4 + d, p1.y + 6), ImVec2(bx + 2 + d, p1.y - 6), theme.ink, 1.5f);
    const float ex = f.origin.x + f.size.x - 16;
    dl->AddLine(ImVec2(bx + 10, p1.y), ImVec2(ex, p1.y), theme.ink);
    const float sx = (bx + 10 + ex) / 2;
    dl->AddLine(ImVec2(sx, p0.y + 2 * th + 16), ImVec2(sx, p1.y), theme.marker, 2.5f);
    dl->AddTriangleFilled(ImVec2(sx - 6, p0.y + 2 * th + 14), ImVec2(sx + 6, p0.y + 2 * th + 14),
                          ImVec2(sx, p0.y + 2 * th + 23), theme.marker);
    ImGui::PushFont(theme.strong);
    const std::string v = format_significant(ct.statistic, 4);
    dl->AddText(ImVec2(sx - ImGui::CalcTextSize(v.c_str()).x / 2, p1.y + 7), theme.marker, v.c_str());
    ImGui::PopFont();
    const std::string l1 = "observed " + ct.symbol + ",";
    const char* l2 = "far beyond the curve";
    dl->AddText(ImVec2(ex - ImGui::CalcTextSize(l1.c_str()).x, p0.y), theme.marker, l1.c_str());
    dl->AddText(ImVec2(ex - ImGui::CalcTextSize(l2).x, p0.y + th), theme.marker, l2);
}

}  // namespace

void draw_density_plot(const DensityCurve& curve, const Result& result, ImVec2 size, const Theme& theme) {
    const bool broken = curve.statistic_beyond;
    // Goal "show it conforms": the curve is chi2(df, N w0²) and the region is its lower alpha tail.
    const bool conform = result.conformity && result.conformity->status.ok;
    const CurveTest ct = curve_test(result);
    const double critical = conform ? result.conformity->critical_value : ct.critical;
    const double lambda = conform ? result.conformity->noncentrality : 0;
    const std::string title = conform ? "Noncentral chi-square density if the mix departs by w0 = " +
                                            format_fixed(result.conformity->margin_w, 2) + ": df = " + format_count(ct.df) +
                                            ", noncentrality N·w0² = " + format_significant(lambda, 4)
                                      : "Chi-square density, df = " + (ct.df == std::floor(ct.df) ? format_count(ct.df) : format_significant(ct.df, 4)) +
                                            ct.title_note;
    ChartFrame f;
    if (!begin_chart("density-plot", title, size, ImVec2(80, 60), theme, &f) || curve.x.size() < 2) return;
    ImDrawList* dl = f.dl;
    const bool hovered = f.hovered;
    set_plot_area(&f, 56, broken ? 150 : 16, 30, 44);
    const ImVec2 p0 = f.p0, p1 = f.p1;
    const double xmin = curve.x_min, xmax = curve.x_max, ymax = curve.y_max;
    auto px = [&](double x) { return static_cast<float>(p0.x + (p1.x - p0.x) * ((x - xmin) / (xmax - xmin))); };
    auto py = [&](double y) { return static_cast<float>(p1.y - (p1.y - p0.y) * (y / ymax)); };
    const float th = f.line;
    draw_x_ticks(f, nice_ticks(xmin, xmax, std::max(2, static_cast<int>((p1.x - p0.x) / 70))), px, "value of " + ct.symbol, theme);
    draw_value_grid(f, nice_ticks(0, ymax, std::max(2, static_cast<int>((p1.y - p0.y) / 50))), py, theme);

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
    // Lower tail: the same strips, from 0 up to `to`.
    auto shade_to = [&](double to, ImU32 colour) {
        const ImDrawListFlags saved = dl->Flags;
        dl->Flags &= ~ImDrawListFlags_AntiAliasedFill;
        for (std::size_t i = 0; i + 1 < curve.x.size() && curve.x[i] < to; ++i) {
            const double xb = std::min(curve.x[i + 1], to);
            const double tb = (xb - curve.x[i]) / (curve.x[i + 1] - curve.x[i]);
            const double yb = curve.y[i] + tb * (curve.y[i + 1] - curve.y[i]);
            dl->AddQuadFilled(ImVec2(px(curve.x[i]), p1.y), ImVec2(px(curve.x[i]), py(curve.y[i])), ImVec2(px(xb), py(yb)),
                              ImVec2(px(xb), p1.y), colour);
        }
        dl->Flags = saved;
    };
    dl->PushClipRect(ImVec2(p0.x, p0.y - 2), ImVec2(p1.x + 2, p1.y + 1), true);
    if (conform) {
        if (std::isfinite(critical)) shade_to(critical, theme.reject_fill);
        shade_to(broken ? xmax : ct.statistic, theme.tail_fill);
    } else {
        if (std::isfinite(critical)) shade_from(critical, theme.reject_fill);
        if (!broken) shade_from(ct.statistic, theme.tail_fill);
    }
    dl->PopClipRect();

    dl->PushClipRect(ImVec2(p0.x, p0.y - 2), ImVec2(p1.x + 2, p1.y + 1), true);  // df < 2 rises past the top
    std::vector<ImVec2> pts;
    pts.reserve(curve.x.size());
    for (std::size_t i = 0; i < curve.x.size(); ++i) pts.emplace_back(px(curve.x[i]), py(curve.y[i]));
    dl->AddPolyline(pts.data(), static_cast<int>(pts.size()), theme.curve, 0, 2.25f);
    dl->PopClipRect();
    draw_axes(f, true, theme);

    if (std::isfinite(critical) && critical <= xmax) {
        const float x = px(critical);
        for (float y = p0.y; y < p1.y; y += 8) dl->AddLine(ImVec2(x, y), ImVec2(x, std::min(y + 4, p1.y)), theme.warn_ink, 1.5f);
        const std::string s = (conform ? "conforms below " : "critical ") + format_fixed(critical, 2);
        dl->AddText(ImVec2(x + 4, p0.y), theme.warn_ink, s.c_str());
    }

    ImGui::PushFont(theme.strong);
    const std::string stat_label = "observed " + ct.symbol + " = " + (ct.statistic < 1e5 ? format_fixed(ct.statistic, 2) : format_significant(ct.statistic, 4));
    if (!broken) {
        const float x = px(ct.statistic);
        dl->AddLine(ImVec2(x, p0.y + th + 4), ImVec2(x, p1.y), theme.marker, 2.5f);
        dl->AddTriangleFilled(ImVec2(x - 6, p0.y + th + 2), ImVec2(x + 6, p0.y + th + 2), ImVec2(x, p0.y + th + 11), theme.marker);
        // Right of the marker, else left of it inside the plot (never over the axis's tick
        // labels, as on a phone), else the same with the short label; first where it does not
        // cross the critical line's label either.
        const std::string short_label = stat_label.substr(std::string("observed ").size());
        const float crit_x = std::isfinite(critical) && critical <= xmax ? px(critical) : -1e9f;
        std::string label = short_label;
        float tx = p0.x + 4;
        bool placed = false;
        for (int pass = 0; pass < 2 && !placed; ++pass)
            for (const std::string* l : {&stat_label, &short_label}) {
                const float w = ImGui::CalcTextSize(l->c_str()).x;
                const auto clear = [&](float left) { return pass == 1 || crit_x < left - 2 || crit_x > left + w + 2; };
                if (x + 8 + w <= p1.x && clear(x + 8)) { label = *l; tx = x + 8; placed = true; break; }
                if (x - 8 - w >= p0.x + 4 && clear(x - 8 - w)) { label = *l; tx = x - 8 - w; placed = true; break; }
            }
        dl->AddText(ImVec2(tx, p0.y + th + 8), theme.marker, label.c_str());
    } else {
        ImGui::PopFont();
        draw_statistic_past_break(f, ct, theme);
        ImGui::PushFont(theme.strong);
    }
    ImGui::PopFont();

    if (hovered) {
        const double x = xmin + (ImGui::GetIO().MousePos.x - p0.x) / (p1.x - p0.x) * (xmax - xmin);
        if (x >= xmin && x <= xmax) show_density_tip(ct, x, conform, lambda);
    }
}

}  // namespace tallyproof::web
