// The look-alike labels notice: a band under the title naming labels that look the same (they
// differ only by invisible characters, case or surrounding spaces), with a one-click merge.
#pragma once
#include "app_state.hpp"
#include "theme.hpp"

namespace tallyproof::web {

void draw_look_alike_notice(AppState& state, const Theme& theme);  // nothing when no labels look alike

}  // namespace tallyproof::web
