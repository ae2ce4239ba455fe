// The bars: observed against expected for every tested cell, each bar coloured by its adjusted
// residual, the cells that drive the result marked with their direction.
#pragma once
#include <imgui.h>

#include "result.hpp"
#include "theme.hpp"

namespace tallyproof::web {

void draw_bar_chart(const Result& result, ImVec2 size, const Theme& theme);

}  // namespace tallyproof::web
