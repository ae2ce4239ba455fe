// The page object shared by the frame loop (main.cpp) and the entry points the JavaScript glue
// calls (page_entry.cpp): the SDL window and GL context, the app state, the theme, touch input.
#pragma once
#include <SDL.h>
#include <imgui.h>

#include <vector>

#include "app_state.hpp"
#include "theme.hpp"

namespace tallyproof::web {


// One finger on a touch screen. A tap is a click where the finger lifted; a drag scrolls the
// table or panel under it (the browser's own scrolling is off over the canvas); a finger held
// still for a moment before moving presses and drags (sliders, text selection).
struct Touch {
    enum class Mode { none, pending, scrolling, pressing };
    Mode mode = Mode::none;
    SDL_FingerID finger = 0;
    ImVec2 start, pos;
    double down_ms = 0;
    ImVec2 scroll;             // distance to scroll the panel under the finger by, next frame
    int tap_frames = 0;        // 2: press this frame; 1: release this frame
    bool drives_mouse = false; // ImGui's mouse follows the finger (until a real mouse moves)
};

struct Page {
    SDL_Window* window = nullptr;
    SDL_GLContext gl = nullptr;
    AppState state;
    Theme theme;
    int width = 0, height = 0;
    bool paused = false;
    bool canvas_hidden = false;  // the form view covers the canvas: state moves on, nothing is drawn
    double last_job_frame_ms = 0;  // when a frame last showed a running job's progress
    std::vector<SDL_Event> deferred;  // events held back to the next frame (see take_events)
    Touch touch;
};

extern Page* g_page;  // the one page; owned by main, reached from the browser's callbacks


void want_frames(Page& p, int n);                         // draw at least n more frames (wakes the loop)
void frame();                                             // one frame of the loop
void render_chart_export(Page& p, const ChartExport& e);  // one chart alone, off screen, handed to the page
std::string print_text(const AppState& s);                // the print layout's text
std::string print_title(const AppState& s);
bool prints_screen(const AppState& s);                    // the Groups view's table is on screen: print the screen
const char* chart_image_name(ResultTab chart);            // "tallyproof-curve.png", ...
std::string print_charts(const AppState& s);              // the chart images the print shows, comma-separated
void lay_out_print(const AppState& s, bool then_print);   // the print layout (text, title, symbols, charts), then print

}  // namespace tallyproof::web
