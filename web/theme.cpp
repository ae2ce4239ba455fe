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
const ImWchar kGlyphRanges[] = {0x0020, 0x017F, 0x0391, 0x03C9, 0x2010, 0x2033, 0x2070, 0x208E, 0x2190, 0x2193,
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
    ImVec4* c = st.Colors;
    if (!dark) {
        t->clear = rgb(246, 244, 239);
        c[ImGuiCol_WindowBg] = t->clear;
        c[ImGuiCol_ChildBg] = rgb(255, 255, 252);
        c[ImGuiCol_PopupBg] = rgb(255, 255, 252);
        c[ImGuiCol_Text] = rgb(31, 36, 48);
        c[ImGuiCol_TextDisabled] = rgb(98, 104, 116);
        c[ImGuiCol_Border] = rgb(219, 214, 203);
        c[ImGuiCol_FrameBg] = rgb(240, 237, 229);
        c[ImGuiCol_FrameBgHovered] = rgb(232, 240, 238);
        c[ImGuiCol_FrameBgActive] = rgb(220, 234, 231);
        c[ImGuiCol_TableHeaderBg] = rgb(232, 240, 238);
        c[ImGuiCol_TableRowBgAlt] = rgb(248, 247, 242);
        c[ImGuiCol_TableBorderStrong] = rgb(200, 196, 186);
        c[ImGuiCol_TableBorderLight] = rgb(226, 222, 212);
        c[ImGuiCol_Button] = rgb(27, 127, 121, 0.14f);
        c[ImGuiCol_ButtonHovered] = rgb(27, 127, 121, 0.28f);
        c[ImGuiCol_ButtonActive] = rgb(27, 127, 121, 0.42f);
        c[ImGuiCol_Header] = rgb(27, 127, 121, 0.16f);
        c[ImGuiCol_HeaderHovered] = rgb(27, 127, 121, 0.26f);
        c[ImGuiCol_HeaderActive] = rgb(27, 127, 121, 0.36f);
        c[ImGuiCol_Tab] = rgb(232, 228, 218);
        c[ImGuiCol_TabHovered] = rgb(27, 127, 121, 0.30f);
        c[ImGuiCol_TabActive] = rgb(255, 255, 252);
        c[ImGuiCol_CheckMark] = rgb(27, 127, 121);
        c[ImGuiCol_SliderGrab] = rgb(27, 127, 121);
        c[ImGuiCol_NavHighlight] = rgb(72, 61, 160);
        c[ImGuiCol_ScrollbarBg] = rgb(246, 244, 239);
        t->paper = IM_COL32(255, 255, 252, 255);
        t->ink = IM_COL32(31, 36, 48, 255);
        t->muted = IM_COL32(98, 104, 116, 255);
        t->rule = IM_COL32(200, 196, 186, 255);
        t->grid = IM_COL32(0, 0, 0, 18);
        t->accent = IM_COL32(22, 112, 106, 255);
        t->curve = IM_COL32(27, 127, 121, 255);
        t->reject_fill = IM_COL32(201, 98, 62, 70);
        t->tail_fill = IM_COL32(72, 61, 160, 90);
        t->marker = IM_COL32(72, 61, 160, 255);
        t->warn_bg = IM_COL32(253, 236, 220, 255);
        t->warn_ink = IM_COL32(134, 52, 18, 255);
        t->ok_bg = IM_COL32(226, 241, 236, 255);
        t->ok_ink = IM_COL32(18, 94, 82, 255);
        t->more = IM_COL32(196, 86, 48, 255);
        t->fewer = IM_COL32(38, 110, 160, 255);
        t->neutral = IM_COL32(176, 172, 162, 255);
        t->expected_mark = IM_COL32(31, 36, 48, 255);
        t->progress = IM_COL32(27, 127, 121, 255);
    } else {
        t->clear = rgb(24, 28, 36);
        c[ImGuiCol_WindowBg] = t->clear;
        c[ImGuiCol_ChildBg] = rgb(31, 36, 46);
        c[ImGuiCol_PopupBg] = rgb(36, 41, 52);
        c[ImGuiCol_Text] = rgb(234, 228, 214);
        c[ImGuiCol_TextDisabled] = rgb(160, 164, 172);
        c[ImGuiCol_Border] = rgb(58, 64, 78);
        c[ImGuiCol_FrameBg] = rgb(42, 48, 60);
        c[ImGuiCol_FrameBgHovered] = rgb(48, 64, 70);
        c[ImGuiCol_FrameBgActive] = rgb(52, 76, 80);
        c[ImGuiCol_TableHeaderBg] = rgb(40, 56, 60);
        c[ImGuiCol_TableRowBgAlt] = rgb(35, 40, 51);
        c[ImGuiCol_TableBorderStrong] = rgb(70, 76, 90);
        c[ImGuiCol_TableBorderLight] = rgb(54, 60, 72);
        c[ImGuiCol_Button] = rgb(88, 190, 178, 0.18f);
        c[ImGuiCol_ButtonHovered] = rgb(88, 190, 178, 0.32f);
        c[ImGuiCol_ButtonActive] = rgb(88, 190, 178, 0.46f);
        c[ImGuiCol_Header] = rgb(88, 190, 178, 0.18f);
        c[ImGuiCol_HeaderHovered] = rgb(88, 190, 178, 0.28f);
        c[ImGuiCol_HeaderActive] = rgb(88, 190, 178, 0.38f);
        c[ImGuiCol_Tab] = rgb(40, 45, 56);
        c[ImGuiCol_TabHovered] = rgb(88, 190, 178, 0.32f);
        c[ImGuiCol_TabActive] = rgb(31, 36, 46);
        c[ImGuiCol_CheckMark] = rgb(108, 206, 192);
        c[ImGuiCol_SliderGrab] = rgb(108, 206, 192);
        c[ImGuiCol_NavHighlight] = rgb(168, 160, 240);
        t->paper = IM_COL32(31, 36, 46, 255);
        t->ink = IM_COL32(234, 228, 214, 255);
        t->muted = IM_COL32(160, 164, 172, 255);
        t->rule = IM_COL32(84, 90, 104, 255);
        t->grid = IM_COL32(255, 255, 255, 20);
        t->accent = IM_COL32(108, 206, 192, 255);
        t->curve = IM_COL32(108, 206, 192, 255);
        t->reject_fill = IM_COL32(228, 132, 96, 80);
        t->tail_fill = IM_COL32(160, 150, 240, 90);
        t->marker = IM_COL32(178, 168, 250, 255);
        t->warn_bg = IM_COL32(72, 44, 34, 255);
        t->warn_ink = IM_COL32(246, 176, 140, 255);
        t->ok_bg = IM_COL32(30, 62, 60, 255);
        t->ok_ink = IM_COL32(150, 226, 210, 255);
        t->more = IM_COL32(232, 128, 92, 255);
        t->fewer = IM_COL32(98, 168, 226, 255);
        t->neutral = IM_COL32(110, 116, 128, 255);
        t->expected_mark = IM_COL32(234, 228, 214, 255);
        t->progress = IM_COL32(108, 206, 192, 255);
    }
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
