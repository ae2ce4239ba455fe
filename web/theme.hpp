// Theme: every colour, font and spacing of the page, set once here.
#pragma once
#include <imgui.h>

namespace tallyproof::web {

struct Theme {
    ImU32 paper, ink, muted, rule, accent, accent_soft, reject_fill, tail_fill, marker, curve, warn_bg, warn_ink;
    ImFont* body = nullptr;     // regular text
    ImFont* strong = nullptr;   // bold text
    ImFont* heading = nullptr;  // bold, larger: panel titles and the statistic
};

// Loads the embedded DejaVu faces at `pixel_ratio` times their size (crisp on high-DPI
// screens) and sets ImGui's style and colours.
Theme make_theme(float pixel_ratio);

}  // namespace tallyproof::web
