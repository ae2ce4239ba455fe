// Panels of the calculator screen. Each takes the state it shows; none owns data.
#pragma once
#include "app_state.hpp"
#include "theme.hpp"

namespace tallyproof::web {

void draw_screen(AppState& state, const Theme& theme);  // the whole page, one ImGui window

}  // namespace tallyproof::web
