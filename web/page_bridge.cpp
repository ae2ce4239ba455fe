// JavaScript side of the page bridge (EM_JS); see web/shell.html for the glue it talks to.
#include "page_bridge.hpp"

#include <emscripten.h>

EM_JS(void, tp_js_publish_result, (const char* text, const char* json), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.showResult(UTF8ToString(text), UTF8ToString(json));
});
EM_JS(void, tp_js_publish_error, (const char* message), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.showError(UTF8ToString(message));
});
EM_JS(double, tp_js_device_pixel_ratio, (), { return window.devicePixelRatio || 1; });
EM_JS(int, tp_js_stage_width, (), { return document.getElementById('tp-stage').clientWidth | 0; });
EM_JS(int, tp_js_stage_height, (), { return document.getElementById('tp-stage').clientHeight | 0; });

namespace tallyproof::web {

void publish_result(const std::string& text, const std::string& json) {
    tp_js_publish_result(text.c_str(), json.c_str());
}
void publish_error(const std::string& message) { tp_js_publish_error(message.c_str()); }
double device_pixel_ratio() { return tp_js_device_pixel_ratio(); }
void stage_size(int* width, int* height) {
    *width = tp_js_stage_width();
    *height = tp_js_stage_height();
}

}  // namespace tallyproof::web
