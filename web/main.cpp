// The page's entry point: SDL2 window with a WebGL2 context, Dear ImGui, and a frame loop that
// draws only while there is input or pending work (an idle page does no drawing).
#include <SDL.h>
#include <SDL_opengles2.h>
#include <emscripten.h>
#include <emscripten/html5.h>
#include <imgui.h>
#include <imgui_impl_opengl3.h>
#include <imgui_impl_sdl.h>

#include <cmath>
#include <string_view>

#include "app_state.hpp"
#include "page_bridge.hpp"
#include "panels.hpp"
#include "theme.hpp"

namespace {

struct Page {
    SDL_Window* window = nullptr;
    SDL_GLContext gl = nullptr;
    tallyproof::web::AppState state;
    tallyproof::web::Theme theme;
    int width = 0, height = 0;
};

Page* g_page = nullptr;  // the one page; owned by main, reached from the browser's callbacks

void fit_to_stage(Page& p) {
    int w = 0, h = 0;
    tallyproof::web::stage_size(&w, &h);
    if (w > 0 && h > 0 && (w != p.width || h != p.height)) {
        p.width = w;
        p.height = h;
        SDL_SetWindowSize(p.window, w, h);
        p.state.frames_to_draw = std::max(p.state.frames_to_draw, 3);
    }
}

void frame() {
    Page& p = *g_page;
    SDL_Event ev;
    while (SDL_PollEvent(&ev)) {
        ImGui_ImplSDL2_ProcessEvent(&ev);
        p.state.frames_to_draw = std::max(p.state.frames_to_draw, 3);  // ImGui settles within a few frames
    }
    fit_to_stage(p);
    if (p.state.frames_to_draw <= 0) return;
    --p.state.frames_to_draw;

    ImGui_ImplOpenGL3_NewFrame();
    ImGui_ImplSDL2_NewFrame();
    ImGui::NewFrame();
    tallyproof::web::draw_screen(p.state, p.theme);
    ImGui::Render();
    int fw = 0, fh = 0;
    SDL_GL_GetDrawableSize(p.window, &fw, &fh);
    glViewport(0, 0, fw, fh);
    glClearColor(246 / 255.f, 244 / 255.f, 239 / 255.f, 1.f);
    glClear(GL_COLOR_BUFFER_BIT);
    ImGui_ImplOpenGL3_RenderDrawData(ImGui::GetDrawData());
}

}  // namespace

extern "C" {
// Called by the page glue with UTF-8 text from a paste event.
EMSCRIPTEN_KEEPALIVE void tp_paste(const char* text, int length) {
    if (!g_page || !text || length < 0) return;
    tallyproof::web::apply_paste(g_page->state, std::string_view(text, static_cast<std::size_t>(length)));
}
// Called by the page glue on any browser input so the next frames are drawn.
EMSCRIPTEN_KEEPALIVE void tp_wake() {
    if (g_page) g_page->state.frames_to_draw = std::max(g_page->state.frames_to_draw, 3);
}
}

int main() {
    static Page page;
    g_page = &page;
    if (SDL_Init(SDL_INIT_VIDEO | SDL_INIT_TIMER) != 0) return 1;
    SDL_GL_SetAttribute(SDL_GL_CONTEXT_PROFILE_MASK, SDL_GL_CONTEXT_PROFILE_ES);
    SDL_GL_SetAttribute(SDL_GL_CONTEXT_MAJOR_VERSION, 3);
    SDL_GL_SetAttribute(SDL_GL_CONTEXT_MINOR_VERSION, 0);
    SDL_GL_SetAttribute(SDL_GL_DOUBLEBUFFER, 1);
    tallyproof::web::stage_size(&page.width, &page.height);
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
    page.theme = tallyproof::web::make_theme(static_cast<float>(std::max(1.0, tallyproof::web::device_pixel_ratio())));

    tallyproof::web::load_example(page.state);
    EM_ASM({ if (globalThis.tallyproofPage) globalThis.tallyproofPage.ready(); });
    emscripten_set_main_loop(frame, 0, 1);
    return 0;
}
