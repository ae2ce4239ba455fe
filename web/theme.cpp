// Tallyproof's own palette: warm paper, dark slate ink, a teal accent, clay for the rejection
// region and indigo for the observed statistic.
#include "theme.hpp"

#include <cstddef>

extern const unsigned char tallyproof_font_regular[];
extern const std::size_t tallyproof_font_regular_size;
extern const unsigned char tallyproof_font_bold[];
extern const std::size_t tallyproof_font_bold_size;

namespace tallyproof::web {
namespace {

// Latin, Greek, punctuation, super/subscripts, arrows, maths operators, geometric shapes.
const ImWchar kGlyphRanges[] = {0x0020, 0x017F, 0x0370, 0x03FF, 0x2010, 0x205E, 0x2070, 0x209F,
                                0x2190, 0x21FF, 0x2200, 0x22FF, 0x2318, 0x2318, 0x25A0, 0x25FF, 0};

ImFont* add_face(const unsigned char* data, std::size_t size, float pixels) {
    ImFontConfig cfg;
    cfg.FontDataOwnedByAtlas = false;  // the bytes are static data of the program
    cfg.OversampleH = 2;
    cfg.OversampleV = 1;
    return ImGui::GetIO().Fonts->AddFontFromMemoryTTF(const_cast<unsigned char*>(data), static_cast<int>(size),
                                                      pixels, &cfg, kGlyphRanges);
}

ImVec4 rgb(int r, int g, int b, float a = 1.0f) { return ImVec4(r / 255.f, g / 255.f, b / 255.f, a); }

}  // namespace

Theme make_theme(float pixel_ratio) {
    ImGuiIO& io = ImGui::GetIO();
    io.Fonts->Clear();
    Theme t;
    t.body = add_face(tallyproof_font_regular, tallyproof_font_regular_size, 15.0f * pixel_ratio);
    t.strong = add_face(tallyproof_font_bold, tallyproof_font_bold_size, 15.0f * pixel_ratio);
    t.heading = add_face(tallyproof_font_bold, tallyproof_font_bold_size, 21.0f * pixel_ratio);
    io.FontDefault = t.body;
    io.FontGlobalScale = 1.0f / pixel_ratio;

    ImGuiStyle& st = ImGui::GetStyle();
    st = ImGuiStyle();
    ImGui::StyleColorsLight(&st);
    st.WindowPadding = ImVec2(16, 14);
    st.FramePadding = ImVec2(8, 5);
    st.CellPadding = ImVec2(8, 4);
    st.ItemSpacing = ImVec2(10, 8);
    st.WindowRounding = 0;
    st.ChildRounding = 6;
    st.FrameRounding = 4;
    st.WindowBorderSize = 0;
    st.ChildBorderSize = 1;
    ImVec4* c = st.Colors;
    c[ImGuiCol_WindowBg] = rgb(246, 244, 239);
    c[ImGuiCol_ChildBg] = rgb(255, 255, 252);
    c[ImGuiCol_Text] = rgb(31, 36, 48);
    c[ImGuiCol_TextDisabled] = rgb(104, 110, 122);
    c[ImGuiCol_Border] = rgb(219, 214, 203);
    c[ImGuiCol_TableHeaderBg] = rgb(232, 240, 238);
    c[ImGuiCol_TableRowBgAlt] = rgb(247, 246, 241);
    c[ImGuiCol_TableBorderStrong] = rgb(200, 196, 186);
    c[ImGuiCol_TableBorderLight] = rgb(226, 222, 212);
    c[ImGuiCol_Button] = rgb(27, 127, 121, 0.14f);
    c[ImGuiCol_ButtonHovered] = rgb(27, 127, 121, 0.28f);
    c[ImGuiCol_ButtonActive] = rgb(27, 127, 121, 0.42f);
    c[ImGuiCol_Header] = rgb(27, 127, 121, 0.16f);
    c[ImGuiCol_ScrollbarBg] = rgb(246, 244, 239);

    t.paper = IM_COL32(255, 255, 252, 255);
    t.ink = IM_COL32(31, 36, 48, 255);
    t.muted = IM_COL32(104, 110, 122, 255);
    t.rule = IM_COL32(200, 196, 186, 255);
    t.accent = IM_COL32(27, 127, 121, 255);
    t.accent_soft = IM_COL32(27, 127, 121, 40);
    t.curve = IM_COL32(27, 127, 121, 255);
    t.reject_fill = IM_COL32(201, 98, 62, 70);
    t.tail_fill = IM_COL32(72, 61, 160, 90);
    t.marker = IM_COL32(72, 61, 160, 255);
    t.warn_bg = IM_COL32(253, 236, 220, 255);
    t.warn_ink = IM_COL32(134, 52, 18, 255);
    return t;
}

}  // namespace tallyproof::web
