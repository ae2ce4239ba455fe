// Draws the look-alike labels notice; the groups come from the Result (core/text/label_text.hpp) and
// the merge is the AppState transition merge_look_alike_labels.
#include "label_notice.hpp"

#include <string>

#include <imgui.h>

#include "label_text.hpp"
#include "page_bridge.hpp"

namespace tallyproof::web {

void draw_look_alike_notice(AppState& s, const Theme& t) {
    const auto& groups = s.result.look_alike_labels;
    if (groups.empty() || !s.result.status.ok) return;
    std::string names = quoted_labels(s.result.categories, groups.front());  // the first group, then how many more
    if (groups.size() > 1) names += " (and " + std::to_string(groups.size() - 1) + (groups.size() == 2 ? " more group)" : " more groups)");
    const std::string text = "These labels look the same: " + names + ". Merge them?";
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.warn_ink));
    ImGui::AlignTextToFramePadding();
    ImGui::TextUnformatted(text.c_str());
    mark_widget("look-alike labels");
    ImGui::PopStyleColor();
    ImGui::SameLine();
    if (ImGui::SmallButton(groups.size() == 1 ? "Merge them" : "Merge each group")) merge_look_alike_labels(s);
    mark_widget("Merge look-alike labels");
}

}  // namespace tallyproof::web
