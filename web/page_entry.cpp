// The entry points the page's JavaScript glue (shell.html, page_bridge) calls: pastes and files,
// keys the canvas did not get, the form view's actions, work slices, print and storage events.
// Each goes through the same AppState transition as the canvas control it stands for.
#include <SDL.h>
#include <emscripten.h>

#include <cstdlib>
#include <initializer_list>
#include <string>
#include <vector>

#include "clip_audit.hpp"
#include "glossary.hpp"
#include "keyboard_walk.hpp"
#include "merge_categories.hpp"
#include "number_reading.hpp"
#include "page.hpp"
#include "page_bridge.hpp"
#include "text_entry.hpp"

using tallyproof::web::g_page;
using tallyproof::web::Page;
using tallyproof::web::want_frames;
using tallyproof::web::frame;
using tallyproof::web::render_chart_export;

extern "C" {
// Called by the page glue with UTF-8 text from a paste event.
EMSCRIPTEN_KEEPALIVE void tp_paste(const char* text, int length) {
    if (!g_page || !text || length < 0) return;
    tallyproof::web::apply_input(g_page->state, std::string(text, static_cast<std::size_t>(length)));
    want_frames(*g_page, 3);
}
// Called by the page glue with the bytes of a dropped or opened file and its name (UTF-8).
EMSCRIPTEN_KEEPALIVE void tp_open_file(const char* bytes, int length, const char* name) {
    if (!g_page || !bytes || length < 0) return;
    tallyproof::web::apply_input(g_page->state, std::string(bytes, static_cast<std::size_t>(length)), name ? name : "");
    want_frames(*g_page, 3);
}
// A file chosen or dropped, before any of it is read: its name (UTF-8) and size in bytes. 0: the
// page reads it whole and calls tp_open_file; 1: it hands its chunks to tp_stream_feed; 2: refused
// (too large to read whole), said on screen.
EMSCRIPTEN_KEEPALIVE int tp_open_file_stream(const char* name, double size) {
    if (!g_page) return 2;
    const auto start = tallyproof::web::open_file_stream(g_page->state, name ? name : "", size);
    want_frames(*g_page, 3);
    return static_cast<int>(start);
}
// Where the page puts the next chunk of `bytes` bytes (null when no file is being read in chunks).
EMSCRIPTEN_KEEPALIVE char* tp_stream_buffer(int bytes) {
    if (!g_page || bytes < 0) return nullptr;
    return tallyproof::web::file_stream_buffer(g_page->state, static_cast<std::size_t>(bytes));
}
// The chunk put there (`last`: the file's end). 1: read the next; 0: stop (read, refused or
// cancelled); 2: read the file whole instead (tp_open_file). Progress is drawn about four times a second.
EMSCRIPTEN_KEEPALIVE int tp_stream_feed(int bytes, int last) {
    if (!g_page || bytes < 0) return 0;
    Page& p = *g_page;
    const int next = tallyproof::web::feed_file_stream(p.state, static_cast<std::size_t>(bytes), last != 0);
    const double now = emscripten_get_now();
    if (next != 1 || now - p.last_job_frame_ms >= 250) {
        want_frames(p, 2);
        p.last_job_frame_ms = now;
    }
    return next;
}
// The browser could not read the file (`why`, its error's name).
EMSCRIPTEN_KEEPALIVE void tp_stream_failed(const char* why) {
    if (!g_page) return;
    tallyproof::web::file_stream_failed(g_page->state, why ? why : "");
    want_frames(*g_page, 3);
}
// Called by the page glue on any browser input so the next frames are drawn.
EMSCRIPTEN_KEEPALIVE void tp_wake() {
    if (g_page) want_frames(*g_page, 3);
}
// Called by the page glue when the form view covers the canvas (1) or leaves it (0).
EMSCRIPTEN_KEEPALIVE void tp_canvas_hidden(int hidden) {
    if (!g_page) return;
    g_page->canvas_hidden = hidden != 0;
    want_frames(*g_page, 3);
}
// The Groups view's rows at places [start, start + count) of its order, as JSON (the form view
// pages through a screen too large to hand over whole); valid until the next call.
EMSCRIPTEN_KEEPALIVE const char* tp_screen_rows(int start, int count) {
    static std::string rows;
    rows = g_page && start >= 0 && count > 0
               ? tallyproof::web::screen_rows_json(g_page->state, static_cast<std::size_t>(start), static_cast<std::size_t>(count))
               : std::string("[]");
    return rows.c_str();
}
// Publishes and keeps now what the last changes marked due (the page is being hidden or left).
EMSCRIPTEN_KEEPALIVE void tp_settle() {
    if (g_page) tallyproof::web::settle_frame(g_page->state);
}
// Loads demo scenario `index` (the Examples menu does the same).
EMSCRIPTEN_KEEPALIVE void tp_load_demo(int index) {
    if (!g_page) return;
    tallyproof::web::load_demo(g_page->state, index);
    want_frames(*g_page, 3);
}
// The system colour scheme changed; followed until the user picks a theme.
EMSCRIPTEN_KEEPALIVE void tp_system_theme(int dark) {
    if (!g_page || !g_page->state.view.theme_from_system) return;
    g_page->state.view.dark = dark != 0;
    g_page->state.view.theme_changed = true;
    want_frames(*g_page, 3);
}
// The address's fragment changed (a share link opened in this tab).
EMSCRIPTEN_KEEPALIVE void tp_open_fragment() {
    if (!g_page) return;
    const std::string fragment = tallyproof::web::location_fragment();
    if (!fragment.empty()) tallyproof::web::open_share_fragment(g_page->state, fragment);
    want_frames(*g_page, 3);
}
// Runs exact or Monte Carlo work for about budget_ms; called by the page glue in tasks of its
// own, back to back while it returns 1. Progress is drawn about four times a second (each frame
// in software WebGL costs what the work could use), and at once when the job ends.
EMSCRIPTEN_KEEPALIVE int tp_work(double budget_ms) {
    if (!g_page || !tallyproof::web::work_running(g_page->state)) return 0;
    Page& p = *g_page;
    tallyproof::web::step_job(p.state, budget_ms);
    const double now = emscripten_get_now();
    const bool running = tallyproof::web::work_running(p.state);
    if (!running || now - p.last_job_frame_ms >= 250) want_frames(p, 2);  // frame() stamps the time
    return running ? 1 : 0;
}
// The page's text-entry element changed (typing, composition, deletion, paste, selection): its
// whole text and selection (UTF-8 byte offsets) replace the active field's.
EMSCRIPTEN_KEEPALIVE void tp_text_input(const char* text, int length, int selection_start, int selection_end) {
    if (!g_page) return;
    tallyproof::web::receive_text_entry(text, length, selection_start, selection_end);
    want_frames(*g_page, 3);
}
// The text-entry element lost focus (the user tapped elsewhere on the page, or closed the keyboard).
EMSCRIPTEN_KEEPALIVE void tp_text_end() {
    if (!g_page) return;
    tallyproof::web::end_text_entry();
    want_frames(*g_page, 3);
}
// Draws the pending frames now, inside the page's handler of a tap or click, so that what the
// click does (focus a text field and open the on-screen keyboard, open the file picker, read
// the clipboard) happens within the user's gesture, as browsers require.
EMSCRIPTEN_KEEPALIVE void tp_frame_now() {
    if (!g_page) return;
    for (int i = 0; i < 3 && g_page->state.view.frames_to_draw > 0; ++i) frame();
}
// Before the browser prints: both charts are rendered now and the print layout rebuilt, so the
// browser's own Print gives the same report as the menu item.
EMSCRIPTEN_KEEPALIVE void tp_prepare_print() {
    if (!g_page) return;
    using namespace tallyproof::web;
    const bool screen = tallyproof::web::prints_screen(g_page->state);
    for (ResultTab chart : screen ? std::initializer_list<ResultTab>{ResultTab::funnel} : std::initializer_list<ResultTab>{ResultTab::curve, ResultTab::bars})
        render_chart_export(*g_page, ChartExport{chart, static_cast<int>(ImagePurpose::print)});
    tallyproof::web::lay_out_print(g_page->state, false);
    want_frames(*g_page, 2);
}
// The page's HTML form (shell.html), for screen readers, switch access and keyboard users: each
// action goes through the same AppState transition as the canvas control it stands for, and a
// refused value is announced (the live region) like a refused paste.
enum class FormAction {
#define TP_FORM_ACTION(name, number) name = number,
#include "form_actions.def"
#undef TP_FORM_ACTION
};
EMSCRIPTEN_KEEPALIVE void tp_form(int action, const char* text) {
    if (!g_page || !text) return;
    using namespace tallyproof::web;
    AppState& s = g_page->state;
    const std::string value = text;
    s.input_error.clear();
    switch (static_cast<FormAction>(action)) {
        case FormAction::counts: apply_paste(s, value); break;
        case FormAction::model: {
            tallyproof::ModelKind kind{};
            if (tallyproof::model_kind_from_name(value, &kind) && kind != s.analysis.model.kind) set_model_kind(s, kind);
            break;
        }
        case FormAction::values:
            s.model_editor.values = value;
            apply_model_editor(s);
            break;
        case FormAction::alpha: apply_alpha_text(s, value); break;
        case FormAction::method:
            for (auto m : {tallyproof::PValueMethod::asymptotic, tallyproof::PValueMethod::exact, tallyproof::PValueMethod::monte_carlo})
                if (value == tallyproof::pvalue_method_name(m) && m != s.analysis.pvalue.method) set_pvalue_method(s, m);
            break;
        case FormAction::merge: {
            tallyproof::MergeRule rule{};
            if (tallyproof::merge_rule_from_name(value, &rule) && rule != s.analysis.merge.rule) merge_thin_cells(s, rule);
            break;
        }
        case FormAction::copy_writeup: copy_writeup(s, false); break;
        case FormAction::copy_table: copy_table(s); break;
        case FormAction::download: download_document(s); break;
        case FormAction::answer_question: dismiss_question(s, 0); break;  // "They are counts"
        case FormAction::sort_groups: {  // "q,1": the column's name as the screen document spells it, then 1 ascending / 0 descending
            const std::string name = value.substr(0, value.find(','));
            const bool ascending = value.size() > name.size() + 1 && value[name.size() + 1] == '1';
            const char* names[] = {"name", "n", "statistic", "df", "p_value", "q_value", "w", "flagged"};
            for (int c = 0; c < 8; ++c)
                if (name == names[c]) sort_groups(s, static_cast<GroupColumn>(c), ascending);
            break;
        }
        case FormAction::open_group: open_group(s, std::atoi(value.c_str())); break;
        case FormAction::back_to_groups: back_to_groups(s); break;
        case FormAction::sheet: choose_sheet(s, std::atoi(value.c_str())); break;
        case FormAction::download_xlsx:
            if (s.groups.open && s.groups.opened < 0) download_groups_workbook(s);
            else download_workbook(s);
            break;
        case FormAction::one_sample: leave_groups(s); break;
        case FormAction::survey: {  // the columns by name or number, in this order; empty ones left out
            std::vector<std::string> parts(4);
            std::size_t i = 0;
            for (char ch : value) {
                if (ch == ',') { if (++i == parts.size()) break; continue; }
                parts[i] += ch;
            }
            for (auto& p : parts) p = std::string(tallyproof::trim_cell_ends(p));
            if (s.reading.text.empty()) { s.input_error = "Paste or open the respondents' rows first, then name their columns."; break; }
            if (parts[0].empty()) { s.input_error = "Name the category column (its header or number) first."; break; }
            s.reading.survey_open = true;
            read_paste_as_survey(s, tallyproof::SurveyColumns{parts[0], parts[1], parts[2], parts[3], false});
            break;
        }
        case FormAction::design_effect: apply_design_effect_text(s, value); break;
        case FormAction::goal: {  // "": find a departure; a margin w0: show conformity within it
            if (value.empty()) { set_test_goal(s, false, s.analysis.conformity.margin_w); break; }
            set_conformity_margin_text(s, value);  // "0.1" is w0, "2 pp" percentage points
            break;
        }
    }
    if (!s.input_error.empty()) publish_error(s.input_error);
    want_frames(*g_page, 3);
}
// Another tab changed the shared recent list (the storage event): it is read again.
EMSCRIPTEN_KEEPALIVE void tp_storage_changed() {
    if (!g_page) return;
    tallyproof::web::reload_recent(g_page->state);
    want_frames(*g_page, 3);
}
// A key for the canvas that reached another element of the page: Enter, Tab and Escape from the
// text-entry element, or a key pressed while nothing had focus. `scancode` is SDL's; `mods` bits:
// 1 Shift, 2 Ctrl, 4 Alt, 8 Meta.
EMSCRIPTEN_KEEPALIVE void tp_key(int scancode, int down, int mods) {
    if (!g_page || scancode <= 0 || scancode >= SDL_NUM_SCANCODES) return;
    SDL_Event e{};
    e.type = down ? SDL_KEYDOWN : SDL_KEYUP;
    e.key.state = down ? SDL_PRESSED : SDL_RELEASED;
    e.key.windowID = SDL_GetWindowID(g_page->window);
    e.key.keysym.scancode = static_cast<SDL_Scancode>(scancode);
    e.key.keysym.sym = SDL_GetKeyFromScancode(e.key.keysym.scancode);
    e.key.keysym.mod = static_cast<Uint16>(((mods & 1) ? KMOD_LSHIFT : 0) | ((mods & 2) ? KMOD_LCTRL : 0) |
                                           ((mods & 4) ? KMOD_LALT : 0) | ((mods & 8) ? KMOD_LGUI : 0));
    SDL_PushEvent(&e);
    want_frames(*g_page, 3);
}
// Tab on the canvas: 1 when the focus is on its last control (Shift+Tab: its first), so the
// browser moves the focus on to the page (the skip link, the form view) instead.
EMSCRIPTEN_KEEPALIVE int tp_tab_leaves(int backward) {
    if (!g_page) return 1;
    const int leaves = tallyproof::web::tab_leaves_canvas(backward != 0) ? 1 : 0;
    want_frames(*g_page, 3);
    return leaves;
}
// The number of controls a Tab walk passes on the canvas (tests).
EMSCRIPTEN_KEEPALIVE int tp_control_count() { return tallyproof::web::control_count(); }
// Audits the next frame for text cut by a clip rectangle (tests; see clip_audit.hpp).
EMSCRIPTEN_KEEPALIVE void tp_clip_audit() {
    if (!g_page) return;
    tallyproof::web::request_clip_audit();
    want_frames(*g_page, 2);
}
// Cancels running exact or Monte Carlo work (the page's Escape key).
EMSCRIPTEN_KEEPALIVE void tp_cancel() {
    if (!g_page) return;
    tallyproof::web::cancel_job(g_page->state);
    want_frames(*g_page, 3);
}
}
