// The page bridge: the few calls between the wasm app and the HTML page's JavaScript glue
// (results mirrored into the live region; paste and wake-ups coming in).
#pragma once
#include <string>

namespace tallyproof::web {

void publish_result(const std::string& text, const std::string& json);  // live region + data
void publish_error(const std::string& message);                          // live region alert
double device_pixel_ratio();
void stage_size(int* width, int* height);                                // CSS pixels

}  // namespace tallyproof::web
