// One frame for every chart (the density curve, the bars, the groups' funnel): the paper, the
// bold title, the plot area inside its margins, the value axis's grid and labels, the x axis's
// ticks and label, the axis lines, and a legend that sits beside the title or wraps under it.
// Each chart draws only its own marks between these.
#pragma once
#include <imgui.h>

#include <functional>
#include <string>
#include <vector>

#include "theme.hpp"

namespace tallyproof::web {

struct ChartFrame {
    ImDrawList* dl = nullptr;
    ImVec2 origin, size;         // the whole chart, screen coordinates
    ImVec2 p0, p1;               // the plot area: top-left and bottom-right
    float line = 0;              // the text line height
    bool hovered = false, clicked = false;
};
using AxisMap = std::function<float(double)>;  // a value to its screen coordinate

// The chart's item (an invisible button `id` over `size`), its paper and its title; false when
// `size` is below `min_size` (the item is still placed, nothing is drawn).
bool begin_chart(const char* id, const std::string& title, ImVec2 size, ImVec2 min_size, const Theme& t, ChartFrame* f);
// The plot area inside the margins (CSS px from the chart's edges).
void set_plot_area(ChartFrame* f, float left, float right, float top, float bottom);
// Horizontal grid lines at `ticks` with their labels left of the plot.
void draw_value_grid(const ChartFrame& f, const std::vector<double>& ticks, const AxisMap& py, const Theme& t);
// Tick marks and labels under the x axis, and the axis's name (empty: none) under them.
void draw_x_ticks(const ChartFrame& f, const std::vector<double>& ticks, const AxisMap& px, const std::string& name, const Theme& t);
// The x axis line, and the y axis line when `y_axis`.
void draw_axes(const ChartFrame& f, bool y_axis, const Theme& t);

struct LegendItem {
    const char* text;
    ImU32 colour;
    bool line = false;  // a short bar-wide tick (an expected value) rather than a swatch
};
// Beside the title when both fit on one line, else under it, wrapped as its items fit (a phone's
// width), so it never lies over the title or runs off the chart. Returns the y under the legend.
float draw_legend(const ChartFrame& f, const std::string& title, const std::vector<LegendItem>& items, const Theme& t);

}  // namespace tallyproof::web
