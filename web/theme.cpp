// Tallyproof's own palettes: warm paper with slate ink and a teal accent (light), deep slate with
// pale sand ink (dark); clay for the rejection region and "more than expected", indigo for the
// observed statistic, teal-blue for "fewer than expected".
#include "theme.hpp"

#include <algorithm>
#include <cmath>
#include <cstddef>

extern const unsigned char tallyproof_font_regular[];
extern const std::size_t tallyproof_font_regular_size;
extern const unsigned char tallyproof_font_bold[];
extern const std::size_t tallyproof_font_bold_size;

namespace tallyproof::web {
namespace {

// The code points assets/make_font_subset.py keeps: Latin, Greek letters, punctuation,
// super/subscripts and the few signs the page writes.
const ImWchar kGlyphRanges[] = {0x0020, 0x017F, 0x0302, 0x0302, 0x0304, 0x0304, 0x0391, 0x03C9, 0x2010, 0x2033, 0x2070, 0x208E, 0x2190, 0x2193,
                                0x21E5, 0x21E5, 0x2212, 0x2212, 0x2218, 0x221E, 0x2248, 0x2248, 0x2260, 0x2265,
                                0x2318, 0x2318, 0x25A0, 0x25CF, 0x26A0, 0x26A0, 0x2713, 0x2713, 0};

ImFont* add_face(const unsigned char* data, std::size_t size, float pixels) {
    ImFontConfig cfg;
    cfg.FontDataOwnedByAtlas = false;  // the bytes are static data of the program
    cfg.OversampleH = 2;
    cfg.OversampleV = 1;
    return ImGui::GetIO().Fonts->AddFontFromMemoryTTF(const_cast<unsigned char*>(data), static_cast<int>(size), pixels,
                                                      &cfg, kGlyphRanges);
}

ImVec4 rgb(int r, int g, int b, float a = 1.0f) { return ImVec4(r / 255.f, g / 255.f, b / 255.f, a); }

}  // namespace

void load_fonts(Theme* t, float pixel_ratio) {
    ImGuiIO& io = ImGui::GetIO();
    io.Fonts->Clear();
    t->body = add_face(tallyproof_font_regular, tallyproof_font_regular_size, 15.0f * pixel_ratio);
    t->strong = add_face(tallyproof_font_bold, tallyproof_font_bold_size, 15.0f * pixel_ratio);
    t->heading = add_face(tallyproof_font_bold, tallyproof_font_bold_size, 21.0f * pixel_ratio);
    io.FontDefault = t->body;
    t->font_scale = 1.0f / pixel_ratio;
    io.FontGlobalScale = t->font_scale;
    if (pixel_ratio >= 2.0f) {
        t->export_body = t->body;
        t->export_strong = t->strong;
        t->export_heading = t->heading;
    } else {
        t->export_body = add_face(tallyproof_font_regular, tallyproof_font_regular_size, 30.0f);
        t->export_strong = add_face(tallyproof_font_bold, tallyproof_font_bold_size, 30.0f);
        t->export_heading = add_face(tallyproof_font_bold, tallyproof_font_bold_size, 42.0f);
    }
}

Theme export_theme(const Theme& theme) {
    Theme e = theme;
    e.body = theme.export_body;
    e.strong = theme.export_strong;
    e.heading = theme.export_heading;
    e.font_scale = theme.export_body == theme.body ? theme.font_scale : 0.5f;
    return e;
}

void apply_palette(Theme* t, bool dark) {
    t->dark = dark;
    ImGuiStyle& st = ImGui::GetStyle();
    st = ImGuiStyle();
    if (dark) ImGui::StyleColorsDark(&st);
    else ImGui::StyleColorsLight(&st);
    st.WindowPadding = ImVec2(14, 12);
    st.FramePadding = ImVec2(8, 5);
    st.CellPadding = ImVec2(7, 4);
    st.ItemSpacing = ImVec2(9, 7);
    st.ItemInnerSpacing = ImVec2(6, 5);
    st.WindowRounding = 0;
    st.ChildRounding = 6;
    st.FrameRounding = 4;
    st.PopupRounding = 4;
    st.GrabRounding = 3;
    st.TabRounding = 4;
    st.WindowBorderSize = 0;
    st.ChildBorderSize = 1;
    st.ScrollbarSize = 13;
    if (t->touch) {
        // Tap targets of at least 44 CSS px (the common guidance for touch screens): a frame is
        // the font's 15 px plus twice the vertical padding.
        st.FramePadding = ImVec2(10, 14.5f);
        st.ItemSpacing = ImVec2(10, 8);
        st.ItemInnerSpacing = ImVec2(8, 6);
        st.ScrollbarSize = 18;
        st.GrabMinSize = 28;
    }
    // Every colour once, light and dark side by side: ImGui's style colours, then the theme's own.
    struct StyleColour { ImGuiCol slot; ImVec4 light, dark; };
    static const StyleColour kStyleColours[] = {
        {ImGuiCol_WindowBg,          rgb(246, 244, 239), rgb(24, 28, 36)},
        {ImGuiCol_ChildBg,           rgb(255, 255, 252), rgb(31, 36, 46)},
        {ImGuiCol_PopupBg,           rgb(255, 255, 252), rgb(36, 41, 52)},
        {ImGuiCol_Text,              rgb(31, 36, 48), rgb(234, 228, 214)},
        {ImGuiCol_TextDisabled,      rgb(98, 104, 116), rgb(160, 164, 172)},
        {ImGuiCol_Border,            rgb(219, 214, 203), rgb(58, 64, 78)},
        {ImGuiCol_FrameBg,           rgb(240, 237, 229), rgb(42, 48, 60)},
        {ImGuiCol_FrameBgHovered,    rgb(232, 240, 238), rgb(48, 64, 70)},
        {ImGuiCol_FrameBgActive,     rgb(220, 234, 231), rgb(52, 76, 80)},
        {ImGuiCol_TableHeaderBg,     rgb(232, 240, 238), rgb(40, 56, 60)},
        {ImGuiCol_TableRowBgAlt,     rgb(248, 247, 242), rgb(35, 40, 51)},
        {ImGuiCol_TableBorderStrong, rgb(200, 196, 186), rgb(70, 76, 90)},
        {ImGuiCol_TableBorderLight,  rgb(226, 222, 212), rgb(54, 60, 72)},
        {ImGuiCol_Button,            rgb(27, 127, 121, 0.14f), rgb(88, 190, 178, 0.18f)},
        {ImGuiCol_ButtonHovered,     rgb(27, 127, 121, 0.28f), rgb(88, 190, 178, 0.32f)},
        {ImGuiCol_ButtonActive,      rgb(27, 127, 121, 0.42f), rgb(88, 190, 178, 0.46f)},
        {ImGuiCol_Header,            rgb(27, 127, 121, 0.16f), rgb(88, 190, 178, 0.18f)},
        {ImGuiCol_HeaderHovered,     rgb(27, 127, 121, 0.26f), rgb(88, 190, 178, 0.28f)},
        {ImGuiCol_HeaderActive,      rgb(27, 127, 121, 0.36f), rgb(88, 190, 178, 0.38f)},
        {ImGuiCol_Tab,               rgb(232, 228, 218), rgb(40, 45, 56)},
        {ImGuiCol_TabHovered,        rgb(27, 127, 121, 0.30f), rgb(88, 190, 178, 0.32f)},
        {ImGuiCol_TabActive,         rgb(255, 255, 252), rgb(31, 36, 46)},
        {ImGuiCol_CheckMark,         rgb(27, 127, 121), rgb(108, 206, 192)},
        {ImGuiCol_SliderGrab,        rgb(27, 127, 121), rgb(108, 206, 192)},
        {ImGuiCol_NavHighlight,      rgb(72, 61, 160), rgb(168, 160, 240)},
        {ImGuiCol_ScrollbarBg,       rgb(246, 244, 239), ImVec4(0.02f, 0.02f, 0.02f, 0.53f)},
    };
    struct InkColour { ImU32 Theme::*field; ImU32 light, dark; };
    static const InkColour kInkColours[] = {
        {&Theme::paper,         IM_COL32(255, 255, 252, 255), IM_COL32(31, 36, 46, 255)},
        {&Theme::ink,           IM_COL32(31, 36, 48, 255), IM_COL32(234, 228, 214, 255)},
        {&Theme::muted,         IM_COL32(98, 104, 116, 255), IM_COL32(160, 164, 172, 255)},
        {&Theme::rule,          IM_COL32(200, 196, 186, 255), IM_COL32(84, 90, 104, 255)},
        {&Theme::grid,          IM_COL32(0, 0, 0, 18), IM_COL32(255, 255, 255, 20)},
        {&Theme::accent,        IM_COL32(22, 112, 106, 255), IM_COL32(108, 206, 192, 255)},
        {&Theme::curve,         IM_COL32(27, 127, 121, 255), IM_COL32(108, 206, 192, 255)},
        {&Theme::reject_fill,   IM_COL32(201, 98, 62, 70), IM_COL32(228, 132, 96, 80)},
        {&Theme::tail_fill,     IM_COL32(72, 61, 160, 90), IM_COL32(160, 150, 240, 90)},
        {&Theme::marker,        IM_COL32(72, 61, 160, 255), IM_COL32(178, 168, 250, 255)},
        {&Theme::warn_bg,       IM_COL32(253, 236, 220, 255), IM_COL32(72, 44, 34, 255)},
        {&Theme::warn_ink,      IM_COL32(134, 52, 18, 255), IM_COL32(246, 176, 140, 255)},
        {&Theme::ok_bg,         IM_COL32(226, 241, 236, 255), IM_COL32(30, 62, 60, 255)},
        {&Theme::ok_ink,        IM_COL32(18, 94, 82, 255), IM_COL32(150, 226, 210, 255)},
        {&Theme::more,          IM_COL32(196, 86, 48, 255), IM_COL32(232, 128, 92, 255)},
        {&Theme::fewer,         IM_COL32(38, 110, 160, 255), IM_COL32(98, 168, 226, 255)},
        {&Theme::neutral,       IM_COL32(176, 172, 162, 255), IM_COL32(110, 116, 128, 255)},
        {&Theme::expected_mark, IM_COL32(31, 36, 48, 255), IM_COL32(234, 228, 214, 255)},
        {&Theme::progress,      IM_COL32(27, 127, 121, 255), IM_COL32(108, 206, 192, 255)},
    };
    for (const StyleColour& s : kStyleColours) st.Colors[s.slot] = dark ? s.dark : s.light;
    for (const InkColour& i : kInkColours) t->*i.field = dark ? i.dark : i.light;
    t->clear = st.Colors[ImGuiCol_WindowBg];
}

ImU32 residual_colour(const Theme& t, double r) {
    if (!std::isfinite(r)) return t.neutral;
    // Blend from neutral to the direction colour over |r| = 0.5 .. 3 (3: beyond any usual flag).
    const float f = static_cast<float>(std::clamp((std::fabs(r) - 0.5) / 2.5, 0.0, 1.0));
    const ImVec4 a = ImGui::ColorConvertU32ToFloat4(t.neutral);
    const ImVec4 b = ImGui::ColorConvertU32ToFloat4(r > 0 ? t.more : t.fewer);
    return ImGui::ColorConvertFloat4ToU32(ImVec4(a.x + (b.x - a.x) * f, a.y + (b.y - a.y) * f, a.z + (b.z - a.z) * f, 1.0f));
}

}  // namespace tallyproof::web
