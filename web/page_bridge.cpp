// JavaScript side of the page bridge (EM_JS); see web/shell.html for the glue it talks to.
#include "page_bridge.hpp"

#include <emscripten.h>
#include <imgui.h>

EM_JS(void, tp_js_publish_result, (const char* text, const char* json, const char* doc), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.showResult(UTF8ToString(text), UTF8ToString(json), UTF8ToString(doc));
});
EM_JS(void, tp_js_publish_error, (const char* message), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.showError(UTF8ToString(message));
});
EM_JS(void, tp_js_copy, (const char* text), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.copy(UTF8ToString(text));
});
EM_JS(int, tp_js_prefers_dark, (), {
    return (window.matchMedia && window.matchMedia('(prefers-color-scheme: dark)').matches) ? 1 : 0;
});
EM_JS(double, tp_js_device_pixel_ratio, (), { return window.devicePixelRatio || 1; });
EM_JS(int, tp_js_stage_width, (), { return document.getElementById('tp-stage').clientWidth | 0; });
EM_JS(int, tp_js_stage_height, (), { return document.getElementById('tp-stage').clientHeight | 0; });
EM_JS(void, tp_js_progress, (double fraction, int running), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.progress(fraction, !!running);
});

EM_JS(void, tp_js_mark, (const char* name, float x, float y, float w, float h), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.widgets[UTF8ToString(name)] = { x: x, y: y, w: w, h: h };
});

namespace tallyproof::web {

void publish_result(const std::string& text, const std::string& json, const std::string& document) {
    tp_js_publish_result(text.c_str(), json.c_str(), document.c_str());
}
void publish_error(const std::string& message) { tp_js_publish_error(message.c_str()); }
void copy_text(const std::string& text) { tp_js_copy(text.c_str()); }
bool system_prefers_dark() { return tp_js_prefers_dark() != 0; }
double device_pixel_ratio() { return tp_js_device_pixel_ratio(); }
void stage_size(int* width, int* height) {
    *width = tp_js_stage_width();
    *height = tp_js_stage_height();
}
void set_progress(double fraction, bool running) { tp_js_progress(fraction, running ? 1 : 0); }
void mark_widget(const char* name) {
    const ImVec2 a = ImGui::GetItemRectMin(), b = ImGui::GetItemRectMax();
    tp_js_mark(name, a.x, a.y, b.x - a.x, b.y - a.y);
}

}  // namespace tallyproof::web
