// AppState transitions. Nothing here draws; the page bridge is told about each new result.
#include "app_state.hpp"
#include "app_state_internal.hpp"

#include <emscripten.h>

#include <algorithm>
#include <cmath>
#include <initializer_list>
#include <limits>
#include <cstdlib>
#include <cstring>

#include "analysis_document.hpp"
#include "label_text.hpp"
#include "text_decoding.hpp"
#include "demo_library.hpp"
#include "density_plot.hpp"
#include "goodness_of_fit.hpp"
#include "noncentral_chi_square_density_curve.hpp"
#include "number_format.hpp"
#include "number_reading.hpp"
#include "page_bridge.hpp"
#include "paste_parser.hpp"
#include "report.hpp"
#include "pasted_analysis.hpp"
#include "read_input.hpp"
#include "survey_rows.hpp"
#include "input_text.hpp"
#include "json_writer.hpp"
#include "null_model.hpp"
#include "digit_laws.hpp"

namespace tallyproof::web {
namespace {

// A size in bytes as the page says it: "52.4 MB" (MB = 2^20 bytes, as the limits are set).
std::string megabytes(double bytes) { return format_fixed(bytes / (1u << 20), 1) + " MB"; }

std::string list_text(const std::vector<double>& v, const char* sep) {
    std::string s;
    for (double d : v) s += (s.empty() ? "" : sep) + (std::isinf(d) ? std::string(d < 0 ? "-inf" : "inf") : format_plain(d));
    return s;
}

bool read_list(const std::string& text, std::vector<double>* out, std::string* error) {
    out->clear();
    std::string cell;
    auto flush = [&]() -> bool {
        std::size_t b = cell.find_first_not_of(" \t"), e = cell.find_last_not_of(" \t%");
        if (b == std::string::npos) { cell.clear(); return true; }
        const std::string c = cell.substr(b, e - b + 1);
        cell.clear();
        double v = 0;  // core's reader of typed numbers (inf and ∞ included); the comma separates values here
        if (!read_typed_number(c, &v)) { *error = "\"" + c.substr(0, 20) + "\" is not a number."; return false; }
        out->push_back(v);
        return true;
    };
    for (char ch : text) {
        if (ch == ':' || ch == ',' || ch == ';' || ch == '\n' || ch == '\t') { if (!flush()) return false; }
        else cell += ch;
    }
    return flush();
}

std::vector<ModelEditor::Parameter> parameters_of(ModelKind kind) {
    switch (kind) {
        case ModelKind::poisson: return {{"mean", true, 1, false}};
        case ModelKind::binomial: return {{"trials", false, 10, true}, {"p", true, 0.5, false}};
        case ModelKind::geometric: return {{"p", true, 0.5, false}};
        case ModelKind::negative_binomial: return {{"size", true, 1, false}, {"p", true, 0.5, false}};
        case ModelKind::normal: return {{"mean", true, 0, false}, {"sd", true, 1, false}};
        case ModelKind::lognormal: return {{"meanlog", true, 0, false}, {"sdlog", true, 1, false}};
        case ModelKind::exponential: return {{"rate", true, 1, false}};
        default: return {};
    }
}

}  // namespace

void sync_editor_from_model(AppState& s) {
    ModelEditor& e = s.model_editor;
    const Model& m = s.analysis.model;
    e.values = list_text(m.values, m.kind == ModelKind::ratio ? ":" : ", ");
    e.edges = list_text(m.edges, ", ");
    e.parameters = parameters_of(m.kind);
    for (auto& p : e.parameters)
        for (const auto& [name, value] : m.parameters)
            if (name == p.name) { p.estimate = false; p.value = value; }
}

std::string analysis_document(const AppState& s) {
    return s.groups.open ? screen_document(s) : write_analysis_document(s.analysis);
}


bool recompute(AppState& s) {
    if (s.work.running) cancel_job(s);
    Result next = analyse(s.analysis);
    s.view.frames_to_draw = 3;
    if (!next.status.ok) {
        s.input_error = next.status.message;
        publish_error(s.input_error);
        return false;
    }
    s.input_error.clear();
    s.result = std::move(next);
    auto& q = s.result.questions;  // questions the user has answered are not asked again
    const auto answered = std::make_pair(std::string(), s.analysis.observed);
    q.erase(std::remove_if(q.begin(), q.end(), [&](const std::string& x) {
                auto key = answered;
                key.first = x;
                return std::find(s.dismissed_questions.begin(), s.dismissed_questions.end(), key) != s.dismissed_questions.end();
            }), q.end());
    if (s.result.conformity && s.result.conformity->status.ok)  // the curve of "departs by exactly w0"
        s.curve = noncentral_density_curve(s.result.df, s.result.conformity->noncentrality,
                                           s.result.conformity->critical_value, s.result.statistic);
    else {
        const CurveTest ct = curve_test(s.result);  // for survey data, the design-corrected test
        s.curve = density_curve(ct.df, ct.critical, ct.statistic);
    }
    if (s.analysis.pvalue.method != PValueMethod::asymptotic) {
        start_pvalue_job(s.analysis, s.result, &s.work.job);
        s.work.running = !s.work.job.progress.done;
        s.work.started_ms = emscripten_get_now();
        if (!s.work.running) finish_pvalue_job(s.work.job, &s.result);
    }
    publish(s);
    if (s.groups.open && s.groups.opened < 0) recompute_groups(s);  // the screen follows the settings
    return true;
}

bool work_running(const AppState& s) { return s.work.running || s.groups.screening || s.pasting.running; }

void step_job(AppState& s, double budget_ms) {
    if (s.pasting.running) return step_paste_job(s, budget_ms);
    if (s.groups.screening && !s.work.running) return step_screen(s, budget_ms);
    if (!s.work.running) return;
    // Work units differ a thousandfold in cost between Monte Carlo and exact jobs: sized from the rate.
    run_slices(budget_ms, 1000, 4194304, [&](std::uint64_t units) {
        const WorkProgress p = step_pvalue_job(&s.work.job, units);
        return p.done || p.cancelled;
    });
    if (s.work.job.progress.done || s.work.job.progress.cancelled) {
        s.work.running = false;
        finish_pvalue_job(s.work.job, &s.result);
        publish(s);
    }
    set_progress(job_fraction(s), s.work.running);
}

void cancel_job(AppState& s) {
    if (s.streaming.running && !s.work.running) return cancel_paste_job(s);
    if (s.pasting.running && !s.work.running) return cancel_paste_job(s);
    if (s.groups.screening && !s.work.running) return cancel_screen(s);
    if (!s.work.running) return;
    cancel_pvalue_job(&s.work.job);
    s.work.running = false;
    finish_pvalue_job(s.work.job, &s.result);  // records the cancellation; the asymptotic p stays
    publish(s);
    set_progress(job_fraction(s), false);
}

bool reading_running(const AppState& s) { return s.pasting.running || s.streaming.running; }

double job_fraction(const AppState& s) {
    if (s.streaming.running && s.streaming.reader) return s.streaming.size > 0 ? s.streaming.reader->bytes() / s.streaming.size : 0;
    if (s.pasting.running) return input_read_fraction(s.pasting.job);
    return s.groups.screening && !s.work.running ? s.groups.job.progress.fraction : s.work.job.progress.fraction;
}

void load_demo(AppState& s, int index) {
    if (index < 0 || index >= kDemoScenarioCount) return;
    if (open_document(s, kDemoScenarios[index].document)) {
        s.view.demo_index = index;
        remember(s, write_analysis_document(s.analysis));  // titled as the example now that demo_index is set
        s.reading.source_name = std::string("example: ") + kDemoScenarios[index].title;
    }
}

namespace {
// The cells of one pasted line, split the way a spreadsheet paste usually is: tabs, else
// semicolons, else commas, else runs of spaces. Only for showing the line; the parser decides.
std::vector<std::string> display_cells(std::string_view line) {
    char sep = 0;
    for (char c : {'\t', ';', ','})
        if (line.find(c) != std::string_view::npos) { sep = c; break; }
    std::vector<std::string> cells;
    std::string cell;
    for (char c : line) {
        const bool split = sep ? c == sep : c == ' ';
        if (!split) { cell += c; continue; }
        if (sep || !cell.empty()) cells.push_back(cell);
        cell.clear();
    }
    if (sep || !cell.empty() || cells.empty()) cells.push_back(cell);
    return cells;
}

// A refused paste or document: its message, the cells of the line it points at (found once,
// here, not in every frame), and the whole text when it is small enough to edit on the page.
void record_refusal(AppState& s, std::string_view text, const Status& problem) {
    s.refused.message = problem.message;
    s.refused.file.clear();  // apply_input names the file after this
    s.refused.line = problem.line;
    s.refused.column = problem.column;
    s.refused.cells.clear();
    if (problem.line > 0) {
        std::size_t start = 0;
        for (int line = 1; line < problem.line && start != std::string_view::npos; ++line) {
            start = text.find('\n', start);
            if (start != std::string_view::npos) ++start;
        }
        if (start != std::string_view::npos) {
            const std::size_t end = text.find_first_of("\r\n", start);
            s.refused.cells = display_cells(text.substr(start, std::min<std::size_t>(200, (end == std::string_view::npos ? text.size() : end) - start)));
        }
    }
    if (text.size() <= kFixableBytes) s.refused.text = std::string(text);
    else s.refused.text.clear();
    s.refused.fix_text.clear();
    s.refused.fix_open = false;
    publish_error(problem.message);
    s.view.frames_to_draw = 3;
}

}  // namespace

void clear_refusal(AppState& s) {
    s.refused.message.clear();
    s.refused.line = 0;
    s.refused.column = 0;
    s.refused.cells.clear();
    s.refused.text.clear();
    s.refused.fix_text.clear();
    s.refused.fix_open = false;
}

void edit_refused_paste(AppState& s, bool open) {
    s.refused.fix_open = open && !s.refused.text.empty();
    if (s.refused.fix_open) s.refused.fix_text = s.refused.text;  // the original stays for the quoted line
    else s.refused.fix_text.clear();
}

void apply_fixed_paste(AppState& s) {
    if (!s.refused.fix_open) return;
    const std::string text = std::move(s.refused.fix_text);  // apply_paste replaces the refusal state
    apply_paste(s, text);
    if (!s.refused.message.empty()) edit_refused_paste(s, true);  // still refused: keep editing
}

void dismiss_refusal(AppState& s) { clear_refusal(s); }

void dismiss_question(AppState& s, int index) {
    if (index < 0 || static_cast<std::size_t>(index) >= s.result.questions.size()) return;
    s.dismissed_questions.emplace_back(s.result.questions[static_cast<std::size_t>(index)], s.analysis.observed);
    s.result.questions.erase(s.result.questions.begin() + index);
    publish(s);  // the report and the form lose the question too
}

namespace {
bool open_screen_document(AppState& s, const Analysis& settings, const GroupedCounts& counts, const ScreenChoice& choice,
                          const ScreenView& view);
}  // namespace

namespace {
// What opening any document does once its analysis is in place: no refusal, no merge to undo, no
// pasted text to re-read.
void forget_paste(AppState& s) {
    clear_refusal(s);
    s.merge_undo.clear();
    s.reading.text.clear();
    s.reading.shape = -1;
    s.reading.bins = BinChoice{};
    s.reading.source_name = "opened document";
    s.reading.streamed.clear();
}
}  // namespace

bool open_document(AppState& s, std::string_view json) {
    Analysis a;
    Status st = read_analysis_document(json, &a);
    GroupedCounts counts;
    ScreenChoice choice;
    ScreenView view;
    bool is_screen = false;
    if (st.ok) st = read_screen_document(json, &counts, &choice, &view, &is_screen);
    if (st.ok && is_screen && counts.groups.size() < 2)
        st = Status::failure("The document's \"groups\" hold " + std::to_string(counts.groups.size()) +
                             " group; a screen needs at least two (leave \"groups\" out and give \"observed\" for one sample).");
    if (!st.ok) {
        record_refusal(s, json, st);
        return false;
    }
    if (is_screen) return open_screen_document(s, a, counts, choice, view);
    const Analysis previous = s.analysis;
    const std::string previous_id = s.session.analysis_id;
    s.analysis = a;
    s.session.analysis_id = new_analysis_id();
    s.view.demo_index = -1;
    if (!recompute(s)) {
        record_refusal(s, json, Status::failure(s.input_error));
        s.input_error.clear();
        s.analysis = previous;
        s.session.analysis_id = previous_id;
        return false;
    }
    forget_paste(s);
    s.view.demo_index = -1;
    sync_editor_from_model(s);
    return true;
}

namespace {
void read_paste(AppState& s, std::string_view text, const ParseOptions& options);
void apply_reading(AppState& s, std::string_view text, const ParseOptions& options, InputReading reading);
void after_reading(AppState& s, std::string_view file_name, const std::string& notice);

// A screen document (groups, settings, view): the Groups view as it was left, the opened group
// with its way back. The settings are the base every group is tested with.
bool open_screen_document(AppState& s, const Analysis& settings, const GroupedCounts& counts, const ScreenChoice& choice,
                          const ScreenView& view) {
    const Analysis previous = s.analysis;
    GroupsView previous_groups = std::move(s.groups);
    s.groups = GroupsView{};
    s.analysis = settings;
    s.analysis.categories = counts.categories;
    s.session.analysis_id = new_analysis_id();
    s.view.demo_index = -1;
    s.input_error.clear();
    if (!open_groups_document(s, counts, choice) || !s.input_error.empty() ||
        (!s.groups.screening && (!s.groups.result.status.ok || s.groups.result.groups.empty()))) {
        const Status why = Status::failure(!s.input_error.empty() ? s.input_error
                                           : !s.groups.result.status.ok ? s.groups.result.status.message
                                           : "The document's groups could not be screened.");
        s.input_error.clear();
        s.analysis = previous;
        s.groups = std::move(previous_groups);
        recompute(s);
        record_refusal(s, {}, why);
        return false;
    }
    forget_paste(s);
    apply_screen_view(s, view);
    return true;
}

// The number of bins the user typed: a whole number from 2 to kMaxBinsOnPage.
bool typed_bin_count(const std::string& text, int* k, std::string* error) {
    const std::size_t b = text.find_first_not_of(" \t"), e = text.find_last_not_of(" \t");
    const std::string t = b == std::string::npos ? "" : text.substr(b, e - b + 1);
    double v = 0;
    if (!read_typed_number(t, &v) || !(v >= 2 && v <= kMaxBinsOnPage) || v != std::floor(v)) {
        *error = "The number of bins must be a whole number from 2 to " + std::to_string(kMaxBinsOnPage) +
                 (t.empty() ? "." : "; \"" + t.substr(0, 20) + "\" is not.");
        return false;
    }
    *k = static_cast<int>(v);
    return true;
}

// Edges to start the stated-edges field from: those of the equal-width bins, with an outer edge
// that does not survive being written to six digits left open (-inf / inf) so no value falls out.
std::string starting_edges(const AppState& s) {
    BinChoice width;
    width.kind = BinChoice::Kind::equal_width;
    std::string ignored;
    if (!typed_bin_count(s.reading.bin_editor.count, &width.bins, &ignored)) width.bins = 10;
    ParseOptions o;
    o.shape = InputShape::raw_bins;
    o.bins = width;
    std::vector<double> edges = parse_input(s.reading.text, o).edges;
    if (edges.size() < 2) return "";
    std::vector<double> read_back;
    if (!read_list(format_plain(edges.front()), &read_back, &ignored) || read_back.front() != edges.front()) edges.front() = -HUGE_VAL;
    if (!read_list(format_plain(edges.back()), &read_back, &ignored) || read_back.front() != edges.back()) edges.back() = HUGE_VAL;
    return list_text(edges, ", ");
}

// The last paste counted into bins `b`, with K or the edges from the bin editor.
void read_bins(AppState& s, BinChoice b) {
    std::string error;
    bool ok = true;
    if (b.kind == BinChoice::Kind::edges) {
        ok = read_list(s.reading.bin_editor.edges, &b.edges, &error);
        if (ok && b.edges.size() < 2) {
            error = "Bin edges: type at least two, such as 0, 10, 20, inf.";
            ok = false;
        }
    } else {
        ok = typed_bin_count(s.reading.bin_editor.count, &b.bins, &error);
    }
    if (!ok) {  // nothing read: the previous analysis stays, the message shows under the bins
        s.reading.shape = static_cast<int>(InputShape::raw_bins);
        s.reading.bins = b;
        s.reading.bin_editor.error = error;
        publish_error(error);
        s.view.frames_to_draw = 3;
        return;
    }
    ParseOptions o;
    o.shape = InputShape::raw_bins;
    o.bins = b;
    read_paste(s, s.reading.text, o);  // read_paste does not change pasted_text while reading it
}
}  // namespace

void apply_paste(AppState& s, std::string_view text) {
    const std::size_t first = text.find_first_not_of(" \t\r\n");
    if (first != std::string_view::npos && text[first] == '{') { open_document(s, text); return; }
    s.reading.bin_editor.edges.clear();  // edges typed for other data
    read_paste(s, text, ParseOptions{});
}

namespace {
// The workbook's sheets to the form view's list (an empty list when none is open).
void publish_sheet_list(const AppState& s) {
    JsonWriter j;
    j.begin_array();
    for (const WorkbookSheetInfo& w : s.reading.workbook.sheets)
        j.begin_object().key("name").value(w.name).key("hidden").value(w.hidden).key("empty").value(w.empty).end_object();
    j.end_array();
    publish_sheets(j.str(), static_cast<int>(s.reading.workbook.sheet));
}

// What follows a file's or paste's reading: the file named in a refusal, the file's own notice
// (and a stopped p-value's) before the reading's.
void after_reading(AppState& s, std::string_view file_name, const std::string& notice) {
    if (!s.refused.message.empty()) s.refused.file = std::string(file_name);
    if (!notice.empty() && s.refused.message.empty()) set_notice(s, notice + (s.view.notice.empty() ? "" : " " + s.view.notice));
}

// Bytes of a file or paste read with `choice` (a workbook's sheet): refused, or its text read.
void read_input_bytes(AppState& s, std::string bytes, std::string_view file_name, const WorkbookChoice& choice) {
    // New data while an exact or Monte Carlo p-value is being worked out: that work is for the old
    // data, so it stops, and the page says so (whether or not the new data is read).
    const bool stopped = s.work.running;
    if (stopped) cancel_job(s);
    drop_paste_job(s);  // a text still being read is replaced
    const std::string stopped_note = stopped ? "The p-value being worked out for the previous data was stopped." : "";
    // A workbook's bytes are kept while its counts are on screen, to read another of its sheets.
    WorkbookSource source;
    if (workbook_kind(bytes) != WorkbookKind::none) {
        source.bytes = bytes;
        source.name = std::string(file_name);
    }
    const bool pasted = file_name.empty() && source.bytes.empty();
    InputText in = input_text(std::move(bytes), file_name, choice);
    if (in.from_workbook) {
        source.sheets = in.sheets;
        source.sheet = in.sheet_index;
    }
    s.reading.workbook = std::move(source);
    if (!s.reading.workbook.sheets.empty()) publish_sheet_list(s);
    else if (!s.reading.workbook.bytes.empty()) s.reading.workbook = WorkbookSource{};
    if (!in.status.ok) {
        const std::string who = file_name.empty() ? std::string() : std::string(file_name.substr(0, 80)) + ": ";
        // A pasted text stays editable; a binary file's bytes are not worth editing.
        record_refusal(s, pasted ? std::string_view(in.text) : std::string_view(), Status::failure(who + in.status.message));
        s.refused.file = std::string(file_name);
        if (stopped) set_notice(s, stopped_note);
        return;
    }
    std::string notice = in.notice;
    for (const std::string& n : in.notes) notice += (notice.empty() ? "" : " ") + n;
    if (stopped) notice = stopped_note + (notice.empty() ? "" : " " + notice);
    apply_paste(s, in.text);
    if (s.pasting.running) {  // a long text: the rest when its reading is done (finish_paste_job)
        s.pasting.file = std::string(file_name);
        s.pasting.notice = notice;
        return;
    }
    after_reading(s, file_name, notice);
}
}  // namespace

void apply_input(AppState& s, std::string bytes, std::string_view file_name) {
    const bool had_workbook = !s.reading.workbook.sheets.empty();
    read_input_bytes(s, std::move(bytes), file_name, WorkbookChoice{});
    if (had_workbook && s.reading.workbook.sheets.empty()) publish_sheet_list(s);  // the page's sheet list goes
}

void choose_sheet(AppState& s, int index) {
    const WorkbookSource w = s.reading.workbook;
    if (w.bytes.empty() || index < 0 || static_cast<std::size_t>(index) >= w.sheets.size()) return;
    WorkbookChoice choice;
    choice.sheet = std::to_string(index + 1);
    read_input_bytes(s, w.bytes, w.name, choice);
    if (s.reading.workbook.sheets.empty()) {  // refused as a whole: the list stays for another choice
        s.reading.workbook = w;
        s.reading.workbook.sheet = static_cast<std::size_t>(index);
        publish_sheet_list(s);
    }
}

void reread_paste(AppState& s, int shape, int digit_test, int third_column) {
    if (s.reading.text.empty()) return;
    ParseOptions o;
    o.shape = static_cast<InputShape>(shape);
    if (digit_test >= 0) o.digits = static_cast<DigitTest>(digit_test);
    if (third_column >= 0) o.third_column = third_column == 1 ? ThirdColumn::previous_sample : ThirdColumn::expected;
    read_paste(s, s.reading.text, o);  // read_paste does not change pasted_text while reading it
}

void read_paste_into_bins(AppState& s, BinChoice::Kind kind, ModelKind model) {
    if (s.reading.text.empty() || kind == BinChoice::Kind::none) return;
    BinChoice b;
    b.kind = kind;
    if (kind == BinChoice::Kind::equal_probability) b.model = model;
    if (kind == BinChoice::Kind::edges && s.reading.bin_editor.edges.find_first_not_of(" \t") == std::string::npos)
        s.reading.bin_editor.edges = starting_edges(s);
    read_bins(s, b);
}

bool offers_other_readings(const AppState& s) { return s.reading.shape >= 0 && !s.reading.text.empty(); }

bool shows_bin_editor(const AppState& s) {
    return offers_other_readings(s) && s.reading.shape == static_cast<int>(InputShape::raw_bins) &&
           s.reading.bins.kind != BinChoice::Kind::none;
}

void apply_bin_editor(AppState& s) {
    if (s.reading.text.empty() || s.reading.bins.kind == BinChoice::Kind::none) return;
    BinChoice b;
    b.kind = s.reading.bins.kind;
    b.model = s.reading.bins.model;
    read_bins(s, b);
}

std::vector<std::string> pasted_header(const AppState& s) {
    const std::string_view text = s.reading.text;
    std::string_view line = text.substr(0, text.find('\n'));
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    return display_cells(line);
}

void read_paste_as_survey(AppState& s, const SurveyColumns& columns) {
    if (s.reading.text.empty()) return;
    s.reading.survey_columns = columns;
    SurveyRowsReading rows = read_survey_rows(s.reading.text, columns);
    if (!rows.status.ok) {
        s.input_error = rows.status.message;
        publish_error(s.input_error);
        s.view.frames_to_draw = 3;
        return;
    }
    const Analysis previous = s.analysis;
    const bool same_categories = s.analysis.categories == rows.sample.categories;
    s.analysis.categories = rows.sample.categories;
    s.analysis.observed = rows.counts;
    s.analysis.design = DesignChoice{};
    s.analysis.design.requested = true;
    s.analysis.design.sample = std::move(rows.sample);
    s.analysis.merge = MergeChoice{};
    s.analysis.pvalue.method = PValueMethod::asymptotic;  // the design-corrected tests are asymptotic
    if (!same_categories) s.analysis.model = Model{};  // equal shares until a mix is stated
    sync_editor_from_model(s);
    if (!recompute(s)) {
        s.analysis = previous;
        sync_editor_from_model(s);
        recompute(s);
        return;
    }
    s.reading.survey = true;
    s.reading.source_name = "survey rows";
    clear_refusal(s);
    set_notice(s, "Read as survey rows: one per respondent, category " + columns.category +
                      (columns.weight.empty() ? "" : ", weight " + columns.weight) +
                      (columns.stratum.empty() ? "" : ", stratum " + columns.stratum) +
                      (columns.cluster.empty() ? "" : ", cluster " + columns.cluster) + ". The test is design-corrected (Rao–Scott).");
}

namespace {
void read_paste(AppState& s, std::string_view text, const ParseOptions& options) {
    drop_paste_job(s);
    if (text.size() < kSlicedReadBytes) {
        apply_reading(s, text, options, read_input(text, options));  // one sample, else groups; groups offered beside one sample
        return;
    }
    // A long text is read in slices (step_paste_job); the counts on screen stay until it is read.
    PasteJob& p = s.pasting;
    p.text.assign(text.data(), text.size());
    p.options = options;
    p.file.clear();
    p.notice.clear();
    start_input_read(p.text, options, ReadInputOptions{}, &p.job);
    p.running = true;
    set_progress(0, true);
    start_work_loop();
    s.view.frames_to_draw = 3;
}

void apply_reading(AppState& s, std::string_view text, const ParseOptions& options, InputReading reading) {
    const ParsedInput& parsed = reading.sample;
    Status problem = reading.status;  // the one-sample refusal, or the groups' own (read_input)
    GroupsView previous_groups = std::move(s.groups);  // a new one-sample reading closes the screen...
    s.groups = GroupsView{};
    const Analysis previous = s.analysis;
    std::vector<std::string> label_notes;  // labels written in two Unicode forms, joined
    const std::string previous_id = s.session.analysis_id;
    const int previous_demo = s.view.demo_index;
    if (problem.ok) {
        s.session.analysis_id = new_analysis_id();  // the user's own data: a new entry, no example's name
        s.view.demo_index = -1;
        s.analysis.merge = MergeChoice{};
        s.analysis.design = DesignChoice{};  // a paste read as one sample has no survey design
        // The stated mix, else the previous one while it fits the new counts, else equal shares.
        apply_input_mix(parsed, &s.analysis, &label_notes);
        sync_editor_from_model(s);
        if (!recompute(s)) {
            problem = Status::failure(s.input_error, 0, 0);
            s.input_error.clear();
            s.analysis = previous;
            s.session.analysis_id = previous_id;
            s.view.demo_index = previous_demo;
            sync_editor_from_model(s);
        }
    }
    // Kept for "Read as", refused or not: another reading may be what the user meant. Above
    // 8 MB it is not kept twice. A re-reading passes s.reading.text itself: no copy then.
    if (text.size() <= (8u << 20)) {
        if (text.data() != s.reading.text.data()) s.reading.text.assign(text.data(), text.size());
        s.reading.shape = static_cast<int>(parsed.shape);
        s.reading.previous = parsed.expected_kind == ExpectedKind::previous_sample;
    } else {
        s.reading.text.clear();
        s.reading.shape = -1;
    }
    s.reading.bins = parsed.shape == InputShape::raw_bins ? options.bins : BinChoice{};
    s.reading.bin_editor.error.clear();
    if (problem.ok) s.reading.streamed.clear();  // finish_file_stream names the file after this
    s.reading.survey = false;
    s.reading.survey_open = false;
    if (!problem.ok && parsed.shape == InputShape::raw_bins && !s.reading.text.empty()) {
        // Bins the user set: the message shows under them, not as a refused paste.
        s.reading.bin_editor.error = problem.message;
        clear_refusal(s);
        publish_error(problem.message);
        s.view.frames_to_draw = 3;
        return;
    }
    if (!problem.ok) {
        // Not one sample, but perhaps many: a long or wide table of groups. Raw values with a group
        // column are only offered (a typo in a count column would otherwise read as text to tally).
        GroupReadOptions read;
        read.parse = options;
        // Read as one sample but refused here (by the analysis): tried as groups now.
        GroupedCounts probe = reading.kind == InputKind::groups ? std::move(reading.groups)
                              : parsed.status.ok && parsed.shape != InputShape::raw_bins ? read_refused_as_groups(text, options)
                                                                                         : GroupedCounts{};
        if (probe.status.ok && open_groups_read(s, std::string(text), read, std::move(probe))) {
            clear_refusal(s);
            std::string notes;
            for (const auto& n : s.groups.counts.notes) notes += (notes.empty() ? "" : " ") + n;
            set_notice(s, notes);
            return;
        }
        s.groups = std::move(previous_groups);  // ...a refused one leaves it as it was
        // A table of groups refused for what its groups are (one group, an empty or missing group
        // cell): core's message, as the command-line tool gives it, not the one-sample reading's.
        record_refusal(s, text, probe.group_problem ? probe.status : problem);
        return;
    }
    // The same text may also read as groups (a wide table of two categories): offered, not chosen.
    s.groups.offered = reading.groups_offered;
    if (s.groups.offered) s.groups.text.assign(text.data(), text.size());
    s.reading.source_name = "pasted text";
    s.view.demo_index = -1;
    s.merge_undo.clear();
    clear_refusal(s);
    if (previous_groups.open) show_groups_place(s);  // the form view leaves the screen too
    std::string notes;
    for (const auto& n : parsed.notes) notes += (notes.empty() ? "" : " ") + n;
    for (const auto& n : label_notes) notes += (notes.empty() ? "" : " ") + n;
    for (const auto& n : parsed.alternatives) notes += (notes.empty() ? "" : " ") + n;
    set_notice(s, notes);
}
}  // namespace

void set_test_goal(AppState& s, bool show_conformity, double margin_w) {
    ConformityChoice& c = s.analysis.conformity;
    if (show_conformity && !(margin_w > 0 && margin_w <= 1)) {
        s.input_error = "The conformity margin w0 must lie in (0, 1]; 0.1 is Cohen's small effect. A margin in percentage "
                        "points is typed with pp, such as 2 pp.";
        publish_error(s.input_error);
        return;
    }
    c.requested = show_conformity;
    if (show_conformity) {
        c.margin_w = margin_w;
        c.margin_points = NAN;
    }
    recompute(s);
}

void set_conformity_margin_text(AppState& s, const std::string& text) {
    double w0 = NAN, points = NAN;
    if (!read_conformity_margin(text, &w0, &points) || !std::isfinite(points)) return set_test_goal(s, true, w0);
    if (!(points > 0 && points <= 100)) {
        s.input_error = "A conformity margin in percentage points must lie above 0 and at most 100, such as 2 pp.";
        publish_error(s.input_error);
        return;
    }
    ConformityChoice& c = s.analysis.conformity;
    c.requested = true;
    c.margin_points = points;
    c.margin_w = NAN;
    recompute(s);
}

void set_model_kind(AppState& s, ModelKind kind) {
    const std::vector<double> edges = s.analysis.model.edges;  // of pasted measurements read into bins
    s.analysis.model = Model{};
    s.analysis.model.kind = kind;
    const std::size_t k = s.analysis.observed.size();
    if (kind == ModelKind::shares || kind == ModelKind::counts) {
        // Start from the current expected shares so the user edits rather than types everything.
        for (std::size_t i = 0; i < k; ++i)
            s.analysis.model.values.push_back(kind == ModelKind::shares ? std::round(1000 * (i < s.result.expected_shares.size() ? s.result.expected_shares[i] : 1.0 / k)) / 10
                                                                        : (i < s.result.expected_counts.size() ? s.result.expected_counts[i] : 1));
    } else if (kind == ModelKind::ratio) {
        s.analysis.model.values.assign(k, 1);
    } else if (kind == ModelKind::reference_sample) {
        // Start from the current expected counts, rounded: the user types the previous sample over them.
        for (std::size_t i = 0; i < k; ++i)
            s.analysis.model.values.push_back(std::round(i < s.result.expected_counts.size() ? s.result.expected_counts[i] : 1));
    } else if ((kind == ModelKind::normal || kind == ModelKind::lognormal || kind == ModelKind::exponential) && edges.size() == k + 1) {
        s.analysis.model.edges = edges;
    } else if (kind == ModelKind::normal || kind == ModelKind::lognormal || kind == ModelKind::exponential) {
        for (std::size_t i = 0; i <= k; ++i) s.analysis.model.edges.push_back(i == 0 ? -HUGE_VAL : i == k ? HUGE_VAL : static_cast<double>(i));
        if (kind != ModelKind::normal) s.analysis.model.edges.front() = 0;
    }
    if (model_is_fitted(kind) || model_is_digit_law(kind)) s.analysis.ordered = true;
    sync_editor_from_model(s);
    apply_model_editor(s);
}

void apply_model_editor(AppState& s) {
    Model m;
    m.kind = s.analysis.model.kind;
    std::string error;
    if (m.kind == ModelKind::shares || m.kind == ModelKind::ratio || m.kind == ModelKind::counts) {
        if (!read_list(s.model_editor.values, &m.values, &error)) { s.input_error = error; return; }
        if (m.values.size() != s.analysis.observed.size()) {
            s.input_error = std::to_string(m.values.size()) + " values for " + std::to_string(s.analysis.observed.size()) +
                            " categories: give one per category.";
            s.view.frames_to_draw = 3;
            return;
        }
    }
    if (m.kind == ModelKind::normal || m.kind == ModelKind::lognormal || m.kind == ModelKind::exponential) {
        if (!read_list(s.model_editor.edges, &m.edges, &error)) { s.input_error = error; return; }
    }
    for (const auto& p : s.model_editor.parameters)
        if (!p.estimate) m.parameters.emplace_back(p.name, p.value);
    const Model previous = s.analysis.model;
    s.analysis.model = m;
    if (!recompute(s)) s.analysis.model = previous;
}

void read_shares_as_ratio(AppState& s) {
    if (s.analysis.model.kind != ModelKind::shares) return;
    s.analysis.model.kind = ModelKind::ratio;  // the editor's values stay as typed (5:3:1:1)
    s.input_error.clear();
    apply_model_editor(s);
    if (!s.input_error.empty()) s.analysis.model.kind = ModelKind::shares;
}

void set_count(AppState& s, int row, double value) {
    if (row < 0 || row >= static_cast<int>(s.analysis.observed.size())) return;
    const double old = s.analysis.observed[row];
    s.analysis.observed[row] = value;
    if (!recompute(s)) s.analysis.observed[row] = old;
}

void set_label(AppState& s, int row, const std::string& label) {
    if (row < 0 || row >= static_cast<int>(s.analysis.categories.size())) return;
    const std::string old = s.analysis.categories[row];
    s.analysis.categories[row] = normalised_label(label);
    if (!recompute(s)) s.analysis.categories[row] = old;
}

void add_row(AppState& s) {
    s.analysis.categories.push_back("Category " + std::to_string(s.analysis.categories.size() + 1));
    s.analysis.observed.push_back(0);
    if (!s.analysis.model.values.empty()) s.analysis.model.values.push_back(s.analysis.model.kind == ModelKind::ratio ? 1 : 0);
    sync_editor_from_model(s);
    recompute(s);
}

void remove_row(AppState& s, int row) {
    if (row < 0 || row >= static_cast<int>(s.analysis.observed.size()) || s.analysis.observed.size() <= 2) return;
    s.analysis.categories.erase(s.analysis.categories.begin() + row);
    s.analysis.observed.erase(s.analysis.observed.begin() + row);
    if (row < static_cast<int>(s.analysis.model.values.size())) s.analysis.model.values.erase(s.analysis.model.values.begin() + row);
    sync_editor_from_model(s);
    recompute(s);
}

void move_row(AppState& s, int row, int delta) {
    const int to = row + delta, k = static_cast<int>(s.analysis.observed.size());
    if (row < 0 || row >= k || to < 0 || to >= k) return;
    std::swap(s.analysis.categories[row], s.analysis.categories[to]);
    std::swap(s.analysis.observed[row], s.analysis.observed[to]);
    if (static_cast<int>(s.analysis.model.values.size()) == k) std::swap(s.analysis.model.values[row], s.analysis.model.values[to]);
    sync_editor_from_model(s);
    recompute(s);
}

void merge_thin_cells(AppState& s, MergeRule rule) {
    s.merge_undo.push_back(s.analysis.merge);
    s.analysis.merge.rule = rule;
    if (!recompute(s)) {
        s.analysis.merge = s.merge_undo.back();
        s.merge_undo.pop_back();
    }
}

void undo_merge(AppState& s) {
    if (s.merge_undo.empty()) return;
    s.analysis.merge = s.merge_undo.back();
    s.merge_undo.pop_back();
    recompute(s);
}

void merge_look_alike_labels(AppState& s) {
    const std::vector<std::vector<std::size_t>> groups = s.result.look_alike_labels;
    if (groups.empty()) return;
    std::vector<std::string> names;  // each group keeps its first label, without the invisible characters
    std::string merged;
    for (const auto& g : groups) {
        const std::string name = look_alike_name(s.analysis.categories[g.front()]);
        names.push_back(name.empty() ? s.analysis.categories[g.front()] : name);
        merged += (merged.empty() ? "\"" : ", \"") + names.back().substr(0, 40) + "\"";
    }
    const Analysis previous = s.analysis;
    const Status joined = join_categories(groups, names, &s.analysis);
    if (!joined.ok) {
        s.input_error = joined.message;
        publish_error(joined.message);
        s.view.frames_to_draw = 3;
        return;
    }
    sync_editor_from_model(s);
    if (!recompute(s)) {
        s.analysis = previous;
        sync_editor_from_model(s);
        return;
    }
    set_notice(s, "Merged the look-alike labels into " + merged + ": their counts were added.");
}

void set_pvalue_method(AppState& s, PValueMethod method) {
    s.analysis.pvalue.method = method;
    recompute(s);
}

bool apply_alpha_text(AppState& s, const std::string& text) {
    const std::size_t b = text.find_first_not_of(" \t"), e = text.find_last_not_of(" \t");
    const std::string t = b == std::string::npos ? "" : text.substr(b, e - b + 1);
    double alpha = 0;  // "0.05" or "0,05", as core reads a typed number
    if (!read_typed_number(t, &alpha) || !(alpha > 0 && alpha < 1)) {
        s.input_error = "α must lie between 0 and 1" + (t.empty() ? std::string(".") : "; \"" + t.substr(0, 20) + "\" does not.");
        publish_error(s.input_error);
        s.view.frames_to_draw = 3;
        return false;
    }
    if (alpha == s.analysis.alpha) return true;
    const double previous = s.analysis.alpha;
    s.analysis.alpha = alpha;
    if (!recompute(s)) {
        s.analysis.alpha = previous;
        return false;
    }
    return true;
}

std::string design_effect_text(const Analysis& a) {
    const DesignChoice& d = a.design;
    if (!d.requested) return "";
    if (d.kish) return "kish";
    if (std::isfinite(d.overall_design_effect)) return format_plain(d.overall_design_effect);
    return list_text(d.category_design_effects, ", ");
}

bool apply_design_effect_text(AppState& s, const std::string& text) {
    const std::size_t b = text.find_first_not_of(" \t"), e = text.find_last_not_of(" \t");
    const std::string t = b == std::string::npos ? "" : text.substr(b, e - b + 1);
    if (t == design_effect_text(s.analysis)) return true;
    auto refuse = [&](const std::string& why) {
        s.input_error = why;
        publish_error(s.input_error);
        s.view.frames_to_draw = 3;
        return false;
    };
    const Analysis previous = s.analysis;
    DesignChoice& d = s.analysis.design;
    const bool rows = !d.sample.categories.empty();  // survey rows keep their design; the effects come on top
    d.category_design_effects.clear();
    d.overall_design_effect = std::numeric_limits<double>::quiet_NaN();
    d.kish = false;
    if (t.empty()) {
        d.requested = rows;
    } else if (t == "kish" || t == "Kish") {
        if (!rows) return s.analysis = previous, refuse("Kish's design effect comes from the weights of survey rows: read the respondents' rows as survey rows first.");
        d.requested = true;
        d.kish = true;
    } else {
        std::vector<double> v;
        std::string error;
        if (!read_list(t, &v, &error)) return s.analysis = previous, refuse("Design effect: " + error);
        for (double x : v)
            if (!(x > 0 && std::isfinite(x)))
                return s.analysis = previous, refuse("A design effect must be a number above 0, such as 1.8; \"" + t.substr(0, 20) + "\" is not.");
        if (v.size() != 1 && v.size() != s.analysis.observed.size())
            return s.analysis = previous, refuse("Give one design effect for the whole sample, or one per category (" +
                                                 std::to_string(s.analysis.observed.size()) + "); " + std::to_string(v.size()) + " were given.");
        d.requested = true;
        if (v.size() == 1) d.overall_design_effect = v[0];
        else d.category_design_effects = v;
    }
    if (!recompute(s)) {
        s.analysis = previous;
        recompute(s);
        return false;
    }
    return true;
}

}  // namespace tallyproof::web

namespace tallyproof::web {

void drop_paste_job(AppState& s) {
    if (s.streaming.running) s.streaming = FileStream{};  // a file being read in chunks is replaced too
    if (!s.pasting.running) return;
    s.pasting = PasteJob{};
}

void step_paste_job(AppState& s, double budget_ms) {
    PasteJob& p = s.pasting;
    if (!p.running) return;
    bool done = false;  // units: rows split or read
    run_slices(budget_ms, 2000, 1048576, [&](std::uint64_t rows) { return done = step_input_read(&p.job, static_cast<std::size_t>(rows)); });
    if (!done) {
        set_progress(input_read_fraction(p.job), true);
        return;
    }
    // Read: applied as a short text's reading is, then the file's notice.
    PasteJob finished = std::move(p);
    s.pasting = PasteJob{};
    set_progress(1, false);
    InputReading reading = std::move(finished.job.result);
    finished.job = InputReadJob{};  // its views of the text go before the text is handed on
    apply_reading(s, finished.text, finished.options, std::move(reading));
    after_reading(s, finished.file, finished.notice);
    s.view.frames_to_draw = 3;
}

void cancel_paste_job(AppState& s) {
    if (s.streaming.running) {
        const FileStream f = std::move(s.streaming);
        const double fraction = f.size > 0 && f.reader ? f.reader->bytes() / f.size : 0;
        const std::size_t bytes = f.reader ? f.reader->bytes() : 0, lines = f.reader ? f.reader->lines() : 0;
        const std::string file = f.file;
        s.streaming = FileStream{};
        set_progress(fraction, false);
        set_notice(s, "Reading " + file + " stopped at " + std::to_string(static_cast<int>(100 * fraction)) + "% (" +
                          megabytes(static_cast<double>(bytes)) + " of " + megabytes(f.size) + ", line " +
                          format_grouped(lines) + "): the counts on screen are the ones before it.");
        s.view.frames_to_draw = 3;
        return;
    }
    if (!s.pasting.running) return;
    const double fraction = input_read_fraction(s.pasting.job);
    drop_paste_job(s);
    set_progress(fraction, false);
    set_notice(s, "Reading stopped at " + std::to_string(static_cast<int>(100 * fraction)) +
                      "%: the counts on screen are the ones before it.");
    s.view.frames_to_draw = 3;
}

namespace {
// The file's own words for what was read: the page streams only for the digit test on screen.
void finish_file_stream(AppState& s) {
    FileStream f = std::move(s.streaming);
    s.streaming = FileStream{};
    set_progress(1, false);
    const double seconds = (emscripten_get_now() - f.started_ms) / 1000;
    InputReading reading;
    reading.sample = f.reader->finish();
    reading.status = reading.sample.status;
    reading.kind = reading.status.ok ? InputKind::sample : InputKind::refused;
    const std::size_t values = f.reader->values(), bytes = f.reader->bytes();
    f.reader.reset();
    f.chunk = std::string();
    const std::string how = std::string(digit_test_name(f.options.digits.value_or(DigitTest::first)));
    apply_reading(s, {}, f.options, std::move(reading));
    if (!s.refused.message.empty()) {
        s.refused.file = f.file;
        s.view.frames_to_draw = 3;
        return;
    }
    s.reading.streamed = f.file;
    s.reading.source_name = f.file + " (read in chunks)";
    const std::string notes = s.view.notice;
    set_notice(s, f.file + ": " + format_grouped(values) + " values tallied by their " + how + " (the test on screen) from " +
                      megabytes(static_cast<double>(bytes)) + " read in chunks in " + format_fixed(seconds, 1) +
                      " s. Only the counts are kept, not the file's text: to read it another way, open it again." +
                      (notes.empty() ? "" : " " + notes));
    s.view.frames_to_draw = 3;
}
}  // namespace

FileStart open_file_stream(AppState& s, std::string_view name, double size) {
    DigitTest test = DigitTest::first;
    const bool digits = !s.groups.open && digit_test_of(s.analysis.model.kind, &test);
    if (size > kStreamFileBytes && digits) {
        const bool stopped = s.work.running;
        if (stopped) cancel_job(s);
        drop_paste_job(s);
        FileStream& f = s.streaming;
        f.options = ParseOptions{};
        f.options.digits = test;
        f.reader.emplace(f.options);
        f.file = std::string(name);
        f.size = size;
        f.running = true;
        f.started_ms = emscripten_get_now();
        set_progress(0, true);
        s.view.frames_to_draw = 3;
        return FileStart::streaming;
    }
    if (size <= kWholeFileBytes) return FileStart::whole;
    drop_paste_job(s);
    const std::string limit = megabytes(kWholeFileBytes);
    record_refusal(s, {}, Status::failure(
        std::string(name.substr(0, 80)) + " is " + megabytes(size) + ": this page reads a file of up to " + limit +
        " whole (its WebAssembly memory holds the text several times over while it is read). A larger file of raw numbers is "
        "read in chunks, without that limit, for a digit test: read a few of the amounts as first digits (Read as) or "
        "open a Benford example first, then open the file again. Otherwise tally it elsewhere (docs/large-data.md) and "
        "paste the counts."));
    s.refused.file = std::string(name);
    return FileStart::refused;
}

char* file_stream_buffer(AppState& s, std::size_t bytes) {
    if (!s.streaming.running) return nullptr;
    if (s.streaming.chunk.size() < bytes) s.streaming.chunk.resize(bytes);
    return s.streaming.chunk.data();
}

int feed_file_stream(AppState& s, std::size_t bytes, bool last) {
    FileStream& f = s.streaming;
    if (!f.running || !f.reader || bytes > f.chunk.size()) return 0;
    if (f.reader->lines() >= kStreamLineLimit) {  // line numbers are ints, counts 32-bit sizes in WebAssembly
        const std::string file = f.file;
        s.streaming = FileStream{};
        set_progress(0, false);
        record_refusal(s, {}, Status::failure(file.substr(0, 80) + " has more than " + format_grouped(kStreamLineLimit) +
                                              " lines, the most this page counts in one file; the counts on screen are the ones "
                                              "before it. The command-line tool counts any number (tallyproof --digits first FILE)."));
        s.refused.file = file;
        return 0;
    }
    f.reader->push(std::string_view(f.chunk.data(), bytes));
    if (last) f.reader->end();
    switch (f.reader->state()) {
        case DigitStreamReader::State::deciding:
            set_progress(job_fraction(s), true);
            return 1;
        case DigitStreamReader::State::streaming:
            if (!last) {
                set_progress(job_fraction(s), true);
                return 1;
            }
            finish_file_stream(s);
            return 0;
        case DigitStreamReader::State::stopped:
            finish_file_stream(s);  // refused with its line, as the whole text would be
            return 0;
        case DigitStreamReader::State::whole: break;
    }
    // Not raw numbers for the digit test (or shorter than the head): the file is read whole, as
    // any file is, when the page can hold it.
    const std::string file = f.file;
    const double size = f.size;
    s.streaming = FileStream{};
    set_progress(0, false);
    if (size <= kWholeFileBytes) return 2;
    record_refusal(s, {}, Status::failure(
        file.substr(0, 80) + " is " + megabytes(size) + " and its first lines are not raw numbers for the digit test on screen, "
        "so it cannot be read in chunks; this page reads a file of up to " + megabytes(kWholeFileBytes) +
        " whole. Tally it elsewhere (docs/large-data.md) and paste the counts."));
    s.refused.file = file;
    return 0;
}

void file_stream_failed(AppState& s, const std::string& why) {
    if (!s.streaming.running) return;
    const std::string file = s.streaming.file;
    const std::size_t lines = s.streaming.reader ? s.streaming.reader->lines() : 0;
    s.streaming = FileStream{};
    set_progress(0, false);
    record_refusal(s, {}, Status::failure(file.substr(0, 80) + ": the browser could not read the file after line " +
                                          format_grouped(lines) + " (" + why + "); the counts on screen are the ones before it."));
    s.refused.file = file;
}

}  // namespace tallyproof::web
