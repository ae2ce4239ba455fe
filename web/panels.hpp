// Panels of the calculator screen. Each takes the state it shows; none owns data.
//
// Index: draw_screen (layout) · inputs (counts, model, test) · results (verdict, validity,
//        categories table, planning, write-up)
#pragma once
#include "app_state.hpp"
#include "text_entry.hpp"
#include "theme.hpp"

namespace tallyproof::web {

void draw_screen(AppState& state, const Theme& theme);  // the whole page, one ImGui window

// panel_inputs.cpp
void draw_counts_panel(AppState& state, const Theme& theme);
void draw_model_panel(AppState& state, const Theme& theme);
void draw_test_panel(AppState& state, const Theme& theme);

// panel_results.cpp
void draw_verdict_panel(AppState& state, const Theme& theme);
void draw_validity_panel(AppState& state, const Theme& theme);
void draw_categories_table(AppState& state, const Theme& theme);
void draw_planning_panel(AppState& state, const Theme& theme);
void draw_writeup_panel(AppState& state, const Theme& theme);

// panel_groups.cpp: the screen of many groups, and the banner over a group opened from it
void draw_groups_view(AppState& state, const Theme& theme);
void draw_reading_progress(AppState& state, const Theme& theme);  // a long text being read, with Cancel
void draw_funnel(AppState& state, const Theme& theme, ImVec2 size);  // the screen's funnel chart (also for images)
void draw_group_banner(AppState& state, const Theme& theme);

// Helpers shared by the panels
void section_title(const char* title, const Theme& theme);
void muted_wrapped(const Theme& theme, const char* fmt, ...);
void wrapped_text(const char* text);                          // wrapped to the window, only at spaces
void coloured_text(ImU32 colour, const char* text);           // wrapped_text in a theme colour
// The last item's abbreviations and symbols (glossary terms in `shown`) explained in a tooltip on
// hover or tap; the item is marked `name` (mark_explained) so tests can find it.
void explain_item(const char* name, const std::string& shown);
// main, each frame: a tap is pressed (`starts`) or released (`on`) this frame. The explained item a
// tap lands on keeps its explanation shown until the next tap (a finger leaves no hover behind).
void note_tap(bool starts, bool on);
void explained_text(const char* name, const std::string& text);  // wrapped_text + explain_item
bool compact_button(const char* label, const Theme& theme);   // SmallButton; a 44 px target on touch screens
void begin_menu_items(const Theme& theme);                    // popup and combo items 44 px apart on touch screens...
void end_menu_items(const Theme& theme);                      // ...until here
bool shows_sheet_row(const AppState& s);                      // the last file opened is a workbook of 2+ sheets
void draw_sheet_row(AppState& s, const Theme& t);              // its sheets, one to choose ("Sheet")
void flow_next(float width);       // SameLine if an item `width` wide still fits, else the next line
float radio_width(const char* label);                        // a RadioButton's or Checkbox's width
// A number in a text field (page text entry): true when a new value was committed (Enter or leaving it).
bool number_field(const char* id, double* value, const char* format, FieldKeys keys = FieldKeys::decimal);

}  // namespace tallyproof::web
