// Tab on the canvas (keyboard_walk.hpp): the controls of each frame are collected in drawing
// order through ImGui's item hook, and Tab moves ImGui's navigation focus along them.
#include "keyboard_walk.hpp"

#include <emscripten.h>
#include <imgui.h>
#include <imgui_internal.h>

#include <cstdarg>
#include <vector>

EM_JS(void, tp_js_focus_rect, (int shown, float x, float y, float w, float h, int text), {
    if (globalThis.tallyproofPage) globalThis.tallyproofPage.focusRect = shown ? { x: x, y: y, w: w, h: h, text: !!text } : null;
});

namespace {

struct Control {
    ImGuiID id = 0;
    ImGuiWindow* window = nullptr;
    ImRect rect;
    ImGuiID focus_scope = 0;
    bool text = false;  // a text field (or a number field that opens for typing)
};

// One page, one canvas: the controls drawn in the frame being built and in the last whole frame.
struct Walk {
    std::vector<Control> building, last;
    int pending = 0;      // +1 Tab, -1 Shift+Tab, 0 none
    bool enter = false;
    ImGuiID published = 0;  // the control whose place the page was last told
};
Walk g_walk;

// The controls a Tab can reach now: those of the open menu (popup) if one is open, else all.
std::vector<const Control*> reachable() {
    ImGuiContext& g = *GImGui;
    ImGuiWindow* popup = nullptr;
    for (int i = g.OpenPopupStack.Size - 1; i >= 0 && !popup; --i) popup = g.OpenPopupStack[i].Window;
    std::vector<const Control*> out;
    for (const Control& c : g_walk.last)
        if (!popup || c.window->RootWindow == popup->RootWindow) out.push_back(&c);
    return out;
}

int position(const std::vector<const Control*>& list) {
    ImGuiContext& g = *GImGui;
    // No focus frame on screen (the page just opened, or the mouse was used): Tab starts at the first control.
    const ImGuiID current = g.ActiveId != 0 ? g.ActiveId : g.NavDisableHighlight ? 0 : g.NavId;
    if (current == 0) return -1;
    for (int i = 0; i < static_cast<int>(list.size()); ++i)
        if (list[i]->id == current) return i;
    return -1;
}

}  // namespace

// ImGui's item hook (compiled in by IMGUI_ENABLE_TEST_ENGINE): called from ItemAdd for every item
// with an id, after its data is set; other calls (a title bar, a bare ButtonBehavior) are skipped.
void ImGuiTestEngineHook_ItemAdd(ImGuiContext* ctx, const ImRect& bb, ImGuiID id) {
    ImGuiContext& g = *ctx;
    ImGuiWindow* window = g.CurrentWindow;
    if (!window || g.LastItemData.ID != id || id == window->MoveId) return;
    if (g.LastItemData.InFlags & (ImGuiItemFlags_NoNav | ImGuiItemFlags_Disabled | ImGuiItemFlags_NoTabStop)) return;
    if (window->RootWindow->Flags & ImGuiWindowFlags_NoInputs) return;  // tooltips, the off-screen chart export
    for (auto it = g_walk.building.rbegin(); it != g_walk.building.rend() && it - g_walk.building.rbegin() < 4; ++it)
        if (it->id == id) return;  // submitted twice in a row (a selectable's row and its text)
    Control c;
    c.id = id;
    c.window = window;
    c.rect = bb;
    c.focus_scope = window->DC.NavFocusScopeIdCurrent;
    c.text = (g.LastItemData.InFlags & ImGuiItemFlags_Inputable) != 0;
    g_walk.building.push_back(c);
}
void ImGuiTestEngineHook_ItemInfo(ImGuiContext*, ImGuiID, const char*, ImGuiItemStatusFlags) {}
void ImGuiTestEngineHook_Log(ImGuiContext*, const char*, ...) {}
const char* ImGuiTestEngine_FindItemDebugLabel(ImGuiContext*, ImGuiID) { return nullptr; }

namespace tallyproof::web {

void begin_control_walk() {
    GImGui->TestEngineHookItems = true;
    if (!g_walk.building.empty()) g_walk.last.swap(g_walk.building);
    g_walk.building.clear();
}

bool tab_leaves_canvas(bool backward) {
    const auto list = reachable();
    if (list.empty()) return true;
    ImGuiContext& g = *GImGui;
    if (g.OpenPopupStack.Size > 0) return false;  // a menu keeps the focus until it is closed (Escape)
    const int at = position(list);
    const bool leaves = at >= 0 && (backward ? at == 0 : at == static_cast<int>(list.size()) - 1);
    if (leaves) {  // coming back by Tab starts at the first control again (Shift+Tab: the last)
        if (g.ActiveId != 0) ImGui::ClearActiveID();
        g.NavId = 0;
        g.NavDisableHighlight = true;
    }
    return leaves;
}

void queue_tab(bool backward) { g_walk.pending = backward ? -1 : 1; }
void queue_enter() { g_walk.enter = true; }

void apply_tab() {
    ImGuiContext& g = *GImGui;
    if (g_walk.enter) {
        g_walk.enter = false;
        const auto list = reachable();
        const int at = position(list);
        if (at >= 0 && g.ActiveId == 0 && !g.NavDisableHighlight && !list[at]->text) {
            g.NavNextActivateId = list[at]->id;  // as Space does
            g.NavNextActivateFlags = ImGuiActivateFlags_None;
        }
    }
    if (g_walk.pending == 0) return;
    const int dir = g_walk.pending;
    g_walk.pending = 0;
    const auto list = reachable();
    if (list.empty()) return;
    const int n = static_cast<int>(list.size());
    const int at = position(list);
    const int next = at < 0 ? (dir > 0 ? 0 : n - 1) : (at + dir + n) % n;
    const Control& c = *list[next];
    if (g.ActiveId != 0 && g.ActiveId != c.id) ImGui::ClearActiveID();
    ImGui::FocusWindow(c.window);
    ImGui::SetNavID(c.id, ImGuiNavLayer_Main, c.focus_scope, ImGui::WindowRectAbsToRel(c.window, c.rect));
    g.NavDisableHighlight = false;
    g.NavDisableMouseHover = true;
    ImGui::ScrollToRectEx(c.window, c.rect, ImGuiScrollFlags_KeepVisibleEdgeX | ImGuiScrollFlags_KeepVisibleEdgeY);
    if (c.text) {  // a text field opens for typing, as a browser's would
        g.NavNextActivateId = c.id;
        g.NavNextActivateFlags = ImGuiActivateFlags_PreferInput | ImGuiActivateFlags_TryToPreserveState;
    }
}

int control_count() { return static_cast<int>(g_walk.last.size()); }

void publish_focus() {
    ImGuiContext& g = *GImGui;
    const ImGuiID id = g.NavDisableHighlight ? 0 : g.NavId;
    const Control* found = nullptr;
    for (const Control& c : g_walk.building)
        if (c.id == id) found = &c;
    if (!found && g_walk.published == 0) return;
    g_walk.published = found ? id : 0;
    tp_js_focus_rect(found ? 1 : 0, found ? found->rect.Min.x : 0, found ? found->rect.Min.y : 0,
                     found ? found->rect.GetWidth() : 0, found ? found->rect.GetHeight() : 0, found && found->text ? 1 : 0);
}

}  // namespace tallyproof::web
