// Text entry through the page's own input element. While an ImGui text field is active, a real,
// visually hidden <input> (or <textarea>) lies over it with the field's text: touch keyboards,
// input methods (composition), paste and deletion all happen in that element, and its whole text
// and selection drive the ImGui field. Fields drawn with text_field() take part; the page glue
// (shell.html) places, focuses and reads the element.
#pragma once
#include <imgui.h>

#include <string>

namespace tallyproof::web {

enum class FieldKeys { text = 0, decimal = 1, whole = 2, multiline = 3 };  // the keyboard a field asks for

// ImGui::InputTextWithHint (or InputTextMultiline, with `size`) taking part in page text entry.
bool text_field(const char* id, std::string* text, FieldKeys keys, ImGuiInputTextFlags flags = 0,
                const char* hint = nullptr, ImVec2 size = ImVec2(0, 0));
void publish_text_entry();                          // after each frame: tells the page where the active field is, if any
void receive_text_entry(const char* text, int length, int selection_start, int selection_end);  // the element's text (UTF-8 byte offsets)
void end_text_entry();                              // the element lost focus: the active field stops editing

}  // namespace tallyproof::web
