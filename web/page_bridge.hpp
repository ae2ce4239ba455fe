// The page bridge: the few calls between the wasm app and the HTML page's JavaScript glue
// (results mirrored into the live region; copy; theme; paste and wake-ups coming in).
#pragma once
#include <string>

namespace tallyproof::web {

void publish_result(const std::string& text, const std::string& json, const std::string& document);
void publish_error(const std::string& message);     // live region alert
void copy_text(const std::string& text);            // clipboard, with a fallback where refused
bool system_prefers_dark();
double device_pixel_ratio();
void stage_size(int* width, int* height);           // CSS pixels
void set_progress(double fraction, bool running);   // mirrors long work into the page (aria)
// Records where the last ImGui item sits (CSS pixels) under `name`, so keyboard-less tests and
// assistive tools can find controls on the canvas (tallyproofPage.widgets).
void mark_widget(const char* name);

}  // namespace tallyproof::web
