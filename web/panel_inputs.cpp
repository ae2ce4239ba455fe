// Input panels: the counts table (editable, rows added, removed and reordered), the expected
// mix (model kind, values, parameters given or estimated) and the test settings.
#include <imgui.h>
#include <imgui_internal.h>  // TableSetColumnWidth
#include <imgui_stdlib.h>

#include <algorithm>
#include <cmath>
#include <cstdarg>
#include <cstdio>
#include <cstdlib>
#include <string>

#include "conformity.hpp"
#include "glossary.hpp"
#include "number_reading.hpp"
#include "number_format.hpp"
#include "page_bridge.hpp"
#include "panels.hpp"
#include "null_model.hpp"
#include "paste_parser.hpp"
#include "power_divergence.hpp"
#include "text_entry.hpp"

namespace tallyproof::web {
namespace {

struct KindChoice { ModelKind kind; const char* label; };
constexpr KindChoice kKinds[] = {
    {ModelKind::equal, "Equal shares"},
    {ModelKind::shares, "Stated shares (fractions or %)"},
    {ModelKind::ratio, "Ratio, such as 9:3:3:1"},
    {ModelKind::counts, "Expected counts"},
    {ModelKind::poisson, "Poisson (counts per unit)"},
    {ModelKind::binomial, "Binomial (successes of n trials)"},
    {ModelKind::geometric, "Geometric"},
    {ModelKind::negative_binomial, "Negative binomial"},
    {ModelKind::uniform, "Uniform over whole numbers"},
    {ModelKind::normal, "Normal (binned measurements)"},
    {ModelKind::lognormal, "Lognormal (binned measurements)"},
    {ModelKind::exponential, "Exponential (binned measurements)"},
    {ModelKind::benford_first, "Benford: first digit"},
    {ModelKind::benford_second, "Benford: second digit"},
    {ModelKind::benford_first_two, "Benford: first two digits"},
    {ModelKind::last_digit, "Last digit uniform (0-9)"},
    {ModelKind::last_digit_even, "Last digit uniform (even only)"},
    {ModelKind::reference_sample, "A previous sample's counts"},
};

const char* kind_label(ModelKind k) {
    for (const auto& c : kKinds) if (c.kind == k) return c.label;
    return "?";
}

struct LambdaChoice { double lambda; const char* label; };
constexpr LambdaChoice kLambdas[] = {
    {1.0, "Pearson χ² (λ = 1)"},
    {0.0, "Likelihood ratio G² (λ = 0)"},
    {2.0 / 3.0, "Cressie-Read CR (λ = 2/3)"},
    {-0.5, "Freeman-Tukey T² (λ = −1/2)"},
    {-1.0, "Modified likelihood ratio GM² (λ = −1)"},
    {-2.0, "Neyman NM² (λ = −2)"},
};

bool parse_count_cell(const std::string& text, double* v) {
    return read_typed_number(text, v) && std::isfinite(*v);
}

// Survey rows: the columns of the category, weight, stratum and cluster, each chosen from the
// first line's cells; a change reads the paste again as survey rows (a design-corrected test).
void draw_survey_row(AppState& s, const Theme& t) {
    const std::vector<std::string> header = pasted_header(s);
    SurveyColumns c = s.reading.survey_columns;
    struct Pick { const char* name; std::string* column; bool optional; const char* tip; };
    const Pick picks[] = {
        {"Category", &c.category, false, "The column holding each respondent's category."},
        {"Weight", &c.weight, true, "The sampling weight of each respondent (none: every weight 1)."},
        {"Stratum", &c.stratum, true, "The stratum of each respondent (none: one stratum)."},
        {"Cluster", &c.cluster, true, "The cluster (primary sampling unit) of each respondent, nested in its stratum (none: each respondent its own)."},
    };
    bool changed = false;
    for (const Pick& p : picks) {
        const std::string shown = p.column->empty() ? std::string("(none)") : *p.column;
        const float w = std::max(ImGui::CalcTextSize("(none)").x, ImGui::CalcTextSize(shown.c_str()).x) + ImGui::GetFrameHeight() + 16;
        flow_next(ImGui::CalcTextSize(p.name).x + ImGui::GetStyle().ItemInnerSpacing.x + w);
        ImGui::BeginGroup();
        ImGui::AlignTextToFramePadding();
        ImGui::TextUnformatted(p.name);
        ImGui::SameLine(0, ImGui::GetStyle().ItemInnerSpacing.x);
        ImGui::SetNextItemWidth(w);
        const std::string id = std::string("##survey-") + p.name;
        if (ImGui::BeginCombo(id.c_str(), shown.c_str(), ImGuiComboFlags_HeightLarge)) {
            begin_menu_items(t);
            if (p.optional && ImGui::Selectable("(none)", p.column->empty()) && !p.column->empty()) { p.column->clear(); changed = true; }
            if (p.optional) mark_widget((std::string("survey ") + p.name + " (none)").c_str());
            for (const std::string& h : header) {
                if (h.empty()) continue;
                if (ImGui::Selectable(h.c_str(), h == *p.column) && h != *p.column) { *p.column = h; changed = true; }
                mark_widget((std::string("survey ") + p.name + " " + h).c_str());
            }
            end_menu_items(t);
            ImGui::EndCombo();
        }
        mark_widget((std::string("survey ") + p.name).c_str());
        if (ImGui::IsItemHovered()) ImGui::SetTooltip("%s", p.tip);
        ImGui::EndGroup();
    }
    if (changed) read_paste_as_survey(s, c);
}

// A first guess at the survey columns from the header's names: a weight, stratum and cluster
// column named as such, and the first other column that is not a respondent's number.
SurveyColumns guess_survey_columns(const std::vector<std::string>& header) {
    SurveyColumns c;
    auto has = [](std::string h, std::initializer_list<const char*> words) {
        for (char& ch : h) ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
        for (const char* w : words)
            if (h.find(w) != std::string::npos) return true;
        return false;
    };
    for (const std::string& h : header) {
        if (c.weight.empty() && has(h, {"weight", "wgt", "pwt"})) c.weight = h;
        else if (c.stratum.empty() && has(h, {"strat"})) c.stratum = h;
        else if (c.cluster.empty() && has(h, {"cluster", "psu"})) c.cluster = h;
    }
    for (const std::string& h : header)
        if (c.category.empty() && h != c.weight && h != c.stratum && h != c.cluster && !h.empty() &&
            !has(h, {"id", "respondent", "number", "no."}))
            c.category = h;
    return c;
}

// The bins of a "measurements in bins" reading: K, or the stated edges, applied on Enter or Apply.
void draw_bin_row(AppState& s, const Theme& t) {
    const ImGuiStyle& style = ImGui::GetStyle();
    const float apply_w = ImGui::CalcTextSize("Apply").x + style.FramePadding.x * 2;
    bool apply = false;
    ImGui::AlignTextToFramePadding();
    if (s.reading.bins.kind == BinChoice::Kind::edges) {
        ImGui::TextUnformatted("Edges");
        ImGui::SameLine();
        ImGui::SetNextItemWidth(-(apply_w + style.ItemSpacing.x));
        apply |= text_field("##bin-edges", &s.reading.bin_editor.edges, FieldKeys::text, ImGuiInputTextFlags_EnterReturnsTrue, "0, 10, 20, inf");
        mark_widget("bin edges");
        if (ImGui::IsItemHovered()) ImGui::SetTooltip("Bin edges in increasing order, separated by commas; -inf and inf leave the ends open.");
    } else {
        ImGui::TextUnformatted("Bins");
        ImGui::SameLine();
        ImGui::SetNextItemWidth(ImGui::CalcTextSize("00000").x + style.FramePadding.x * 2);
        apply |= text_field("##bin-count", &s.reading.bin_editor.count, FieldKeys::whole, ImGuiInputTextFlags_CharsDecimal | ImGuiInputTextFlags_EnterReturnsTrue);
        mark_widget("number of bins");
        if (ImGui::IsItemHovered()) ImGui::SetTooltip("The number of bins K, from 2 to %d.", kMaxBinsOnPage);
    }
    ImGui::SameLine();
    apply |= ImGui::Button("Apply");
    mark_widget("apply bins");
    if (s.reading.bins.kind != BinChoice::Kind::edges) {
        // What the bins are, in case the "Read as" box is too narrow to show it all.
        const ModelKind model = s.reading.bins.model.value_or(ModelKind::normal);
        const char* what = s.reading.bins.kind == BinChoice::Kind::equal_width ? "of equal width"
                           : model == ModelKind::lognormal                     ? "lognormal fit"
                           : model == ModelKind::exponential                   ? "exponential fit"
                                                                               : "normal fit";
        ImGui::SameLine();
        if (ImGui::GetContentRegionAvail().x >= ImGui::CalcTextSize(what).x) {
            ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.muted));
            ImGui::TextUnformatted(what);
            ImGui::PopStyleColor();
        } else {
            ImGui::NewLine();
        }
    }
    if (apply) apply_bin_editor(s);
    if (!s.reading.bin_editor.error.empty()) {
        ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.warn_ink));
        wrapped_text(("Bins not applied: " + s.reading.bin_editor.error).c_str());
        ImGui::PopStyleColor();
    }
}

// The test's goal: find a departure, or show the mix conforms within a margin w0 (equivalence test).
void draw_goal_rows(AppState& s, const Theme& t) {
    ConformityChoice& c = s.analysis.conformity;
    ImGui::AlignTextToFramePadding();
    ImGui::TextUnformatted("Goal");
    ImGui::SameLine(74);
    int goal = c.requested ? 1 : 0;
    bool changed = ImGui::RadioButton("find a departure", &goal, 0);
    mark_widget("find a departure");
    flow_next(radio_width("show it conforms within w0"));  // wraps on a phone rather than running past the edge
    if (ImGui::GetCursorPosX() < 74) ImGui::SetCursorPosX(74);
    changed |= ImGui::RadioButton("show it conforms within w0", &goal, 1);
    explain_item("show it conforms", "show it conforms within w0");
    const bool in_points = std::isfinite(c.margin_points);
    const double margin = std::isfinite(c.margin_w) ? c.margin_w : 0.1;
    if (changed) {
        if (goal == 1 && in_points) set_conformity_margin_text(s, format_plain(c.margin_points) + " pp");
        else set_test_goal(s, goal == 1, margin);
    }
    if (!c.requested) return;
    ImGui::SetCursorPosX(74 + ImGui::GetStyle().WindowPadding.x);
    const std::string shown = in_points ? format_plain(c.margin_points) + " pp" : format_plain(margin);
    std::string w0_text = shown;
    ImGui::SetNextItemWidth(100);
    // A text field like α's, so a touch screen's keyboard opens (text_entry.hpp); a value that
    // cannot be read goes to set_test_goal as NaN and is refused there with its message.
    const bool w0_done = text_field("##margin-w0", &w0_text, FieldKeys::text,  // "2 pp" needs letters
                                    ImGuiInputTextFlags_EnterReturnsTrue) ||
                         ImGui::IsItemDeactivatedAfterEdit();
    explain_item("margin w0", "margin w0");
    // Each form of the margin shown with the other: w0 and the shift in percentage points.
    const Result& r = s.result;
    std::string other = "margin w0";
    if (r.conformity && std::isfinite(r.conformity->margin_points) && std::isfinite(r.conformity->margin_w))
        other = in_points ? "margin, w0 = " + format_fixed(r.conformity->margin_w, 3)
                          : "margin w0 (" + format_significant(r.conformity->margin_points, 2) + " pp)";
    flow_next(ImGui::CalcTextSize(other.c_str()).x);
    ImGui::TextUnformatted(other.c_str());
    explain_item("margin w0 label", "margin w0");
    if (w0_done && w0_text != shown) set_conformity_margin_text(s, w0_text);
    muted_wrapped(t, "%s", conformity_margin_guidance());
}

}  // namespace

void section_title(const char* title, const Theme& theme) {
    ImGui::PushFont(theme.strong);
    ImGui::PushTextWrapPos(0.0f);  // wraps on a narrow screen instead of running past its edge
    ImGui::TextUnformatted(title);
    ImGui::PopTextWrapPos();
    ImGui::PopFont();
}

void muted_wrapped(const Theme& theme, const char* fmt, ...) {
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(theme.muted));
    char text[2048];
    va_list args;
    va_start(args, fmt);
    std::vsnprintf(text, sizeof text, fmt, args);
    va_end(args);
    wrapped_text(text);
    ImGui::PopStyleColor();
}

// ImGui's own wrapping also breaks after '.' and ',', which splits numbers such as 0.123 or
// 1,234 across lines; here lines break only at spaces (a word wider than the line stays whole).
void wrapped_text(const char* text) {
    const float width = std::max(40.0f, ImGui::GetContentRegionAvail().x);
    std::string out, line;
    const char* p = text;
    for (;;) {
        const char* end = p;
        while (*end && *end != ' ' && *end != '\n') ++end;
        const std::string word(p, end);
        const std::string candidate = line.empty() ? word : line + " " + word;
        if (!line.empty() && ImGui::CalcTextSize(candidate.c_str()).x > width) {
            out += line + "\n";
            line = word;
        } else {
            line = candidate;
        }
        if (*end == '\n' || !*end) {
            out += line;
            line.clear();
            if (!*end) break;
            out += "\n";
        }
        p = end + 1;
    }
    ImGui::TextUnformatted(out.c_str());
}

void coloured_text(ImU32 colour, const char* text) {
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(colour));
    wrapped_text(text);
    ImGui::PopStyleColor();
}

// The explained item a tap landed on (its name), shown until the next tap; one page, one finger.
struct TapExplanation {
    bool tapping = false;
    std::string pinned;
};
TapExplanation g_tap;

void note_tap(bool starts, bool on) {
    if (starts) g_tap.pinned.clear();
    g_tap.tapping = on;
}

void explain_item(const char* name, const std::string& shown) {
    mark_explained(name, shown);
    const bool hovered = ImGui::IsItemHovered();
    if (hovered && g_tap.tapping) g_tap.pinned = name;
    const bool pinned = !hovered && !g_tap.pinned.empty() && g_tap.pinned == name;
    if (!hovered && !pinned) return;
    const std::string notes = glossary_notes(shown);
    if (notes.empty()) return;
    if (pinned) {  // under the tapped item (above it near the bottom), kept on screen
        const ImVec2 screen = ImGui::GetMainViewport()->Size;
        const float width = std::min(ImGui::GetFontSize() * 26 + 2 * ImGui::GetStyle().WindowPadding.x, screen.x - 8);
        const ImVec2 lo = ImGui::GetItemRectMin(), hi = ImGui::GetItemRectMax();
        const float x = std::clamp(lo.x, 4.0f, std::max(4.0f, screen.x - width - 4));
        const bool above = hi.y > screen.y * 0.6f;
        ImGui::SetNextWindowPos(ImVec2(x, above ? lo.y - 4 : hi.y + 4), ImGuiCond_Always, ImVec2(0, above ? 1.0f : 0.0f));
    }
    ImGui::BeginTooltip();
    ImGui::PushTextWrapPos(std::min(ImGui::GetFontSize() * 26, ImGui::GetMainViewport()->Size.x - 8 - 2 * ImGui::GetStyle().WindowPadding.x));
    ImGui::TextUnformatted(notes.c_str());
    ImGui::PopTextWrapPos();
    ImGui::EndTooltip();
    note_tooltip(notes);
}

void explained_text(const char* name, const std::string& text) {
    wrapped_text(text.c_str());
    explain_item(name, text);
}

// Menu and list items: 44 px apart on touch screens (a Selectable's target spans its spacing).
void begin_menu_items(const Theme& theme) {
    const ImVec2 spacing = ImGui::GetStyle().ItemSpacing;
    ImGui::PushStyleVar(ImGuiStyleVar_ItemSpacing, theme.touch ? ImVec2(spacing.x, 44 - ImGui::GetTextLineHeight()) : spacing);
}
void end_menu_items(const Theme&) { ImGui::PopStyleVar(); }

bool compact_button(const char* label, const Theme& theme) {
    if (!theme.touch) return ImGui::SmallButton(label);
    const float h = ImGui::GetFrameHeight();
    return ImGui::Button(label, ImVec2(std::max(h, ImGui::CalcTextSize(label).x + 2 * ImGui::GetStyle().FramePadding.x), h));
}

void flow_next(float width) {
    const float right = ImGui::GetItemRectMax().x + ImGui::GetStyle().ItemSpacing.x + width;
    const float edge = ImGui::GetWindowPos().x + ImGui::GetWindowContentRegionMax().x;
    if (right <= edge) ImGui::SameLine();
}

float radio_width(const char* label) {
    return ImGui::GetFrameHeight() + ImGui::GetStyle().ItemInnerSpacing.x + ImGui::CalcTextSize(label).x;
}

bool number_field(const char* id, double* value, const char* format, FieldKeys keys) {
    char shown[64];
    std::snprintf(shown, sizeof shown, format, *value);
    std::string text = shown;
    const bool done = text_field(id, &text, keys, ImGuiInputTextFlags_CharsScientific | ImGuiInputTextFlags_EnterReturnsTrue) ||
                      ImGui::IsItemDeactivatedAfterEdit();
    double v = 0;
    if (!done || !parse_count_cell(text, &v) || v == *value) return false;
    *value = v;
    return true;
}

// The sheet of the workbook last opened, chosen from its sheets (shown when it has two or more).
bool shows_sheet_row(const AppState& s) { return s.reading.workbook.sheets.size() > 1; }

void draw_sheet_row(AppState& s, const Theme& t) {
    const WorkbookSource& w = s.reading.workbook;
    if (w.sheets.size() < 2) return;
    auto name_of = [](const WorkbookSheetInfo& i) {
        return i.name + (i.hidden ? " (hidden)" : "") + (i.empty ? " (empty)" : "");
    };
    const std::string shown = w.sheet < w.sheets.size() ? name_of(w.sheets[w.sheet]) : std::string();
    ImGui::AlignTextToFramePadding();
    ImGui::TextUnformatted("Sheet");
    ImGui::SameLine();
    ImGui::SetNextItemWidth(-1);
    int chosen = -1;
    if (ImGui::BeginCombo("##sheet", shown.c_str(), ImGuiComboFlags_HeightLarge)) {
        begin_menu_items(t);
        for (std::size_t i = 0; i < w.sheets.size(); ++i) {
            const std::string label = name_of(w.sheets[i]);
            ImGui::PushID(static_cast<int>(i));
            if (ImGui::Selectable(label.c_str(), i == w.sheet) && i != w.sheet) chosen = static_cast<int>(i);
            mark_widget(("sheet " + w.sheets[i].name).c_str());
            ImGui::PopID();
        }
        end_menu_items(t);
        ImGui::EndCombo();
    }
    mark_widget("Sheet");
    if (ImGui::IsItemHovered()) ImGui::SetTooltip("The sheet of %s the counts are read from", w.name.c_str());
    if (chosen >= 0) choose_sheet(s, chosen);
}

// What the last paste was read as, and the other readings on offer ("Read as"); the bins'
// row under it when the paste was counted into bins.
static void draw_read_as_row(AppState& s, const Theme& t) {
    // What the last paste was read as, and the other readings on offer.
    using Bins = BinChoice::Kind;
    struct Reading { InputShape shape; int digits; Bins bins; ModelKind model; const char* name; int third = -1; };
    const Reading readings[] = {
        {InputShape::label_count, -1, Bins::none, ModelKind::equal, "label and count"},
        {InputShape::label_observed_expected, -1, Bins::none, ModelKind::equal, "label, observed, expected", 0},
        {InputShape::label_observed_expected, -1, Bins::none, ModelKind::equal, "label, observed, previous sample", 1},
        {InputShape::counts_column, -1, Bins::none, ModelKind::equal, "one column of counts"},
        {InputShape::counts_row, -1, Bins::none, ModelKind::equal, "one row of counts"},
        {InputShape::raw_text, -1, Bins::none, ModelKind::equal, "raw values to tally"},
        {InputShape::raw_whole_numbers, -1, Bins::none, ModelKind::equal, "raw whole numbers"},
        {InputShape::raw_digits, static_cast<int>(DigitTest::first), Bins::none, ModelKind::equal, "first digits of raw numbers"},
        {InputShape::raw_digits, static_cast<int>(DigitTest::second), Bins::none, ModelKind::equal, "second digits of raw numbers"},
        {InputShape::raw_digits, static_cast<int>(DigitTest::first_two), Bins::none, ModelKind::equal, "first two digits of raw numbers"},
        {InputShape::raw_digits, static_cast<int>(DigitTest::last), Bins::none, ModelKind::equal, "last digits of raw numbers"},
        {InputShape::raw_bins, -1, Bins::equal_width, ModelKind::equal, "measurements in equal-width bins"},
        {InputShape::raw_bins, -1, Bins::equal_probability, ModelKind::normal, "measurements in equal-probability bins (normal)"},
        {InputShape::raw_bins, -1, Bins::equal_probability, ModelKind::lognormal, "measurements in equal-probability bins (lognormal)"},
        {InputShape::raw_bins, -1, Bins::equal_probability, ModelKind::exponential, "measurements in equal-probability bins (exponential)"},
        {InputShape::raw_bins, -1, Bins::edges, ModelKind::equal, "measurements in bins with stated edges"},
    };
    const int count = static_cast<int>(sizeof readings / sizeof readings[0]);
    int current = -1;
    DigitTest shown = DigitTest::first;
    const bool digit_model = digit_test_of(s.analysis.model.kind, &shown);
    const Bins bins = s.reading.bins.kind;
    const ModelKind bin_model = s.reading.bins.model.value_or(ModelKind::normal);
    for (int i = 0; i < count; ++i) {
        const bool same_digits = readings[i].digits < 0 || (digit_model && readings[i].digits == static_cast<int>(shown));
        const bool same_bins = readings[i].bins == bins && (bins != Bins::equal_probability || readings[i].model == bin_model);
        const bool same_third = readings[i].third < 0 || (readings[i].third == 1) == s.reading.previous;
        if (static_cast<int>(readings[i].shape) == s.reading.shape && same_digits && same_bins && same_third) current = i;
    }
    ImGui::AlignTextToFramePadding();
    ImGui::TextUnformatted("Read as");
    ImGui::SameLine();
    ImGui::SetNextItemWidth(-1);
    const char* preview = s.groups.open ? "groups: one test per group"
                          : s.reading.survey ? "survey rows: one per respondent (weights, strata, clusters)"
                          : current >= 0 ? readings[current].name : input_shape_name(static_cast<InputShape>(s.reading.shape));
    if (s.groups.open || s.reading.survey) current = -1;
    if (ImGui::BeginCombo("##shape", preview,
                          ImGuiComboFlags_HeightLargest)) {  // every reading in view, none behind a scroll
        begin_menu_items(t);
        for (int i = 0; i < count; ++i) {
            // A previous sample's column is offered where a third column was read.
            if (readings[i].third == 1 && s.reading.shape != static_cast<int>(InputShape::label_observed_expected)) continue;
            if (ImGui::Selectable(readings[i].name, i == current) && i != current) {
                if (readings[i].bins != Bins::none) read_paste_into_bins(s, readings[i].bins, readings[i].model);
                else reread_paste(s, static_cast<int>(readings[i].shape), readings[i].digits, readings[i].third);
            }
            mark_widget(readings[i].name);
        }
        if (ImGui::Selectable("survey rows: one per respondent (weights, strata, clusters)", s.reading.survey)) {
            s.reading.survey_open = true;
            read_paste_as_survey(s, s.reading.survey ? s.reading.survey_columns : guess_survey_columns(pasted_header(s)));
        }
        mark_widget("survey rows");
        if (s.groups.offered) {  // the same text as a table of many groups, one test per group
            const std::string text = s.groups.text;
            if (ImGui::Selectable("groups: one test per group")) open_groups(s, text, GroupReadOptions{});
            mark_widget("groups: one test per group");
        }
        end_menu_items(t);
        ImGui::EndCombo();
    }
    mark_widget("Read as");
    if (shows_bin_editor(s)) draw_bin_row(s, t);
    if (s.reading.survey || s.reading.survey_open) draw_survey_row(s, t);
}

// One row of the counts table: the label and count fields, the expected count and share, and
// the row's move and remove buttons.
static void draw_count_row(AppState& s, const Theme& t, int i, bool share_column) {
    const Result& r = s.result;
    ImGui::PushID(i);
    ImGui::TableNextRow();
    ImGui::TableNextColumn();
    std::string label = s.analysis.categories[i];
    ImGui::SetNextItemWidth(-1);
    const bool label_done = text_field("##label", &label, FieldKeys::text, ImGuiInputTextFlags_EnterReturnsTrue) ||
                            (ImGui::IsItemDeactivatedAfterEdit() && label != s.analysis.categories[i]);
    mark_widget(("label " + std::to_string(i + 1)).c_str());
    if (label_done) set_label(s, i, label);
    ImGui::TableNextColumn();
    std::string count = format_count(s.analysis.observed[i]);
    ImGui::SetNextItemWidth(-1);
    const bool count_done = text_field("##count", &count, FieldKeys::decimal,
                                       ImGuiInputTextFlags_EnterReturnsTrue) ||
                            ImGui::IsItemDeactivatedAfterEdit();
    mark_widget(("count " + std::to_string(i + 1)).c_str());
    if (count_done) {
        double v = 0;
        if (parse_count_cell(count, &v)) { if (v != s.analysis.observed[i]) set_count(s, i, v); }
        else s.input_error = "\"" + count.substr(0, 20) + "\" is not a count.";
    }
    ImGui::TableNextColumn();
    if (i < static_cast<int>(r.expected_counts.size())) ImGui::TextUnformatted(format_fixed(r.expected_counts[i], 2).c_str());
    if (share_column) {
        ImGui::TableNextColumn();
        if (i < static_cast<int>(r.expected_shares.size())) ImGui::TextUnformatted(format_significant(r.expected_shares[i], 3).c_str());
    }
    ImGui::TableNextColumn();
    if (compact_button("↑", t)) move_row(s, i, -1);
    if (ImGui::IsItemHovered()) ImGui::SetTooltip("Move up");
    ImGui::SameLine(0, 2);
    if (compact_button("↓", t)) move_row(s, i, +1);
    if (ImGui::IsItemHovered()) ImGui::SetTooltip("Move down");
    ImGui::SameLine(0, 2);
    if (compact_button("×", t)) remove_row(s, i);
    if (ImGui::IsItemHovered()) ImGui::SetTooltip("Remove this category");
    ImGui::PopID();
}

void draw_counts_panel(AppState& s, const Theme& t) {
    section_title("Counts", t);
    if (s.groups.open && s.groups.opened < 0)
        coloured_text(t.accent, ("All " + std::to_string(s.groups.counts.groups.size()) +
                                 " groups added together. Each group is tested on its own in the screen; open one from its table or chart.").c_str());
    else if (s.groups.open)
        coloured_text(t.accent, ("The counts of group " + s.groups.counts.groups[static_cast<std::size_t>(s.groups.opened)] + ".").c_str());
    else
        muted_wrapped(t, t.touch ? "Paste label ⇥ count lines from a spreadsheet with Paste, open a file, or edit the table."
                                 : "Paste label ⇥ count lines from a spreadsheet (Ctrl+V / ⌘V) anywhere on the page, or edit the table.");
    const Result& r = s.result;
    const int k = static_cast<int>(s.analysis.observed.size());
    const ImGuiTableFlags flags = ImGuiTableFlags_RowBg | ImGuiTableFlags_BordersInnerH | ImGuiTableFlags_BordersOuter |
                                  ImGuiTableFlags_ScrollY | ImGuiTableFlags_SizingStretchProp;
    const float row_h = ImGui::GetFrameHeight() + ImGui::GetStyle().CellPadding.y * 2;
    const float want = row_h * static_cast<float>(k + 2) + 8;
    // Room under the table for the rows that follow it: "Read as", the bins, "+ Add category".
    const bool read_as = offers_other_readings(s), bin_row = shows_bin_editor(s);
    const bool survey_row = s.reading.survey || s.reading.survey_open;  // names over the four column choices
    float below = ImGui::GetFrameHeightWithSpacing() * (1.2f + (read_as ? 1 : 0) + (bin_row ? 1 : 0) + (survey_row ? 1.5f : 0) +
                                                        (shows_sheet_row(s) ? 1 : 0));
    if (bin_row && !s.reading.bin_editor.error.empty())
        below += ImGui::CalcTextSize(("Bins not applied: " + s.reading.bin_editor.error).c_str(), nullptr, false, ImGui::GetContentRegionAvail().x).y +
                 ImGui::GetStyle().ItemSpacing.y;
    const float avail = ImGui::GetContentRegionAvail().y - below;
    const float height = std::max(row_h * 3, std::min(want, std::max(avail, row_h * 3)));
    // On a phone the share column gives its room to the fields (the shares are in the write-up).
    const bool share_column = !t.touch || ImGui::GetContentRegionAvail().x >= 560;
    // Each column as wide as its longest text (a label up to 16 em); where they do not all fit (a
    // phone), the table scrolls sideways with the category column frozen, so no label, count or
    // head is cut.
    const float arrows_w = t.touch ? 3 * ImGui::GetFrameHeight() + 6 : ImGui::CalcTextSize("↑↓×").x + 6 * ImGui::GetStyle().FramePadding.x + 6;
    const float field_pad = 2 * ImGui::GetStyle().FramePadding.x + 6, cell_pad = 2 * ImGui::GetStyle().CellPadding.x + 2;
    float label_w = ImGui::CalcTextSize("Category").x, count_w = ImGui::CalcTextSize("Observed").x,
          expected_w = ImGui::CalcTextSize("Expected").x, share_w = ImGui::CalcTextSize("Share").x;
    for (int i = 0; i < std::min(k, 2000); ++i) {
        label_w = std::max(label_w, std::min(ImGui::CalcTextSize(s.analysis.categories[i].c_str()).x + field_pad, 16 * ImGui::GetFontSize()));
        count_w = std::max(count_w, ImGui::CalcTextSize(format_count(s.analysis.observed[i]).c_str()).x + field_pad);
        if (i < static_cast<int>(r.expected_counts.size()))
            expected_w = std::max(expected_w, ImGui::CalcTextSize(format_fixed(r.expected_counts[i], 2).c_str()).x);
    }
    share_w = std::max(share_w, ImGui::CalcTextSize("0.000").x);
    const float needed_w = label_w + count_w + expected_w + (share_column ? share_w : 0) + arrows_w + (share_column ? 5 : 4) * cell_pad;
    const bool sideways = needed_w > ImGui::GetContentRegionAvail().x;
    const ImGuiTableFlags layout = sideways ? ImGuiTableFlags_ScrollX | ImGuiTableFlags_SizingFixedFit : 0;
    if (ImGui::BeginTable("counts", share_column ? 5 : 4, (flags & ~ImGuiTableFlags_SizingStretchProp) | layout |
                                                              (sideways ? 0 : ImGuiTableFlags_SizingStretchProp), ImVec2(0, height))) {
        ImGui::TableSetupScrollFreeze(sideways ? 1 : 0, 1);
        const ImGuiTableColumnFlags fixed = ImGuiTableColumnFlags_WidthFixed, stretch = ImGuiTableColumnFlags_WidthStretch;
        ImGui::TableSetupColumn("Category", sideways ? fixed : stretch, sideways ? label_w : 2.0f);
        ImGui::TableSetupColumn("Observed", sideways ? fixed : stretch, sideways ? count_w : 1.3f);
        ImGui::TableSetupColumn("Expected", sideways ? fixed : stretch, sideways ? expected_w : 1.0f);
        if (share_column) ImGui::TableSetupColumn("Share", sideways ? fixed : stretch, sideways ? share_w : 0.9f);
        ImGui::TableSetupColumn("", ImGuiTableColumnFlags_WidthFixed, arrows_w);
        if (sideways) {  // the widths follow the data (set each frame; a fixed column's width is otherwise kept from its first frame)
            const float widths[] = {label_w, count_w, expected_w, share_w};
            for (int c = 0; c < (share_column ? 4 : 3); ++c) ImGui::TableSetColumnWidth(c, widths[c]);
        }
        ImGui::TableHeadersRow();
        ImGuiListClipper clipper;
        clipper.Begin(k, row_h);
        while (clipper.Step()) {
            for (int i = clipper.DisplayStart; i < clipper.DisplayEnd; ++i) {
                draw_count_row(s, t, i, share_column);
            }
        }
        ImGui::TableNextRow();
        ImGui::TableNextColumn();
        ImGui::PushFont(t.strong);
        ImGui::TextUnformatted("Total");
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(format_count(r.n).c_str());
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(format_count(r.n).c_str());
        ImGui::PopFont();
        ImGui::EndTable();
    }
    if (shows_sheet_row(s)) draw_sheet_row(s, t);
    if (read_as) draw_read_as_row(s, t);
    if (ImGui::Button("+ Add category")) add_row(s);
    flow_next(ImGui::GetFrameHeight() + ImGui::CalcTextSize("Categories are in order").x + ImGui::GetStyle().ItemInnerSpacing.x);
    bool ordered = s.analysis.ordered;
    if (ImGui::Checkbox("Categories are in order", &ordered)) {
        s.analysis.ordered = ordered;
        recompute(s);
    }
}

void draw_model_panel(AppState& s, const Theme& t) {
    section_title("Expected mix", t);
    ImGui::SetNextItemWidth(-1);
    const bool model_open = ImGui::BeginCombo("##model", kind_label(s.analysis.model.kind));
    mark_widget("Expected mix");
    if (model_open) {
        begin_menu_items(t);
        for (const auto& c : kKinds) {
            const bool selected = c.kind == s.analysis.model.kind;
            if (ImGui::Selectable(c.label, selected) && !selected) set_model_kind(s, c.kind);
            mark_widget(c.label);
            if (selected) ImGui::SetItemDefaultFocus();
        }
        end_menu_items(t);
        ImGui::EndCombo();
    }
    const ModelKind kind = s.analysis.model.kind;
    if (kind == ModelKind::shares || kind == ModelKind::ratio || kind == ModelKind::counts || kind == ModelKind::reference_sample) {
        const char* hint = kind == ModelKind::ratio ? "9:3:3:1" : kind == ModelKind::shares ? "40, 35, 25 (one per category)"
                           : kind == ModelKind::reference_sample ? "the previous sample's count per category" : "one expected count per category";
        if (kind == ModelKind::reference_sample)
            muted_wrapped(t, "Counts of the previous sample (last month, a control batch), one per category in the same order: "
                             "both samples are compared, neither is taken as exact.");
        ImGui::SetNextItemWidth(-1);
        if (text_field("##values", &s.model_editor.values, FieldKeys::text, 0, hint)) apply_model_editor(s);
        mark_widget("expected values");
    }
    if (kind == ModelKind::normal || kind == ModelKind::lognormal || kind == ModelKind::exponential) {
        ImGui::TextUnformatted("Bin edges (k + 1):");
        ImGui::SetNextItemWidth(-1);
        if (text_field("##edges", &s.model_editor.edges, FieldKeys::text, 0, "-inf, 10, 20, 30, inf")) apply_model_editor(s);
    }
    for (std::size_t i = 0; i < s.model_editor.parameters.size(); ++i) {
        auto& p = s.model_editor.parameters[i];
        ImGui::PushID(static_cast<int>(i));
        ImGui::AlignTextToFramePadding();
        ImGui::Text("%s", p.name.c_str());
        ImGui::SameLine(74);
        bool changed = false;
        if (!p.required) {
            changed |= ImGui::Checkbox("estimate", &p.estimate);
            ImGui::SameLine();
        }
        if (!p.estimate) {
            ImGui::SetNextItemWidth(120);
            changed |= number_field("##value", &p.value, "%.6g");
        } else {
            // Show the estimate in its place
            for (const auto& e : s.result.estimates)
                if (e.name == p.name) { ImGui::TextDisabled("= %s", format_significant(e.value, 4).c_str()); break; }
        }
        if (changed) apply_model_editor(s);
        ImGui::PopID();
    }
    if (!s.input_error.empty()) {
        ImGui::PushStyleColor(ImGuiCol_Text, ImGui::ColorConvertU32ToFloat4(t.warn_ink));
        wrapped_text(("Not applied: " + s.input_error).c_str());
        ImGui::PopStyleColor();
        // core/expected_counts offers Ratio for whole-number "shares" such as 5:3:1:1: one tap takes it.
        if (s.analysis.model.kind == ModelKind::shares && s.input_error.find("choose Ratio") != std::string::npos) {
            if (ImGui::Button("Read them as a ratio")) read_shares_as_ratio(s);
            mark_widget("Read them as a ratio");
        }
    } else if (s.result.status.ok) {
        muted_wrapped(t, "%s.", s.result.model_description.c_str());
    }
}

void draw_test_panel(AppState& s, const Theme& t) {
    section_title("Test", t);
    Analysis& a = s.analysis;
    const char* current = nullptr;
    for (const auto& c : kLambdas) if (c.lambda == a.statistic.lambda) current = c.label;
    std::string custom = "Power divergence, λ = " + format_significant(a.statistic.lambda, 3);
    ImGui::SetNextItemWidth(-1);
    const bool statistic_open = ImGui::BeginCombo("##statistic", current ? current : custom.c_str());
    explain_item("statistic", current ? current : custom);
    if (statistic_open) {
        begin_menu_items(t);
        for (const auto& c : kLambdas) {
            const bool chosen = ImGui::Selectable(c.label, c.lambda == a.statistic.lambda);
            explain_item(c.label, c.label);
            if (chosen) {
                a.statistic.lambda = c.lambda;
                if (c.lambda != 0) a.statistic.williams = false;
                recompute(s);
            }
        }
        end_menu_items(t);
        ImGui::EndCombo();
    }
    if (a.statistic.lambda == 0) {
        if (ImGui::Checkbox("Williams' correction", &a.statistic.williams)) recompute(s);
    }
    ImGui::AlignTextToFramePadding();
    ImGui::TextUnformatted("α");
    explain_item("alpha label", "α");
    ImGui::SameLine(74);
    std::string alpha = format_plain(a.alpha);
    ImGui::SetNextItemWidth(100);
    const bool alpha_done = text_field("##alpha", &alpha, FieldKeys::decimal, ImGuiInputTextFlags_CharsScientific | ImGuiInputTextFlags_EnterReturnsTrue) ||
                            ImGui::IsItemDeactivatedAfterEdit();
    mark_widget("alpha");
    if (alpha_done) apply_alpha_text(s, alpha);
    ImGui::AlignTextToFramePadding();
    ImGui::TextUnformatted("p-value");
    ImGui::SameLine(74);
    int m = static_cast<int>(a.pvalue.method);
    bool method_changed = ImGui::RadioButton("asymptotic", &m, 0);
    explain_item("asymptotic", "asymptotic");
    flow_next(radio_width("exact"));
    method_changed |= ImGui::RadioButton("exact", &m, 1);
    mark_widget("exact");
    flow_next(radio_width("Monte Carlo"));
    method_changed |= ImGui::RadioButton("Monte Carlo", &m, 2);
    explain_item("Monte Carlo", "Monte Carlo");
    if (method_changed) set_pvalue_method(s, static_cast<PValueMethod>(m));
    if (a.pvalue.method == PValueMethod::monte_carlo) {
        ImGui::SetCursorPosX(74 + ImGui::GetStyle().WindowPadding.x);
        double reps = static_cast<double>(a.pvalue.replicates), seed = static_cast<double>(a.pvalue.seed);
        ImGui::SetNextItemWidth(110);
        if (number_field("##replicates", &reps, "%.0f", FieldKeys::whole)) {
            if (reps >= 100 && reps <= 100000000 && reps == std::floor(reps)) { a.pvalue.replicates = static_cast<std::uint64_t>(reps); recompute(s); }
        }
        ImGui::SameLine(0, ImGui::GetStyle().ItemInnerSpacing.x);
        ImGui::TextUnformatted("replicates");
        explain_item("replicates label", "replicates");
        flow_next(80 + ImGui::CalcTextSize("seed").x + ImGui::GetStyle().ItemInnerSpacing.x);
        ImGui::SetNextItemWidth(80);
        if (number_field("##seed", &seed, "%.0f", FieldKeys::whole)) {
            if (seed >= 0 && seed <= 4294967295.0 && seed == std::floor(seed)) { a.pvalue.seed = static_cast<std::uint64_t>(seed); recompute(s); }
        }
        ImGui::SameLine(0, ImGui::GetStyle().ItemInnerSpacing.x);
        ImGui::TextUnformatted("seed");
        explain_item("seed label", "seed");
    }
    if (a.pvalue.method != PValueMethod::asymptotic) {
        ImGui::SetCursorPosX(74 + ImGui::GetStyle().WindowPadding.x);
        int ord = a.pvalue.ordering == ExactOrdering::statistic ? 0 : 1;
        bool ch = ImGui::RadioButton("by statistic", &ord, 0);
        explain_item("by statistic", "by statistic");
        flow_next(radio_width("by probability"));
        ch |= ImGui::RadioButton("by probability", &ord, 1);
        explain_item("by probability", "by probability");
        if (ch) { a.pvalue.ordering = ord == 0 ? ExactOrdering::statistic : ExactOrdering::probability; recompute(s); }
    }
    draw_goal_rows(s, t);
    ImGui::AlignTextToFramePadding();
    ImGui::TextUnformatted("Merge");
    ImGui::SameLine(74);
    const char* rules[] = {"no merging", "until every expected count is at least 5", "until Cochran's rule holds", "until every expected count reaches a minimum"};
    int rule = static_cast<int>(a.merge.rule);
    ImGui::SetNextItemWidth(-1);
    const bool merge_open = ImGui::BeginCombo("##merge", rules[rule]);  // not ImGui::Combo: its items would sit closer than 44 px on touch
    mark_widget("merge rule");
    if (merge_open) {
        begin_menu_items(t);
        for (int i = 0; i < 4; ++i) {
            if (ImGui::Selectable(rules[i], i == rule) && i != rule) merge_thin_cells(s, static_cast<MergeRule>(i));
            explain_item(rules[i], rules[i]);
        }
        end_menu_items(t);
        ImGui::EndCombo();
    }
    if (a.merge.rule == MergeRule::custom_minimum) {
        ImGui::SetCursorPosX(74 + ImGui::GetStyle().WindowPadding.x);
        double mn = a.merge.minimum;
        ImGui::SetNextItemWidth(100);
        if (number_field("##minimum", &mn, "%.3g")) {
            if (mn > 0 && mn != a.merge.minimum) { a.merge.minimum = mn; recompute(s); }
        }
        ImGui::SameLine(0, ImGui::GetStyle().ItemInnerSpacing.x);
        ImGui::TextUnformatted("minimum");
    }
    // Survey data given as counts or weighted shares: the design effects from the survey's report.
    ImGui::AlignTextToFramePadding();
    ImGui::TextUnformatted("Design effect");
    explain_item("design effect label", "design effect");
    ImGui::SameLine();
    std::string deff = design_effect_text(a);
    ImGui::SetNextItemWidth(std::min(220.0f, ImGui::GetContentRegionAvail().x));
    const bool deff_done = text_field("##design-effect", &deff, FieldKeys::text, ImGuiInputTextFlags_EnterReturnsTrue, "none") ||
                           ImGui::IsItemDeactivatedAfterEdit();
    mark_widget("design effect");
    if (ImGui::IsItemHovered())
        ImGui::SetTooltip("Survey data: one design effect for the whole sample (the crude correction χ²/D), one per category "
                          "(first-order Rao–Scott), or kish for survey rows' weights. Empty: none.");
    if (deff_done) apply_design_effect_text(s, deff);
}

}  // namespace tallyproof::web
