// Tab on the canvas: Tab and Shift+Tab walk every control in the order it is drawn (counts
// table, expected mix, test settings, result views, menus), with ImGui's navigation frame on the
// control; a text field reached by Tab opens for typing. Dear ImGui 1.86 tabs only through text
// fields, so the controls are collected through ImGui's item hook (IMGUI_ENABLE_TEST_ENGINE's
// ItemAdd, which sees every item with an id as it is submitted) and the focus is set directly.
// Past the last control (or before the first) Tab leaves the canvas for the rest of the page.
#pragma once

namespace tallyproof::web {

void begin_control_walk();              // before ImGui::NewFrame: the controls drawn last frame become the walk
bool tab_leaves_canvas(bool backward);  // the focus is on the last (first) control: the browser moves focus on
void queue_tab(bool backward);          // a Tab key seen by the canvas (applied by apply_tab)
void queue_enter();                     // Enter: presses the focused control when it is not a text field
void apply_tab();                       // after ImGui::NewFrame: moves the focus, scrolls it into view
int control_count();                    // controls drawn in the last frame (tests)
void publish_focus();                   // after drawing: tallyproofPage.focusRect, where the focus frame is (or null)

}  // namespace tallyproof::web
