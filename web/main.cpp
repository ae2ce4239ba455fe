// The page's entry point: SDL2 window with a WebGL2 context, Dear ImGui, and a frame loop that
// draws only while there is input or work: when idle the loop is paused (no CPU) until the
// page glue reports input (tp_wake).
#include <SDL.h>
#include <SDL_opengles2.h>
#include <emscripten.h>
#include <emscripten/html5.h>
#include <imgui.h>
#include <imgui_impl_opengl3.h>
#include <imgui_impl_sdl.h>
#include <imgui_internal.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <string>
#include <string_view>

#include <cfloat>
#include <vector>

#include "app_state.hpp"
#include "bar_chart.hpp"
#include "density_plot.hpp"
#include "glossary.hpp"
#include "clip_audit.hpp"
#include "keyboard_walk.hpp"
#include "number_reading.hpp"
#include "merge_categories.hpp"
#include "page.hpp"
#include "page_bridge.hpp"
#include "panels.hpp"
#include "screen_report.hpp"
#include "tallyproof_version.hpp"
#include "text_entry.hpp"
#include "theme.hpp"
#include "writeup.hpp"

#include "page.hpp"

namespace tallyproof::web {

Page* g_page = nullptr;  // the one page; owned by main, reached from the browser's callbacks

void want_frames(Page& p, int n) {
    p.state.view.frames_to_draw = std::max(p.state.view.frames_to_draw, n);
    if (p.paused) {
        p.paused = false;
        emscripten_resume_main_loop();
    }
}

static void fit_to_stage(Page& p) {
    int w = 0, h = 0;
    stage_size(&w, &h);
    if (w > 0 && h > 0 && (w != p.width || h != p.height)) {
        p.width = w;
        p.height = h;
        SDL_SetWindowSize(p.window, w, h);
        p.state.view.frames_to_draw = std::max(p.state.view.frames_to_draw, 3);
    }
}

static void handle_shortcuts(Page& p) {
    const ImGuiIO& io = ImGui::GetIO();
    const bool mod = io.KeyCtrl || io.KeySuper;
    if (mod && io.KeyShift && ImGui::IsKeyPressed(ImGui::GetKeyIndex(ImGuiKey_C), false))
        copy_text(p.state.report);
    if (mod && ImGui::IsKeyPressed(ImGui::GetKeyIndex(ImGuiKey_Enter), false)) recompute(p.state);
}

// The text of the print layout: the write-up sentence over the full results block; for a screen
// (the Groups view's table), one page: its summary, the flagged groups with their drivers, the cautions.
std::string print_text(const AppState& s) {
    if (prints_screen(s)) return tallyproof::screen_print_text(s.groups.result);
    const tallyproof::WriteupOptions o;
    return tallyproof::writeup_sentence(s.analysis, s.result, o) + "\n\n" + s.report;
}
std::string print_title(const AppState& s) { return s.reading.source_name + " · Tallyproof " TALLYPROOF_VERSION; }
bool prints_screen(const AppState& s) { return s.groups.open && s.groups.opened < 0 && s.groups.result.status.ok; }
const char* chart_image_name(ResultTab chart) {
    return chart == ResultTab::bars ? "tallyproof-bars.png" : chart == ResultTab::funnel ? "tallyproof-funnel.png" : "tallyproof-curve.png";
}
void lay_out_print(const AppState& s, bool then_print) {
    const std::string text = print_text(s);
    print_report(text, print_title(s), then_print, tallyproof::glossary_notes(text, true), print_charts(s));
}
std::string print_charts(const AppState& s) {
    return prints_screen(s) ? "tallyproof-funnel.png" : "tallyproof-curve.png,tallyproof-bars.png";
}

// Renders one chart alone, 960 x 540 CSS pixels at 2x, reads it back and hands it to the page;
// then restores the canvas. Runs inside the same animation frame as a normal frame drawn after
// it, so the export never shows on screen.
void render_chart_export(Page& p, const ChartExport& e) {
    using namespace tallyproof::web;
    const int cw = 960, ch = 540, scale = 2, pw = cw * scale, ph = ch * scale;
    int fw = 0, fh = 0;
    SDL_GL_GetDrawableSize(p.window, &fw, &fh);
    emscripten_set_canvas_element_size("#canvas", pw, ph);
    const Theme theme = export_theme(p.theme);
    ImGuiIO& io = ImGui::GetIO();
    ImGui_ImplOpenGL3_NewFrame();
    ImGui_ImplSDL2_NewFrame();
    const ImVec2 mouse = io.MousePos;
    io.DisplaySize = ImVec2(cw, ch);
    io.DisplayFramebufferScale = ImVec2(scale, scale);
    io.FontGlobalScale = theme.font_scale;
    io.MousePos = ImVec2(-FLT_MAX, -FLT_MAX);  // no hover tooltips in the image
    ImGui::NewFrame();
    ImGui::SetNextWindowPos(ImVec2(0, 0));
    ImGui::SetNextWindowSize(ImVec2(cw, ch));
    ImGui::Begin("chart-export", nullptr, ImGuiWindowFlags_NoDecoration | ImGuiWindowFlags_NoSavedSettings | ImGuiWindowFlags_NoInputs);
    ImGui::PushFont(theme.body);
    const ImVec2 area = ImGui::GetContentRegionAvail();
    if (e.chart == ResultTab::bars) draw_bar_chart(p.state.result, area, theme);
    else if (e.chart == ResultTab::funnel) draw_funnel(p.state, theme, area);
    else draw_density_plot(p.state.curve, p.state.result, area, theme);
    ImGui::PopFont();
    ImGui::End();
    ImGui::Render();
    glViewport(0, 0, pw, ph);
    glClearColor(theme.clear.x, theme.clear.y, theme.clear.z, 1.f);
    glClear(GL_COLOR_BUFFER_BIT);
    ImGui_ImplOpenGL3_RenderDrawData(ImGui::GetDrawData());
    std::vector<unsigned char> pixels(static_cast<std::size_t>(pw) * ph * 4);
    glPixelStorei(GL_PACK_ALIGNMENT, 1);
    glReadPixels(0, 0, pw, ph, GL_RGBA, GL_UNSIGNED_BYTE, pixels.data());
    deliver_image(pixels.data(), pw, ph, chart_image_name(e.chart), static_cast<ImagePurpose>(e.purpose));
    io.MousePos = mouse;
    io.FontGlobalScale = p.theme.font_scale;
    emscripten_set_canvas_element_size("#canvas", fw, fh);
}

constexpr float kDragSlop = 10;          // CSS px a finger moves before a tap becomes a drag
constexpr double kHoldToPressMs = 450;   // a finger held this long, then moved, presses rather than scrolls

static void take_touch(Page& p, const SDL_Event& e) {
    Touch& t = p.touch;
    const ImVec2 at(e.tfinger.x * static_cast<float>(p.width), e.tfinger.y * static_cast<float>(p.height));
    if (!p.theme.touch) {  // the first touch on a device that did not say it had a touch screen
        p.theme.touch = true;
        p.state.view.theme_changed = true;
    }
    if (e.type == SDL_FINGERDOWN) {
        if (t.mode != Touch::Mode::none) return;  // a second finger: ignored
        t.mode = Touch::Mode::pending;
        t.finger = e.tfinger.fingerId;
        t.start = t.pos = at;
        t.down_ms = emscripten_get_now();
        t.scroll = ImVec2(0, 0);
        t.drives_mouse = true;
        return;
    }
    if (e.tfinger.fingerId != t.finger || t.mode == Touch::Mode::none) return;
    const ImVec2 last = t.pos;
    t.pos = at;
    if (e.type == SDL_FINGERMOTION) {
        if (t.mode == Touch::Mode::pending && std::hypot(at.x - t.start.x, at.y - t.start.y) > kDragSlop)
            t.mode = emscripten_get_now() - t.down_ms >= kHoldToPressMs ? Touch::Mode::pressing : Touch::Mode::scrolling;
        if (t.mode == Touch::Mode::scrolling) {
            t.scroll.x += last.x - at.x;
            t.scroll.y += last.y - at.y;
        }
        return;
    }
    if (t.mode == Touch::Mode::pending) t.tap_frames = 2;  // a tap: pressed and released where the finger lifted
    t.mode = Touch::Mode::none;
}

// After the backend's NewFrame: ImGui's mouse is the finger while a touch drives it.
static void apply_touch_to_mouse(Page& p) {
    Touch& t = p.touch;
    note_tap(false, false);
    if (!t.drives_mouse) return;
    ImGuiIO& io = ImGui::GetIO();
    io.MousePos = t.pos;
    io.MouseDown[0] = t.mode == Touch::Mode::pressing || t.tap_frames == 2;
    note_tap(t.tap_frames == 2, t.tap_frames > 0);
    if (t.tap_frames > 0) {
        --t.tap_frames;
        p.state.view.frames_to_draw = std::max(p.state.view.frames_to_draw, 2);
    } else if (t.mode == Touch::Mode::none) {
        io.MousePos = ImVec2(-FLT_MAX, -FLT_MAX);  // no hover left behind where the finger was
        t.drives_mouse = false;
    }
}

// After NewFrame (which found the window under the finger): a drag scrolls the nearest window
// under it that can scroll that way.
static void apply_touch_scroll(Page& p) {
    Touch& t = p.touch;
    if (t.scroll.x == 0 && t.scroll.y == 0) return;
    for (int axis = 0; axis < 2; ++axis) {
        const float d = axis ? t.scroll.y : t.scroll.x;
        if (d == 0) continue;
        for (ImGuiWindow* w = GImGui->HoveredWindow; w; w = w->ParentWindow) {
            const float max = axis ? w->ScrollMax.y : w->ScrollMax.x;
            if (max <= 0 || (w->Flags & ImGuiWindowFlags_NoScrollWithMouse)) continue;
            if (axis) ImGui::SetScrollY(w, std::clamp(w->Scroll.y + d, 0.0f, max));
            else ImGui::SetScrollX(w, std::clamp(w->Scroll.x + d, 0.0f, max));
            break;
        }
    }
    t.scroll = ImVec2(0, 0);
    p.state.view.frames_to_draw = std::max(p.state.view.frames_to_draw, 2);
}

// Feeds this frame's events to ImGui. A key or button released in the same frame as it was
// pressed would never be seen as pressed (the loop sleeps while idle, so a quick tap can arrive
// whole): the release and everything after it wait for the next frame.
static bool take_events(Page& p) {
    std::vector<SDL_Event> events;
    events.swap(p.deferred);
    SDL_Event ev;
    while (SDL_PollEvent(&ev)) events.push_back(ev);
    std::vector<SDL_Keycode> keys_down;
    std::vector<Uint8> buttons_down;
    for (std::size_t i = 0; i < events.size(); ++i) {
        const SDL_Event& e = events[i];
        const bool key_tap = e.type == SDL_KEYUP &&
                             std::find(keys_down.begin(), keys_down.end(), e.key.keysym.sym) != keys_down.end();
        const bool click = e.type == SDL_MOUSEBUTTONUP &&
                           std::find(buttons_down.begin(), buttons_down.end(), e.button.button) != buttons_down.end();
        if (key_tap || click) {
            p.deferred.assign(events.begin() + static_cast<std::ptrdiff_t>(i), events.end());
            break;
        }
        if (e.type == SDL_KEYDOWN) keys_down.push_back(e.key.keysym.sym);
        if (e.type == SDL_MOUSEBUTTONDOWN) buttons_down.push_back(e.button.button);
        if (e.type == SDL_FINGERDOWN || e.type == SDL_FINGERMOTION || e.type == SDL_FINGERUP) {
            take_touch(p, e);
            p.state.view.frames_to_draw = std::max(p.state.view.frames_to_draw, 3);
            continue;
        }
        if (e.type == SDL_MOUSEMOTION || e.type == SDL_MOUSEBUTTONDOWN) p.touch.drives_mouse = false;  // a real mouse
        if ((e.type == SDL_KEYDOWN || e.type == SDL_KEYUP) && e.key.keysym.scancode == SDL_SCANCODE_TAB &&
            !(e.key.keysym.mod & (KMOD_CTRL | KMOD_ALT))) {
            // Tab walks every control (keyboard_walk), not only ImGui 1.86's text fields.
            if (e.type == SDL_KEYDOWN) queue_tab((e.key.keysym.mod & KMOD_SHIFT) != 0);
            p.state.view.frames_to_draw = std::max(p.state.view.frames_to_draw, 3);
            continue;
        }
        if (e.type == SDL_KEYDOWN && (e.key.keysym.scancode == SDL_SCANCODE_RETURN || e.key.keysym.scancode == SDL_SCANCODE_KP_ENTER) &&
            !(e.key.keysym.mod & (KMOD_CTRL | KMOD_ALT | KMOD_GUI)))
            queue_enter();
        ImGui_ImplSDL2_ProcessEvent(&e);
        if (e.type == SDL_KEYDOWN || e.type == SDL_KEYUP) {
            // The backend reads modifiers from SDL_GetModState(), which already reflects every
            // event polled above: a quick Ctrl+A would be seen with Ctrl released. Use the
            // modifiers as they were when this key event happened.
            ImGuiIO& io = ImGui::GetIO();
            const Uint16 mod = e.key.keysym.mod;
            io.KeyShift = (mod & KMOD_SHIFT) != 0;
            io.KeyCtrl = (mod & KMOD_CTRL) != 0;
            io.KeyAlt = (mod & KMOD_ALT) != 0;
            io.KeySuper = (mod & KMOD_GUI) != 0;
        }
        p.state.view.frames_to_draw = std::max(p.state.view.frames_to_draw, 3);  // ImGui settles within a few frames
    }
    if (!p.deferred.empty()) p.state.view.frames_to_draw = std::max(p.state.view.frames_to_draw, 3);
    return !events.empty();
}

void frame() {
    Page& p = *g_page;
    const bool input = take_events(p);
    fit_to_stage(p);
    settle_frame(p.state);  // what the last changes marked due: published and kept once
    // Exact and Monte Carlo work runs in the page's own tasks between frames (tp_work), not
    // inside the animation frame, so it never waits for the display's refresh.
    if (work_running(p.state)) start_work_loop();
    if (p.state.view.theme_changed) {
        apply_palette(&p.theme, p.state.view.dark);
        p.state.view.frames_to_draw = std::max(p.state.view.frames_to_draw, 2);
        p.state.view.theme_changed = false;
    }
    if (!p.state.handover.exports.empty()) {
        const ChartExport e = p.state.handover.exports.front();
        p.state.handover.exports.erase(p.state.handover.exports.begin());
        render_chart_export(p, e);
        if (p.state.handover.exports.empty() && p.state.handover.print_pending) {
            p.state.handover.print_pending = false;
            lay_out_print(p.state, true);
        }
        p.state.view.frames_to_draw = std::max(p.state.view.frames_to_draw, 2);
    }
    if (p.state.view.frames_to_draw <= 0) {
        p.paused = true;
        emscripten_pause_main_loop();
        return;
    }
    if (p.canvas_hidden) {
        // Under the form view a drawn frame is never seen, yet software WebGL still runs it: each
        // key typed in the form queued ~50 ms of it, which the browser then waited for (seconds)
        // on the first frame the canvas was shown again.
        p.state.view.frames_to_draw = 0;
        return;
    }
    if (work_running(p.state) && !input && p.state.handover.exports.empty()) {
        // While work runs, a frame without input is drawn only to move the progress bar, about
        // four times a second: each presented frame delays the next work task (by ~50 ms with
        // software WebGL), and nothing else on screen changes.
        const double now = emscripten_get_now();
        if (now - p.last_job_frame_ms < 250) return;
        p.last_job_frame_ms = now;
    }
    --p.state.view.frames_to_draw;

    ImGui_ImplOpenGL3_NewFrame();
    ImGui_ImplSDL2_NewFrame();
    apply_touch_to_mouse(p);
    begin_control_walk();
    ImGui::NewFrame();
    apply_touch_scroll(p);
    apply_tab();
    handle_shortcuts(p);
    draw_screen(p.state, p.theme);
    publish_text_entry();
    publish_focus();
    ImGui::Render();
    run_clip_audit();
    settle_frame(p.state);  // what this frame's controls changed
    int fw = 0, fh = 0;
    SDL_GL_GetDrawableSize(p.window, &fw, &fh);
    glViewport(0, 0, fw, fh);
    const ImVec4 c = p.theme.clear;
    glClearColor(c.x, c.y, c.z, 1.f);
    glClear(GL_COLOR_BUFFER_BIT);
    ImGui_ImplOpenGL3_RenderDrawData(ImGui::GetDrawData());
}

}  // namespace tallyproof::web

using namespace tallyproof::web;

int main() {
    static Page page;
    g_page = &page;
    // Keys reach the canvas only while it has focus: the page's fields, buttons and the form view
    // keep their keys, and the browser's own Ctrl/⌘ + V, C, X, A (the shell lets those pass).
    SDL_SetHint(SDL_HINT_EMSCRIPTEN_KEYBOARD_ELEMENT, "#canvas");
    SDL_SetHint(SDL_HINT_TOUCH_MOUSE_EVENTS, "0");  // touches are read as fingers (take_touch), not as a mouse
    if (SDL_Init(SDL_INIT_VIDEO | SDL_INIT_TIMER) != 0) return 1;
    SDL_GL_SetAttribute(SDL_GL_CONTEXT_PROFILE_MASK, SDL_GL_CONTEXT_PROFILE_ES);
    SDL_GL_SetAttribute(SDL_GL_CONTEXT_MAJOR_VERSION, 3);
    SDL_GL_SetAttribute(SDL_GL_CONTEXT_MINOR_VERSION, 0);
    SDL_GL_SetAttribute(SDL_GL_DOUBLEBUFFER, 1);
    stage_size(&page.width, &page.height);
    if (page.width <= 0) page.width = 1280;
    if (page.height <= 0) page.height = 800;
    page.window = SDL_CreateWindow("Tallyproof", SDL_WINDOWPOS_CENTERED, SDL_WINDOWPOS_CENTERED, page.width, page.height,
                                   SDL_WINDOW_OPENGL | SDL_WINDOW_RESIZABLE | SDL_WINDOW_ALLOW_HIGHDPI);
    if (!page.window) return 1;
    page.gl = SDL_GL_CreateContext(page.window);
    SDL_GL_MakeCurrent(page.window, page.gl);

    IMGUI_CHECKVERSION();
    ImGui::CreateContext();
    ImGuiIO& io = ImGui::GetIO();
    io.IniFilename = nullptr;  // nothing is written to storage behind the user's back
    io.ConfigFlags |= ImGuiConfigFlags_NavEnableKeyboard;
    ImGui_ImplSDL2_InitForOpenGL(page.window, page.gl);
    ImGui_ImplOpenGL3_Init("#version 300 es");
    load_fonts(&page.theme, static_cast<float>(std::max(1.0, device_pixel_ratio())));
    page.state.view.dark = system_prefers_dark();
    page.theme.touch = has_touch_screen();
    apply_palette(&page.theme, page.state.view.dark);
    page.state.view.theme_changed = false;

    restore_session(page.state);
    EM_ASM({ if (globalThis.tallyproofPage) globalThis.tallyproofPage.ready(); });
    emscripten_set_main_loop(frame, 0, 1);
    return 0;
}

