// Theme: every colour, font and spacing of the page, set once here (light and dark palettes).
#pragma once
#include <imgui.h>

namespace tallyproof::web {

struct Theme {
    bool dark = false;
    bool touch = false;          // a touch screen: every control at least 44 CSS px tall (apply_palette)
    ImU32 paper, ink, muted, rule, grid, accent, reject_fill, tail_fill, marker, curve, warn_bg, warn_ink,
        ok_bg, ok_ink, more, fewer, neutral, expected_mark, progress;
    ImVec4 clear;                // canvas background
    ImFont* body = nullptr;      // regular text
    ImFont* strong = nullptr;    // bold text
    ImFont* heading = nullptr;   // bold, larger: the statistic
    float font_scale = 1.0f;     // io.FontGlobalScale for these faces (1 / their pixel ratio)
    // The same faces rasterised at 2x for chart images (PNG export and print), when the screen is below 2x.
    ImFont *export_body = nullptr, *export_strong = nullptr, *export_heading = nullptr;
};

// The theme with its export faces in place of the screen faces, and font_scale 1/2.
Theme export_theme(const Theme& theme);

// Loads the embedded DejaVu faces at `pixel_ratio` times their size (crisp on high-DPI
// screens), and at 2x for chart images; call once, before the first frame.
void load_fonts(Theme* theme, float pixel_ratio);

// Sets ImGui's style and the theme's colours for the light or dark palette.
void apply_palette(Theme* theme, bool dark);

// Colour of a bar by its adjusted residual: deepening towards `more` or `fewer` as |r| grows.
ImU32 residual_colour(const Theme& theme, double adjusted_residual);

}  // namespace tallyproof::web
