// Clipped-text audit (clip_audit.hpp). ImGui draws Text() glyphs whole and lets the scissor
// rectangle cut them, so a glyph quad that reaches past its command's clip rectangle is text
// the reader sees cut. Glyph quads are told from filled shapes by their texture coordinates:
// shapes sample the font atlas's white pixel, glyphs do not.
#include "clip_audit.hpp"

#include <emscripten.h>
#include <imgui.h>
#include <imgui_internal.h>

#include <cstdio>
#include <string>

EM_JS(void, tp_js_publish_clipped, (const char* json), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.clipped = JSON.parse(UTF8ToString(json));
});

namespace tallyproof::web {
namespace {

bool g_requested = false;

std::string json_text(const char* s) {
    std::string out = "\"";
    for (; s && *s; ++s) {
        const char c = *s;
        if (c == '"' || c == '\\') { out += '\\'; out += c; }
        else if (static_cast<unsigned char>(c) < 0x20) out += ' ';
        else out += c;
    }
    return out + "\"";
}

}  // namespace

void request_clip_audit() { g_requested = true; }

void run_clip_audit() {
    if (!g_requested) return;
    g_requested = false;
    const ImDrawData* data = ImGui::GetDrawData();
    if (!data) return;
    const ImVec2 white = ImGui::GetIO().Fonts->TexUvWhitePixel;
    const float slack = 1.0f;  // anti-aliasing fringe and rounding, in CSS px
    int glyphs = 0, cut = 0;
    std::string samples, windows;
    int sample_count = 0;
    for (int l = 0; l < data->CmdListsCount; ++l) {
        const ImDrawList* list = data->CmdLists[l];
        ImGuiWindow* window = list->_OwnerName ? ImGui::FindWindowByName(list->_OwnerName) : nullptr;
        // Text past an edge that the window, or a window it sits in, scrolls across is not cut:
        // the reader scrolls to it.
        bool scroll_x = false, scroll_y = false;
        for (ImGuiWindow* w = window; w; w = w->ParentWindow) {
            scroll_x = scroll_x || w->ScrollMax.x > 0.0f;
            scroll_y = scroll_y || w->ScrollMax.y > 0.0f;
        }
        int cut_here = 0;
        for (const ImDrawCmd& cmd : list->CmdBuffer) {
            if (cmd.UserCallback) continue;
            const ImVec4 clip = cmd.ClipRect;
            // Indices come in triangles; a glyph is two triangles over four vertices. Check each
            // triangle whose first vertex samples the font (not the white pixel).
            for (unsigned int i = 0; i + 2 < cmd.ElemCount; i += 3) {
                const ImDrawVert* v[3];
                for (int j = 0; j < 3; ++j) v[j] = &list->VtxBuffer[static_cast<int>(cmd.VtxOffset + list->IdxBuffer[static_cast<int>(cmd.IdxOffset + i + j)])];
                bool glyph = true;
                for (int j = 0; j < 3; ++j)
                    if (v[j]->uv.x == white.x && v[j]->uv.y == white.y) glyph = false;
                if (!glyph) continue;
                if ((i / 3) % 2 == 0) ++glyphs;
                float x0 = v[0]->pos.x, x1 = x0, y0 = v[0]->pos.y, y1 = y0;
                for (int j = 1; j < 3; ++j) {
                    x0 = ImMin(x0, v[j]->pos.x); x1 = ImMax(x1, v[j]->pos.x);
                    y0 = ImMin(y0, v[j]->pos.y); y1 = ImMax(y1, v[j]->pos.y);
                }
                // Wholly outside: not drawn at all (ImGui skips most of these itself).
                if (x1 <= clip.x || x0 >= clip.z || y1 <= clip.y || y0 >= clip.w) continue;
                const bool past_x = x0 < clip.x - slack || x1 > clip.z + slack;
                const bool past_y = y0 < clip.y - slack || y1 > clip.w + slack;
                if ((past_x && !scroll_x) || (past_y && !scroll_y)) {
                    ++cut; ++cut_here;
                    if (sample_count < 40) {
                        char b[200];
                        std::snprintf(b, sizeof b, "%s{\"window\":%s,\"x\":%.1f,\"y\":%.1f,\"clip\":[%.1f,%.1f,%.1f,%.1f]}",
                                      sample_count ? "," : "", json_text(list->_OwnerName).c_str(), x0, y0, clip.x, clip.y, clip.z, clip.w);
                        samples += b;
                        ++sample_count;
                    }
                }
            }
        }
        if (cut_here) windows += (windows.empty() ? "" : ",") + json_text(list->_OwnerName);
    }
    // Windows that scroll sideways: on a phone only wide tables should (a whole panel that
    // scrolls sideways hides its ends as surely as a cut would).
    std::string sideways;
    for (ImGuiWindow* w : GImGui->Windows)
        if (w->Active && w->ScrollMax.x > 0.0f) sideways += (sideways.empty() ? "" : ",") + json_text(w->Name);
    const std::string json = "{\"glyphs\":" + std::to_string(glyphs) + ",\"cut\":" + std::to_string(cut) +
                             ",\"windows\":[" + windows + "],\"sideways\":[" + sideways + "],\"samples\":[" + samples + "]}";
    tp_js_publish_clipped(json.c_str());
}

}  // namespace tallyproof::web
