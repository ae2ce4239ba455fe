// Page text entry: the active text field's place and text go out to the page's input element;
// the element's text and selection come back and replace the field's buffer (through an ImGui
// input callback, the one way to change an active field), so the element is the one source of
// truth while it has focus and nothing is typed twice.
#include "text_entry.hpp"

#include <emscripten.h>
#include <imgui_internal.h>
#include <imgui_stdlib.h>

#include <algorithm>

EM_JS(void, tp_js_text_entry, (int on, float x, float y, float w, float h, int keys, const char* text, int sel_start, int sel_end), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.textEntry(!!on, x, y, w, h, keys, on ? UTF8ToString(text) : '', sel_start, sel_end);
});

namespace tallyproof::web {
namespace {

// What is being edited this frame, and what the page last heard (one page, one text entry).
struct TextEntry {
    ImGuiID active = 0, published = 0;
    ImVec2 min, max, published_min, published_max;
    FieldKeys keys = FieldKeys::text;
    std::string text;                 // the field's text when it became active
    int cursor = 0, selection_start = 0, selection_end = 0;  // UTF-8 byte offsets, as ImGui has them
    bool incoming = false;            // the element's text waits to replace the field's buffer
    std::string incoming_text;
    int incoming_start = 0, incoming_end = 0;
    bool end_requested = false;
};
TextEntry g_entry;

// UTF-16 code units in the first `bytes` bytes of UTF-8 `s` (the element counts in UTF-16).
int utf16_units(const std::string& s, int bytes) {
    int units = 0;
    for (int i = 0; i < bytes && i < static_cast<int>(s.size()); ++i) {
        const unsigned char c = static_cast<unsigned char>(s[i]);
        if ((c & 0xC0) != 0x80) units += c >= 0xF0 ? 2 : 1;
    }
    return units;
}

int take_incoming(ImGuiInputTextCallbackData* d) {
    if (d->EventFlag != ImGuiInputTextFlags_CallbackAlways) return 0;
    const ImGuiID id = *static_cast<const ImGuiID*>(d->UserData);
    if (id != g_entry.active && id != ImGui::GetActiveID()) return 0;
    if (g_entry.incoming && id == g_entry.active) {  // the field was active when the page sent its text
        g_entry.incoming = false;
        const std::string& t = g_entry.incoming_text;
        if (t.size() != static_cast<std::size_t>(d->BufTextLen) || t.compare(0, t.size(), d->Buf, d->BufTextLen) != 0) {
            d->DeleteChars(0, d->BufTextLen);
            d->InsertChars(0, t.data(), t.data() + t.size());
        }
        const int n = d->BufTextLen;
        d->SelectionStart = std::clamp(g_entry.incoming_start, 0, n);
        d->SelectionEnd = d->CursorPos = std::clamp(g_entry.incoming_end, 0, n);
    }
    g_entry.cursor = d->CursorPos;
    g_entry.selection_start = std::min(d->SelectionStart, d->SelectionEnd);
    g_entry.selection_end = std::max(d->SelectionStart, d->SelectionEnd);
    return 0;
}

}  // namespace

bool text_field(const char* id, std::string* text, FieldKeys keys, ImGuiInputTextFlags flags, const char* hint, ImVec2 size) {
    static_assert(sizeof(ImGuiID) == sizeof(unsigned int), "ImGuiID is passed through the callback's user data");
    ImGuiID item = ImGui::GetID(id);
    if (g_entry.end_requested && ImGui::GetActiveID() == item) {
        ImGui::ClearActiveID();
        g_entry.end_requested = false;
    }
    flags |= ImGuiInputTextFlags_CallbackAlways;
    const bool result = keys == FieldKeys::multiline ? ImGui::InputTextMultiline(id, text, size, flags, take_incoming, &item)
                                                     : ImGui::InputTextWithHint(id, hint ? hint : "", text, flags, take_incoming, &item);
    if (ImGui::IsItemActive()) {
        if (g_entry.active != item) {  // newly active: nothing typed for another field applies here
            g_entry.text = *text;
            g_entry.incoming = false;
        }
        g_entry.active = item;
        g_entry.min = ImGui::GetItemRectMin();
        g_entry.max = ImGui::GetItemRectMax();
        g_entry.keys = keys;
    }
    return result;
}

void publish_text_entry() {
    TextEntry& e = g_entry;
    // A field is active only if it was drawn active in this frame.
    const bool on = e.active != 0 && ImGui::GetActiveID() == e.active;
    if (!on) e.active = 0;
    e.end_requested = false;
    if (!on && e.published == 0) return;
    const bool moved = e.min.x != e.published_min.x || e.min.y != e.published_min.y || e.max.x != e.published_max.x ||
                       e.max.y != e.published_max.y;
    if (on && e.active == e.published && !moved) return;
    const bool fresh = e.active != e.published;
    e.published = e.active;
    e.published_min = e.min;
    e.published_max = e.max;
    // A field newly active sends its text and selection; one that only moved sends position alone (-1).
    tp_js_text_entry(on ? 1 : 0, e.min.x, e.min.y, e.max.x - e.min.x, e.max.y - e.min.y, static_cast<int>(e.keys),
                     e.text.c_str(), fresh ? utf16_units(e.text, e.selection_start) : -1,
                     fresh ? utf16_units(e.text, e.selection_end) : -1);
}

void receive_text_entry(const char* text, int length, int selection_start, int selection_end) {
    if (!text || length < 0 || g_entry.active == 0) return;
    g_entry.incoming = true;
    g_entry.incoming_text.assign(text, static_cast<std::size_t>(length));
    g_entry.incoming_start = selection_start;
    g_entry.incoming_end = selection_end;
}

void end_text_entry() { g_entry.end_requested = g_entry.active != 0; }

}  // namespace tallyproof::web
