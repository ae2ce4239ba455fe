// The page bridge: the few calls between the wasm app and the HTML page's JavaScript glue
// (results mirrored into the live region; copy; theme; paste and wake-ups coming in).
#pragma once
#include <string>
#include <vector>

namespace tallyproof::web {

void publish_result(const std::string& text, const std::string& json, const std::string& document);
void publish_error(const std::string& message);     // live region alert
void publish_notice(const std::string& message);    // a confirmation (tallyproofPage.lastNotice, live region)
void copy_text(const std::string& text);            // clipboard, with a fallback where refused
bool system_prefers_dark();
double device_pixel_ratio();
void stage_size(int* width, int* height);           // CSS pixels
void set_progress(double fraction, bool running);   // mirrors long work into the page (aria)
void start_work_loop();                              // starts the page's task loop that calls tp_work
// Records where the last ImGui item sits (CSS pixels) under `name`, so keyboard-less tests and
// assistive tools can find controls on the canvas (tallyproofPage.widgets).
void mark_widget(const char* name);
void mark_area(const char* name, float x0, float y0, float x1, float y1);  // the same for a drawn shape
// mark_widget, and the text the item shows (tallyproofPage.explained[name]) for an item whose
// abbreviations the glossary explains in its tooltip; note_tooltip records the tooltip shown.
void mark_explained(const char* name, const std::string& shown);
void note_tooltip(const std::string& text);
// The Groups view's place, mirrored into the form view: whether the screen is shown, the order
// of its table (group indices, as JSON), and the banner of a group opened from it ("" when none).
void publish_groups_view(bool screen_shown, const std::string& order_json, const std::string& banner);
// The sheets of the workbook last opened, mirrored into the form view's sheet list: a JSON array
// of {name, hidden, empty}, and the sheet read (0-based); an empty array when no workbook is open.
void publish_sheets(const std::string& sheets_json, int chosen);

// Browser storage (localStorage, shared by the tabs; empty string when absent or refused; set is
// false when refused or full), this tab's own storage (sessionStorage), and the URL fragment.
std::string storage_get(const char* key);
bool storage_set(const char* key, const std::string& value);
void storage_remove(const char* key);
std::string tab_storage_get(const char* key);
bool tab_storage_set(const char* key, const std::string& value);
void tab_storage_remove(const char* key);
std::vector<std::string> storage_keys(const char* prefix);  // localStorage keys that begin with `prefix`
void watch_storage(const char* prefix);              // another tab's change of a key beginning `prefix` calls tp_storage_changed
double wall_clock_ms();                              // ms since 1970 (orders saves across tabs)
std::string location_fragment();                    // without '#'
std::string page_address();                         // the page's address without its fragment
std::string local_time_text();                      // e.g. "2026-12-01 22:40" in the user's time zone

// Files leaving the page (never uploaded): a text download, and a chart image (RGBA rows
// bottom-up, as glReadPixels gives them) saved, copied or kept for printing.
void download_text(const char* filename, const char* mime, const std::string& text);
void download_bytes(const char* filename, const char* mime, const std::string& bytes);  // a binary file (.xlsx)
enum class ImagePurpose { download = 0, copy = 1, print = 2 };
void deliver_image(const unsigned char* rgba, int width, int height, const char* name, ImagePurpose purpose);
// The print layout (text and the chart images delivered for printing); then the browser's print
// dialog when `then_print` (the menu item), not when the browser is already printing.
// `charts`: the chart images (names as delivered, comma-separated) printed under the text.
void print_report(const std::string& text, const std::string& title, bool then_print, const std::string& footnote = "",
                  const std::string& charts = "tallyproof-curve.png,tallyproof-bars.png");

// Touch screens and the page's own file and clipboard controls.
bool has_touch_screen();                            // a coarse pointer (phone, tablet): 44 px tap targets
void choose_file();                                 // opens the browser's file picker (read locally, never uploaded)
void paste_from_clipboard();                        // reads the clipboard (asks the browser), else offers a box to paste into

}  // namespace tallyproof::web
