// The density plot: the chi-square density of the result's df with the rejection region beyond
// the critical value shaded and the observed statistic marked with its tail area.
#pragma once
#include <imgui.h>

#include "chi_square_density_curve.hpp"
#include "result.hpp"
#include "theme.hpp"

namespace tallyproof::web {

void draw_density_plot(const DensityCurve& curve, const Result& result, ImVec2 size, const Theme& theme);

}  // namespace tallyproof::web
