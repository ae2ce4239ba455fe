// JavaScript side of the page bridge (EM_JS); see web/shell.html for the glue it talks to.
#include "page_bridge.hpp"

#include <emscripten.h>
#include <imgui.h>

#include <algorithm>
#include <cstdlib>

EM_JS(void, tp_js_publish_result, (const char* text, const char* json, const char* doc), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.showResult(UTF8ToString(text), UTF8ToString(json), UTF8ToString(doc));
});
EM_JS(void, tp_js_publish_error, (const char* message), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.showError(UTF8ToString(message));
});
EM_JS(void, tp_js_notice, (const char* message), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.showNotice(UTF8ToString(message));
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

EM_JS(void, tp_js_start_work, (), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.startWork();
});

EM_JS(void, tp_js_mark, (const char* name, float x, float y, float w, float h), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.widgets[UTF8ToString(name)] = { x: x, y: y, w: w, h: h };
});

EM_JS(void, tp_js_explained, (const char* name, const char* shown), {
    if (globalThis.tallyproofPage) (globalThis.tallyproofPage.explained = globalThis.tallyproofPage.explained || {})[UTF8ToString(name)] = UTF8ToString(shown);
});
EM_JS(void, tp_js_tooltip, (const char* text), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.tooltip = UTF8ToString(text);
});

EM_JS(void, tp_js_groups_view, (int shown, const char* order, const char* banner), {
    if (globalThis.tallyproofPage && globalThis.tallyproofPage.showGroupsView)
        globalThis.tallyproofPage.showGroupsView(!!shown, UTF8ToString(order), UTF8ToString(banner));
});

EM_JS(void, tp_js_sheets, (const char* sheets, int chosen), {
    if (globalThis.tallyproofPage && globalThis.tallyproofPage.showSheets)
        globalThis.tallyproofPage.showSheets(JSON.parse(UTF8ToString(sheets)), chosen);
});

EM_JS(char*, tp_js_storage_get, (const char* key), {
    var v = null;
    try { v = window.localStorage.getItem(UTF8ToString(key)); } catch (e) { v = null; }
    v = v || '';
    var n = lengthBytesUTF8(v) + 1, p = _malloc(n);
    stringToUTF8(v, p, n);
    return p;
});
EM_JS(int, tp_js_storage_set, (const char* key, const char* value), {
    try { window.localStorage.setItem(UTF8ToString(key), UTF8ToString(value)); return 1; } catch (e) { return 0; /* refused or full */ }
});
// This tab's own slot (sessionStorage survives the tab's reloads, not other tabs).
EM_JS(char*, tp_js_tab_get, (const char* key), {
    var v = null;
    try { v = window.sessionStorage.getItem(UTF8ToString(key)); } catch (e) { v = null; }
    v = v || '';
    var n = lengthBytesUTF8(v) + 1, p = _malloc(n);
    stringToUTF8(v, p, n);
    return p;
});
EM_JS(int, tp_js_tab_set, (const char* key, const char* value), {
    try { window.sessionStorage.setItem(UTF8ToString(key), UTF8ToString(value)); return 1; } catch (e) { return 0; }
});
EM_JS(void, tp_js_tab_remove, (const char* key), {
    try { window.sessionStorage.removeItem(UTF8ToString(key)); } catch (e) { }
});
// Another tab changed a localStorage key that begins with `prefix`: the app is told (tp_storage_changed).
EM_JS(void, tp_js_watch_storage, (const char* prefix), {
    var k = UTF8ToString(prefix);
    window.addEventListener('storage', function (e) { if (e.key === null || e.key.indexOf(k) === 0) Module._tp_storage_changed(); });
});
// The localStorage keys that begin with `prefix`, one per line (none when refused).
EM_JS(char*, tp_js_storage_keys, (const char* prefix), {
    var k = UTF8ToString(prefix), out = [];
    try {
        for (var i = 0; i < window.localStorage.length; i++) {
            var key = window.localStorage.key(i);
            if (key !== null && key.indexOf(k) === 0 && key.indexOf('\n') < 0) out.push(key);
        }
    } catch (e) { out = []; }
    var v = out.join('\n'), n = lengthBytesUTF8(v) + 1, p = _malloc(n);
    stringToUTF8(v, p, n);
    return p;
});
EM_JS(double, tp_js_now_ms, (), { return Date.now(); });
EM_JS(void, tp_js_storage_remove, (const char* key), {
    try { window.localStorage.removeItem(UTF8ToString(key)); } catch (e) { }
});
EM_JS(char*, tp_js_fragment, (), {
    var v = (location.hash || '').replace(/^#/, '');
    var n = lengthBytesUTF8(v) + 1, p = _malloc(n);
    stringToUTF8(v, p, n);
    return p;
});
EM_JS(char*, tp_js_address, (), {
    var v = location.href.split('#')[0];
    var n = lengthBytesUTF8(v) + 1, p = _malloc(n);
    stringToUTF8(v, p, n);
    return p;
});
EM_JS(char*, tp_js_time, (), {
    var d = new Date(), z = function (x) { return (x < 10 ? '0' : '') + x; };
    var v = d.getFullYear() + '-' + z(d.getMonth() + 1) + '-' + z(d.getDate()) + ' ' + z(d.getHours()) + ':' + z(d.getMinutes());
    var n = lengthBytesUTF8(v) + 1, p = _malloc(n);
    stringToUTF8(v, p, n);
    return p;
});
EM_JS(void, tp_js_download, (const char* name, const char* mime, const char* text), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.download(UTF8ToString(name), UTF8ToString(mime), UTF8ToString(text));
});
EM_JS(void, tp_js_download_bytes, (const char* name, const char* mime, const unsigned char* bytes, int length), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.downloadBytes(UTF8ToString(name), UTF8ToString(mime), HEAPU8.slice(bytes, bytes + length));
});
EM_JS(void, tp_js_image, (const unsigned char* rgba, int w, int h, const char* name, int purpose), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.image(HEAPU8.slice(rgba, rgba + w * h * 4), w, h, UTF8ToString(name), purpose);
});
EM_JS(void, tp_js_print, (const char* text, const char* title, int then_print, const char* footnote, const char* charts), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.printReport(UTF8ToString(text), UTF8ToString(title), !!then_print, UTF8ToString(footnote),
                                                                         UTF8ToString(charts).split(','));
});
EM_JS(int, tp_js_touch_screen, (), {
    return (window.matchMedia && window.matchMedia('(pointer: coarse)').matches) ? 1 : 0;
});
EM_JS(void, tp_js_choose_file, (), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.chooseFile();
});
EM_JS(void, tp_js_paste_clipboard, (), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.pasteFromClipboard();
});

namespace tallyproof::web {
namespace {
std::string take(char* p) {
    std::string s = p ? p : "";
    free(p);
    return s;
}
}  // namespace

void publish_result(const std::string& text, const std::string& json, const std::string& document) {
    tp_js_publish_result(text.c_str(), json.c_str(), document.c_str());
}
void publish_error(const std::string& message) { tp_js_publish_error(message.c_str()); }
void publish_notice(const std::string& message) { tp_js_notice(message.c_str()); }
void copy_text(const std::string& text) { tp_js_copy(text.c_str()); }
bool system_prefers_dark() { return tp_js_prefers_dark() != 0; }
double device_pixel_ratio() { return tp_js_device_pixel_ratio(); }
void stage_size(int* width, int* height) {
    *width = tp_js_stage_width();
    *height = tp_js_stage_height();
}
void set_progress(double fraction, bool running) { tp_js_progress(fraction, running ? 1 : 0); }
void start_work_loop() { tp_js_start_work(); }
void mark_widget(const char* name) {
    const ImVec2 a = ImGui::GetItemRectMin(), b = ImGui::GetItemRectMax();
    tp_js_mark(name, a.x, a.y, b.x - a.x, b.y - a.y);
}

void mark_area(const char* name, float x0, float y0, float x1, float y1) { tp_js_mark(name, x0, y0, x1 - x0, y1 - y0); }
void mark_explained(const char* name, const std::string& shown) {
    mark_widget(name);
    tp_js_explained(name, shown.c_str());
}
void publish_groups_view(bool screen_shown, const std::string& order_json, const std::string& banner) {
    tp_js_groups_view(screen_shown ? 1 : 0, order_json.c_str(), banner.c_str());
}
void publish_sheets(const std::string& sheets_json, int chosen) { tp_js_sheets(sheets_json.c_str(), chosen); }
void note_tooltip(const std::string& text) { tp_js_tooltip(text.c_str()); }  // each frame it shows

std::string storage_get(const char* key) { return take(tp_js_storage_get(key)); }
bool storage_set(const char* key, const std::string& value) { return tp_js_storage_set(key, value.c_str()) != 0; }
std::string tab_storage_get(const char* key) { return take(tp_js_tab_get(key)); }
bool tab_storage_set(const char* key, const std::string& value) { return tp_js_tab_set(key, value.c_str()) != 0; }
void tab_storage_remove(const char* key) { tp_js_tab_remove(key); }
void watch_storage(const char* prefix) { tp_js_watch_storage(prefix); }
std::vector<std::string> storage_keys(const char* prefix) {
    std::vector<std::string> keys;
    const std::string all = take(tp_js_storage_keys(prefix));
    std::size_t start = 0;
    while (start < all.size()) {
        const std::size_t end = std::min(all.find('\n', start), all.size());
        keys.push_back(all.substr(start, end - start));
        start = end + 1;
    }
    return keys;
}
double wall_clock_ms() { return tp_js_now_ms(); }
void storage_remove(const char* key) { tp_js_storage_remove(key); }
std::string location_fragment() { return take(tp_js_fragment()); }
std::string page_address() { return take(tp_js_address()); }
std::string local_time_text() { return take(tp_js_time()); }
void download_text(const char* filename, const char* mime, const std::string& text) { tp_js_download(filename, mime, text.c_str()); }
void download_bytes(const char* filename, const char* mime, const std::string& bytes) {
    tp_js_download_bytes(filename, mime, reinterpret_cast<const unsigned char*>(bytes.data()), static_cast<int>(bytes.size()));
}
void deliver_image(const unsigned char* rgba, int width, int height, const char* name, ImagePurpose purpose) {
    tp_js_image(rgba, width, height, name, static_cast<int>(purpose));
}
void print_report(const std::string& text, const std::string& title, bool then_print, const std::string& footnote,
                  const std::string& charts) {
    tp_js_print(text.c_str(), title.c_str(), then_print ? 1 : 0, footnote.c_str(), charts.c_str());
}
bool has_touch_screen() { return tp_js_touch_screen() != 0; }
void choose_file() { tp_js_choose_file(); }
void paste_from_clipboard() { tp_js_paste_clipboard(); }

}  // namespace tallyproof::web
