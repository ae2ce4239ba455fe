// Layout: a title bar (examples, theme, copy), a notice band for refused input, then the inputs
// (counts, expected mix, test) beside the verdict, validity and the result views; narrow screens
// stack the columns.
#include "panels.hpp"

#include <algorithm>
#include <vector>

#include <imgui_stdlib.h>
#include <string>

#include "demo_library.hpp"
#include "density_plot.hpp"
#include "label_notice.hpp"
#include "bar_chart.hpp"
#include "number_format.hpp"
#include "page_bridge.hpp"
#include "tallyproof_version.hpp"
#include "text_entry.hpp"

namespace tallyproof::web {
namespace {

void draw_title(AppState& s, const Theme& t) {
    ImGui::PushFont(t.heading);
    ImGui::TextUnformatted("Tallyproof");
    ImGui::PopFont();
    const float pad = 2 * ImGui::GetStyle().FramePadding.x, gap = ImGui::GetStyle().ItemSpacing.x;
    const char* theme_label = s.view.dark ? "Light theme" : "Dark theme";
    const char* labels[] = {"Open a file", "Paste", "Save & share ▾", "Examples ▾", theme_label, "Copy results"};
    float buttons = 0;
    for (const char* l : labels) buttons += ImGui::CalcTextSize(l).x + pad + (buttons > 0 ? gap : 0);
    const float right = ImGui::GetWindowContentRegionMax().x;
    std::string subtitle = "chi-square goodness of fit · v" + std::string(TALLYPROOF_VERSION) + " · " + s.reading.source_name;
    ImGui::SameLine();
    const float room = right - ImGui::GetCursorPosX() - buttons - 16;
    if (ImGui::CalcTextSize(subtitle.c_str()).x > room) subtitle = "v" + std::string(TALLYPROOF_VERSION);
    const bool one_line = ImGui::CalcTextSize(subtitle.c_str()).x <= room;
    if (one_line) {
        ImGui::SetCursorPosY(ImGui::GetCursorPosY() + 4);
        ImGui::TextDisabled("%s", subtitle.c_str());
        ImGui::SameLine(right - buttons);
        ImGui::SetCursorPosY(ImGui::GetCursorPosY() - 4);
    } else {
        // Narrow screens: the version beside the name, the buttons below, wrapped as they fit.
        ImGui::SetCursorPosY(ImGui::GetCursorPosY() + 4);
        ImGui::TextDisabled("%s", subtitle.c_str());
    }
    // Between two buttons of the bar: on one line, or wrapped onto the next when it does not fit.
    auto next = [&](const char* label) {
        if (one_line) ImGui::SameLine();
        else flow_next(ImGui::CalcTextSize(label).x + pad);
    };
    if (ImGui::Button("Open a file")) choose_file();
    mark_widget("Open a file");
    if (ImGui::IsItemHovered()) ImGui::SetTooltip("A .csv, .tsv, .txt, .json, .xlsx or .ods file, read here in the browser, never uploaded");
    next("Paste");
    if (ImGui::Button("Paste")) paste_from_clipboard();
    mark_widget("Paste");
    if (ImGui::IsItemHovered()) ImGui::SetTooltip("Counts from the clipboard (Ctrl+V / ⌘V anywhere on the page does the same)");
    next("Save & share ▾");
    if (ImGui::Button("Save & share ▾")) ImGui::OpenPopup("save");
    mark_widget("Save & share");
    if (ImGui::BeginPopup("save")) {
        begin_menu_items(t);
        struct Item { const char* label; int action; };
        const Item items[] = {{"Copy share link", 0}, {"Download analysis (JSON)", 1}, {"Download table (CSV)", 2}, {"Download workbook (.xlsx)", 7},
                              {"Save curve as PNG", 3}, {"Save bars as PNG", 4}, {"Copy chart image", 5}, {"Print or save as PDF", 6}};
        for (const auto& it : items) {
            const bool chosen = ImGui::Selectable(it.label);
            explain_item(it.label, it.label);  // JSON, CSV, PNG, PDF
            if (!chosen) continue;
            switch (it.action) {
                case 0: copy_share_link(s); break;
                case 1: download_document(s); break;
                case 2: download_table(s); break;
                case 3: queue_chart_export(s, ResultTab::curve, static_cast<int>(ImagePurpose::download)); break;
                case 4: queue_chart_export(s, ResultTab::bars, static_cast<int>(ImagePurpose::download)); break;
                case 5: queue_chart_export(s, s.view.tab == ResultTab::bars ? ResultTab::bars : ResultTab::curve, static_cast<int>(ImagePurpose::copy)); break;
                case 6: request_print(s); break;
                case 7: download_workbook(s); break;
            }
        }
        ImGui::Separator();
        ImGui::TextDisabled("Recent analyses (kept in this browser)");
        for (int i = 0; i < static_cast<int>(s.session.recent.size()); ++i) {
            ImGui::PushID(i);
            std::string label = s.session.recent[i].when + "  " + s.session.recent[i].title;
            // On a narrow screen a long title is cut (at a character boundary) so the menu stays on screen.
            const float room = ImGui::GetMainViewport()->Size.x - 2 * ImGui::GetStyle().WindowPadding.x - 24 - ImGui::CalcTextSize("Remove").x - 3 * ImGui::GetStyle().FramePadding.x;
            if (ImGui::CalcTextSize(label.c_str()).x > room) {
                while (label.size() > 1 && ImGui::CalcTextSize((label + "…").c_str()).x > room) {
                    label.pop_back();
                    while (!label.empty() && (static_cast<unsigned char>(label.back()) & 0xC0) == 0x80) label.pop_back();
                    if (!label.empty() && static_cast<unsigned char>(label.back()) >= 0xC0) label.pop_back();
                }
                label += "…";
            }
            if (compact_button("Remove", t)) { remove_recent(s, i); ImGui::PopID(); break; }  // 44 px on touch screens
            mark_widget(("recent-remove-" + std::to_string(i)).c_str());
            ImGui::SameLine();
            if (ImGui::Selectable(label.c_str())) open_recent(s, i);
            mark_widget(("recent-" + std::to_string(i)).c_str());
            ImGui::PopID();
        }
        if (s.session.recent.empty()) ImGui::TextDisabled("none yet");
        ImGui::Separator();
        if (ImGui::Selectable("Start fresh")) start_fresh(s);
        mark_widget("Start fresh");
        end_menu_items(t);
        ImGui::EndPopup();
    }
    next("Examples ▾");
    if (ImGui::Button("Examples ▾")) ImGui::OpenPopup("examples");
    mark_widget("Examples");
    if (ImGui::BeginPopup("examples")) {
        begin_menu_items(t);
        for (int i = 0; i < kDemoScenarioCount; ++i) {
            ImGui::PushID(i);
            if (ImGui::Selectable(kDemoScenarios[i].title, s.view.demo_index == i)) load_demo(s, i);
            mark_widget(kDemoScenarios[i].title);
            ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.muted));
            ImGui::Indent(12);
            ImGui::PushTextWrapPos(ImGui::GetCursorPosX() + std::min(420.0f, ImGui::GetMainViewport()->Size.x - 80));
            ImGui::TextUnformatted(kDemoScenarios[i].story);
            ImGui::PopTextWrapPos();
            ImGui::Unindent(12);
            ImGui::PopStyleColor();
            ImGui::PopID();
        }
        end_menu_items(t);
        ImGui::EndPopup();
    }
    next(theme_label);
    if (ImGui::Button(theme_label)) {
        s.view.dark = !s.view.dark;
        s.view.theme_from_system = false;
        s.view.theme_changed = true;
    }
    mark_widget("Theme");
    next("Copy results");
    if (ImGui::Button("Copy results")) copy_text(s.report);
    mark_widget("Copy results");
}

void draw_notice(AppState& s, const Theme& t) {
    if (s.view.notice.empty()) return;
    if (compact_button("OK", t)) s.view.notice.clear();
    mark_widget("notice-ok");
    ImGui::SameLine();
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.accent));
    wrapped_text(s.view.notice.c_str());
    ImGui::PopStyleColor();
}

// The refused line, cell by cell, with the cell the message names boxed in the warning colour.
void draw_refused_line(const AppState& s, const Theme& t) {
    ImGui::Text("Line %d:", s.refused.line);
    const std::vector<std::string>& cells = s.refused.cells;
    ImDrawList* dl = ImGui::GetWindowDrawList();
    for (std::size_t c = 0; c < cells.size() && c < 12; ++c) {
        ImGui::SameLine(0, c == 0 ? 8.0f : 14.0f);
        const bool marked = static_cast<int>(c) + 1 == s.refused.column;
        const std::string shown = cells[c].empty() ? std::string("(empty)") : cells[c].substr(0, 40);
        if (marked) {
            const ImVec2 p = ImGui::GetCursorScreenPos(), size = ImGui::CalcTextSize(shown.c_str());
            dl->AddRectFilled(ImVec2(p.x - 4, p.y - 1), ImVec2(p.x + size.x + 4, p.y + size.y + 1), t.paper, 3.0f);
            dl->AddRect(ImVec2(p.x - 4, p.y - 1), ImVec2(p.x + size.x + 4, p.y + size.y + 1), t.warn_ink, 3.0f, 0, 2.0f);
            ImGui::PushFont(t.strong);
            ImGui::TextUnformatted(shown.c_str());
            ImGui::PopFont();
            mark_widget("refused cell");
        } else {
            ImGui::TextUnformatted(shown.c_str());
        }
    }
    if (cells.size() > 12) {
        ImGui::SameLine();
        ImGui::TextUnformatted("…");
    }
}

void draw_rejection_notice(AppState& s, const Theme& t) {
    if (s.refused.message.empty()) return;
    ImGui::PushStyleColor(ImGuiCol_ChildBg, ImGui::ColorConvertU32ToFloat4(t.warn_bg));
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.warn_ink));
    const ImGuiStyle& style = ImGui::GetStyle();
    const std::string headline = (s.refused.file.empty() ? "Paste not used: " : "File not used: ") + s.refused.message;
    const float wrap = ImGui::GetContentRegionAvail().x - style.WindowPadding.x * 2;
    ImGui::PushFont(t.strong);
    float h = ImGui::CalcTextSize(headline.c_str(), nullptr, false, wrap).y + style.ItemSpacing.y;
    ImGui::PopFont();
    h += ImGui::GetFrameHeightWithSpacing() * (t.touch && wrap < 560 ? 2.0f : 1.0f);  // the line with its buttons
    if (!s.refused.cells.empty()) h += ImGui::GetTextLineHeightWithSpacing() + 2;
    const float editor_h = ImGui::GetTextLineHeight() * 8 + style.FramePadding.y * 2;
    if (s.refused.fix_open) h += editor_h + style.ItemSpacing.y + ImGui::GetFrameHeightWithSpacing();
    const bool sheets = shows_sheet_row(s) && !s.refused.file.empty() && s.refused.file == s.reading.workbook.name;
    if (sheets) h += ImGui::GetFrameHeightWithSpacing();
    h += style.WindowPadding.y * 2;
    ImGui::BeginChild("rejected", ImVec2(0, h), true, ImGuiWindowFlags_NoScrollbar);
    ImGui::PushFont(t.strong);
    wrapped_text(headline.c_str());
    ImGui::PopFont();
    if (!s.refused.cells.empty()) draw_refused_line(s, t);
    if (sheets) {  // another sheet of the same workbook may hold the counts
        ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.ink));
        draw_sheet_row(s, t);
        ImGui::PopStyleColor();
    }
    ImGui::AlignTextToFramePadding();
    ImGui::TextUnformatted("The analysis below is still the previous one.");
    if (!s.refused.text.empty() && !s.refused.fix_open) {
        flow_next(ImGui::CalcTextSize("Fix it here").x + 2 * ImGui::GetStyle().FramePadding.x);
        if (compact_button("Fix it here", t)) edit_refused_paste(s, true);
        mark_widget("fix it here");
    } else if (s.refused.text.empty()) {
        const char* next = s.refused.file.empty() ? "Fix the source and paste again." : "Choose another file, or copy the cells and paste them.";
        flow_next(ImGui::CalcTextSize(next).x);
        ImGui::TextUnformatted(next);
    }
    flow_next(ImGui::CalcTextSize("Dismiss").x + 2 * ImGui::GetStyle().FramePadding.x);
    if (compact_button("Dismiss", t)) dismiss_refusal(s);
    mark_widget("dismiss refusal");
    if (s.refused.fix_open) {
        ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.ink));
        text_field("##fix", &s.refused.fix_text, FieldKeys::multiline, ImGuiInputTextFlags_AllowTabInput, nullptr, ImVec2(-1, editor_h));
        mark_widget("refused paste editor");
        ImGui::PopStyleColor();
        if (ImGui::Button("Read the edited text")) apply_fixed_paste(s);
        mark_widget("read edited paste");
        flow_next(ImGui::CalcTextSize("Close the editor").x + 2 * ImGui::GetStyle().FramePadding.x);
        if (ImGui::Button("Close the editor")) edit_refused_paste(s, false);
    }
    ImGui::EndChild();
    ImGui::PopStyleColor(2);
}

// The inputs: in a bordered panel of `height` beside the results (wide screens), or in the page's
// own scrolling column (narrow screens, height 0), where the counts table takes up to most of
// the screen's height.
void draw_inputs(AppState& s, const Theme& t, float height) {
    const bool panel = height > 0;
    if (panel) ImGui::BeginChild("inputs", ImVec2(0, height), true, ImGuiWindowFlags_NavFlattened);
    const float row_h = ImGui::GetFrameHeight() + ImGui::GetStyle().CellPadding.y * 2;
    const bool bin_row = shows_bin_editor(s);  // the bins under "Read as"
    const float needed = row_h * static_cast<float>(s.analysis.observed.size() + 2) + ImGui::GetTextLineHeightWithSpacing() * 4 +
                         ImGui::GetFrameHeightWithSpacing() * ((bin_row ? 2 : 1) + (offers_other_readings(s) ? 1 : 0)) + 24;
    const float room = panel ? ImGui::GetContentRegionAvail().y - 360 : ImGui::GetMainViewport()->Size.y * 0.85f;
    const float counts_h = std::max(160.0f, std::min(needed, room));
    ImGui::BeginChild("counts-area", ImVec2(0, counts_h), false, ImGuiWindowFlags_NavFlattened);
    draw_counts_panel(s, t);
    ImGui::EndChild();
    ImGui::Separator();
    draw_model_panel(s, t);
    ImGui::Separator();
    draw_test_panel(s, t);
    if (panel) ImGui::EndChild();
}

// The open result view (s.view.tab), over the room left above its notes and cautions.
void draw_view(AppState& s, const Theme& t) {
    const ImVec2 avail = ImGui::GetContentRegionAvail();
    float cautions_h = 0;  // room for the notes and cautions under the view
    for (const auto* list : {&s.result.warnings, &s.result.cautions, &s.result.questions})
        for (const auto& w : *list)
            cautions_h += ImGui::CalcTextSize(("Caution: " + w).c_str(), nullptr, false, avail.x).y + ImGui::GetStyle().ItemSpacing.y;
    cautions_h += ImGui::GetFrameHeightWithSpacing() * static_cast<float>(s.result.questions.size());  // "They are counts"
    const ImVec2 area(avail.x, std::max(200.0f, avail.y - cautions_h));
    switch (s.view.tab) {
        case ResultTab::curve: draw_density_plot(s.curve, s.result, area, t); break;
        case ResultTab::bars: draw_bar_chart(s.result, area, t); break;
        case ResultTab::categories:
            ImGui::BeginChild("cat-area", area);
            draw_categories_table(s, t);
            ImGui::EndChild();
            break;
        case ResultTab::planning:
            ImGui::BeginChild("plan-area", area);
            draw_planning_panel(s, t);
            ImGui::EndChild();
            break;
        case ResultTab::writeup:
            ImGui::BeginChild("writeup-area", area);
            draw_writeup_panel(s, t);
            ImGui::EndChild();
            break;
        case ResultTab::funnel: break;  // drawn by the Groups view
    }
}

void draw_results(AppState& s, const Theme& t, float height) {
    ImGui::BeginChild("results", ImVec2(0, height), true, ImGuiWindowFlags_NavFlattened);
    if (s.groups.open && s.groups.opened < 0) {  // many groups: the screen in place of one result
        draw_groups_view(s, t);
        ImGui::EndChild();
        return;
    }
    if (s.groups.open) draw_group_banner(s, t);
    draw_verdict_panel(s, t);
    ImGui::Spacing();
    draw_validity_panel(s, t);
    struct Tab { const char* name; ResultTab tab; };
    const Tab tabs[] = {{"Curve", ResultTab::curve}, {"Bars", ResultTab::bars}, {"Where it differs", ResultTab::categories},
                        {"Planning", ResultTab::planning}, {"Write-up", ResultTab::writeup}};
    const ImGuiStyle& style = ImGui::GetStyle();
    float tabs_w = 0;
    for (const auto& tab : tabs) tabs_w += ImGui::CalcTextSize(tab.name).x + 2 * style.FramePadding.x + style.ItemInnerSpacing.x;
    if (tabs_w <= ImGui::GetContentRegionAvail().x) {
        if (ImGui::BeginTabBar("views")) {
            for (const auto& tab : tabs) {
                const bool open = ImGui::BeginTabItem(tab.name);
                mark_widget(tab.name);
                if (open) {
                    s.view.tab = tab.tab;
                    draw_view(s, t);
                    ImGui::EndTabItem();
                }
            }
            ImGui::EndTabBar();
        }
    } else {
        // Too narrow for the tab names in full: the views as buttons that wrap, the open one marked.
        for (std::size_t i = 0; i < sizeof tabs / sizeof tabs[0]; ++i) {
            if (i) flow_next(ImGui::CalcTextSize(tabs[i].name).x + 2 * style.FramePadding.x);
            const bool open = s.view.tab == tabs[i].tab;
            if (open) ImGui::PushStyleColor(ImGuiCol_Button, style.Colors[ImGuiCol_HeaderActive]);
            if (ImGui::Button(tabs[i].name)) s.view.tab = tabs[i].tab;
            if (open) ImGui::PopStyleColor();
            mark_widget(tabs[i].name);
        }
        draw_view(s, t);
    }
    for (const auto& w : s.result.warnings) muted_wrapped(t, "Note: %s", w.c_str());
    for (std::size_t i = 0; i < s.result.questions.size(); ++i) {  // a quiet question, answered with one tap
        ImGui::PushID(static_cast<int>(i));
        muted_wrapped(t, "%s", s.result.questions[i].c_str());
        if (ImGui::Button("They are counts")) { dismiss_question(s, static_cast<int>(i)); ImGui::PopID(); break; }
        mark_widget("They are counts");
        ImGui::PopID();
    }
    for (const auto& c : s.result.cautions) muted_wrapped(t, "Caution: %s", c.c_str());
    ImGui::EndChild();
}

}  // namespace

void draw_screen(AppState& s, const Theme& t) {
    const ImGuiViewport* vp = ImGui::GetMainViewport();
    ImGui::SetNextWindowPos(vp->Pos);
    ImGui::SetNextWindowSize(vp->Size);
    const bool wide = vp->Size.x >= 900;
    if (s.view.focus_screen) {  // keyboard users start on the page, without a click first
        ImGui::SetNextWindowFocus();
        s.view.focus_screen = false;
    }
    ImGui::Begin("Tallyproof", nullptr,
                 ImGuiWindowFlags_NoDecoration | ImGuiWindowFlags_NoMove | ImGuiWindowFlags_NoSavedSettings |
                     ImGuiWindowFlags_NoBringToFrontOnFocus | (wide ? ImGuiWindowFlags_NoScrollbar : 0));
    draw_title(s, t);
    draw_notice(s, t);
    draw_rejection_notice(s, t);
    draw_look_alike_notice(s, t);
    const ImVec2 avail = ImGui::GetContentRegionAvail();
    if (wide) {
        const float inputs_w = std::clamp(avail.x * 0.36f, 340.0f, 520.0f);
        ImGui::BeginChild("left", ImVec2(inputs_w, avail.y), false, ImGuiWindowFlags_NavFlattened);
        draw_inputs(s, t, avail.y);
        ImGui::EndChild();
        ImGui::SameLine();
        ImGui::BeginChild("right", ImVec2(0, avail.y), false, ImGuiWindowFlags_NavFlattened);
        draw_results(s, t, avail.y);
        ImGui::EndChild();
    } else {
        // Narrow screens: the verdict first, then the inputs; the page scrolls.
        draw_results(s, t, std::max(560.0f, vp->Size.y * 0.9f));
        ImGui::Separator();
        draw_inputs(s, t, 0);
    }
    ImGui::End();
}

}  // namespace tallyproof::web
