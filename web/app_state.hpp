// AppState: everything the page knows, apart from how it is drawn. Inputs change only through
// the functions below; results are recomputed in one place (recompute) and only read by drawing.
//
// Index: ModelEditor · AppState · transitions (input, model, test, merge, jobs, theme)
#pragma once
#include <string>
#include <string_view>
#include <vector>

#include "analysis.hpp"
#include "chi_square_density_curve.hpp"
#include "groups_state.hpp"
#include "paste_parser.hpp"
#include "pvalue_job.hpp"
#include "read_input.hpp"
#include "result.hpp"
#include "stream_tally.hpp"
#include "survey_rows.hpp"
#include "workbook_reading.hpp"

namespace tallyproof::web {

// What the user is typing for the model, kept apart from the Analysis it becomes.
struct ModelEditor {
    struct Parameter {
        std::string name;
        bool estimate = true;  // false: `value` is given
        double value = 0;
        bool required = false; // must be given (binomial trials)
    };
    std::string values;  // shares / ratio / counts, e.g. "9:3:3:1" or "20, 50, 25, 5"
    std::string edges;   // bin edges for binned measurements, e.g. "-inf, 10, 20, inf"
    std::vector<Parameter> parameters;
};

// What the user types for the bins of a "measurements in bins" reading of the last paste.
struct BinEditor {
    std::string count = "10";  // K for equal-width and equal-probability bins, 2 to kMaxBinsOnPage
    std::string edges;         // stated edges, e.g. "0, 10, 20, inf"
    std::string error;         // why the latest bin setting was not applied (the previous analysis stays)
};
constexpr int kMaxBinsOnPage = 1000;

enum class ResultTab { curve, bars, categories, planning, writeup, funnel };  // funnel: the Groups view's chart (images only)

// An analysis kept in the browser's storage (autosave and the recent list).
struct SavedAnalysis {
    std::string title;     // from the data: first categories, N, expected mix (an example's name while unchanged)
    std::string when;      // local time it was last changed
    std::string document;  // the analysis document
    std::string id;        // the analysis it is (kept through its edits, in any tab)
    double saved_ms = 0;   // when it was saved (ms since 1970): newest first across tabs
};
constexpr std::size_t kRecentLimit = 8;  // the oldest is dropped first

// A chart image to render off screen at 2x: saved as PNG, copied, or kept for printing.
struct ChartExport {
    ResultTab chart = ResultTab::curve;  // curve or bars
    int purpose = 0;                     // ImagePurpose
};

// A paste or file that was refused: shown with its message while the previous analysis stays.
struct Refusal {
    std::string message;
    std::string file;                 // the file it came from (empty for a paste)
    int line = 0;
    int column = 0;                   // the cell the message names (1-based), 0 when none
    std::vector<std::string> cells;   // the cells of `line`, as shown (split once)
    std::string text;                 // the whole refused text, kept only up to kFixableBytes
    std::string fix_text;             // its copy in the editor, while fix_open
    bool fix_open = false;
};

// The last paste that was read, so the user can have it read as another shape.
// The workbook the counts were read from (.xlsx, .ods), kept so another of its sheets can be read.
struct WorkbookSource {
    std::string bytes;                       // the file as opened (empty: the counts came from elsewhere)
    std::string name;                        // the file's name
    std::vector<WorkbookSheetInfo> sheets;   // every sheet, in the workbook's order
    std::size_t sheet = 0;                   // the sheet read (0-based)
};

struct LastReading {
    std::string text;
    int shape = -1;                   // InputShape as detected (or chosen), -1 when nothing pasted
    bool previous = false;            // its third column was read as a previous sample's counts
    BinChoice bins;                   // the bins of the last reading (kind none unless it counted into bins)
    BinEditor bin_editor;
    std::string source_name;          // where the counts came from
    bool survey = false;              // read as survey rows (one per respondent) with these columns
    bool survey_open = false;         // the survey columns' row is shown (chosen in "Read as")
    SurveyColumns survey_columns;
    WorkbookSource workbook;          // set when the last file opened was a workbook
    std::string streamed;             // the counts were tallied from a file read in chunks: which (else empty)
};

// Exact / Monte Carlo work, run a slice per frame.
struct Work {
    PValueJob job;
    bool running = false;
    double started_ms = 0;
};

// A long paste or file read in slices (core's InputReadJob), so the page answers while 100,000
// rows are read; the counts on screen stay until the reading is done, and Cancel keeps them.
struct PasteJob {
    bool running = false;
    std::string text;             // the text being read (the job holds views of it)
    ParseOptions options;
    InputReadJob job;
    std::string file;             // the file it came from ("" for a paste)
    std::string notice;           // the file reading's own notice, shown with the reading's
};
constexpr std::size_t kSlicedReadBytes = 1u << 18;  // texts this long are read in slices

// A file larger than kStreamFileBytes opened while a digit test is on screen: the page reads it
// a chunk at a time (shell.html, File.slice, 4 MiB) and hands each chunk here; core's DigitStreamReader
// decides from its first MiB, as the command-line tool does with --digits, and tallies the rest
// without keeping it, so memory does not grow with the file. Progress and Cancel are the
// reading's (draw_reading_progress); the counts on screen stay until the file is read.
struct FileStream {
    bool running = false;
    std::optional<DigitStreamReader> reader;
    ParseOptions options;
    std::string file;             // the file's name
    double size = 0;              // its size in bytes, as the browser gives it
    std::string chunk;            // where the page puts the next chunk
    double started_ms = 0;
};
constexpr double kStreamFileBytes = 8.0 * (1u << 20);   // larger files are read in chunks (smaller: whole, "Read as" kept)
constexpr double kWholeFileBytes = 64.0 * (1u << 20);   // the largest file read whole (held about four times over)
constexpr std::size_t kStreamLineLimit = 2000000000;    // lines counted in one file (line numbers are ints)
enum class FileStart { whole = 0, streaming = 1, refused = 2 };  // what the page does with a file (tp_open_file_stream)

// The session: what is kept in the browser (autosave, recent list) and what is due to be
// published to the page and kept, done once per frame by settle_frame().
struct Session {
    enum class Publish { none, analysis, screen };
    Publish due_publish = Publish::none;  // the report, JSON and document to hand to the page
    bool due_save = false;                // the document to autosave (tab slot, latest, recent list)
    std::vector<SavedAnalysis> recent;    // most recent first, at most kRecentLimit, shared by the tabs
    std::string analysis_id;              // identity of the analysis on screen (its recent entry)
    bool storage_refused = false;         // the browser refused or had no room: nothing is being kept
};

// What is handed over: chart images, print, write-up and table formats.
struct Handover {
    std::vector<ChartExport> exports;     // rendered one per frame by main
    bool print_pending = false;           // print once the queued chart images are delivered
    int writeup_style = 0;                // 0 plain, 1 Markdown, 2 TSV
    bool decimal_comma = false;
};

// How the page is shown: the result tab, the theme, the planning inputs, the redraw budget.
struct View {
    ResultTab tab = ResultTab::curve;
    bool dark = false;                    // dark theme
    bool theme_from_system = true;        // follow the system setting until the user picks
    bool theme_changed = true;            // the theme must be rebuilt before the next frame
    int demo_index = -1;                  // demo on screen, or -1
    double plan_w = 0.3, plan_target = 0.8, plan_n = 0;  // planning panel inputs
    int frames_to_draw = 2;               // redraw budget: the page draws only on input or work
    bool focus_screen = true;             // give the screen keyboard focus on the first frame
    std::string notice;                   // a short confirmation ("Share link copied")
};

// Everything the page knows, one struct per feature; drawing only reads it.
struct AppState {
    // The analysis on screen
    Analysis analysis;               // its last valid form
    ModelEditor model_editor;
    std::string input_error;         // why the latest edit was not applied (the previous result stays)
    // Quiet checks the user answered ("they are counts"), each for the counts it was answered for.
    std::vector<std::pair<std::string, std::vector<double>>> dismissed_questions;
    std::vector<MergeChoice> merge_undo;  // the rules in force before each one-click merge

    // Outputs, recomputed by recompute()
    Result result;
    DensityCurve curve;
    std::string report;              // plain-text results block (also mirrored into the page)

    Work work;
    PasteJob pasting;
    FileStream streaming;
    Refusal refused;
    LastReading reading;
    GroupsView groups;               // many groups at once: the screen read from the last paste
    Session session;
    Handover handover;
    View view;
};

void load_demo(AppState& s, int index);                      // one of kDemoScenarios
bool open_document(AppState& s, std::string_view json);      // an analysis document (a screen's too); false if refused
std::string analysis_document(const AppState& s);            // what is kept and shared: the screen while it is open
void keep_analysis(AppState& s);                             // autosave at the end of this frame (a change that recomputes nothing)
void settle_frame(AppState& s);                              // once per frame: publishes and autosaves what a change marked due
void publish_screen_now(AppState& s, const std::string& document);  // the screen's report, JSON and document to the page (groups_state.cpp)
void apply_paste(AppState& s, std::string_view text);        // counts, or a document; keeps the old data if refused
// The bytes of a paste or of a dropped or opened file (`file_name`, empty for a paste): decoded
// by core's text_decoding (UTF-8, UTF-16, Windows-1252), then read as apply_paste; a file that is
// not text (an image, a workbook, ...) is refused saying so, and the old data is kept.
void apply_input(AppState& s, std::string bytes, std::string_view file_name = {});
// Reads sheet `index` (0-based) of the workbook last opened, as the file was read (a refusal
// keeps the analysis; the sheet list stays for another choice).
void choose_sheet(AppState& s, int index);
constexpr std::size_t kFixableBytes = 1u << 20;               // refused pastes up to 1 MB can be edited on the page
void edit_refused_paste(AppState& s, bool open);             // show or hide the editor of the refused paste
void apply_fixed_paste(AppState& s);                         // read the edited paste as a new paste
void dismiss_refusal(AppState& s);                           // forget the refused paste and its message
void dismiss_question(AppState& s, int index);                 // the result's question `index` answered: not asked again
// The last paste again, read as InputShape `shape` (a digit test; for label, observed and a third
// column: 0 expected values, 1 a previous sample's counts, -1 decided from its header).
void reread_paste(AppState& s, int shape, int digit_test = -1, int third_column = -1);
                                                                 // (raw_digits: DigitTest `digit_test`)
void read_paste_into_bins(AppState& s, BinChoice::Kind kind, ModelKind model = ModelKind::normal);
                                                             // the last paste as measurements in bins, with the
                                                             // editor's K or edges (equal probability: under `model`)
// The last paste as survey rows (one per respondent: category, weight, stratum, cluster columns by
// header name or number): a design-corrected test (core/survey); refused with core's message.
void read_paste_as_survey(AppState& s, const SurveyColumns& columns);
std::vector<std::string> pasted_header(const AppState& s);   // the cells of the last paste's first line
bool offers_other_readings(const AppState& s);               // the last paste is kept: "Read as" is shown
bool shows_bin_editor(const AppState& s);                    // ... and it was read into bins: K or edges are shown
void apply_bin_editor(AppState& s);                          // the typed K or edges, to the current bins reading
void set_model_kind(AppState& s, ModelKind kind);            // resets the editor for that kind
void apply_model_editor(AppState& s);                        // editor text -> analysis.model, recompute
// Stated shares refused for their total but whole numbers (5, 3, 1, 1): read the same values as a ratio.
void read_shares_as_ratio(AppState& s);
void set_count(AppState& s, int row, double value);          // an edited table cell
void set_label(AppState& s, int row, const std::string& label);
void add_row(AppState& s);
void remove_row(AppState& s, int row);
void move_row(AppState& s, int row, int delta);
void merge_thin_cells(AppState& s, MergeRule rule);          // one-click remedy, undoable
void undo_merge(AppState& s);
void merge_look_alike_labels(AppState& s);                   // joins the categories whose labels look the same
void set_pvalue_method(AppState& s, PValueMethod method);
bool apply_alpha_text(AppState& s, const std::string& text);
// Survey design effects typed for counts or weighted shares: "" none, one number (tier 3: the
// crude correction X²/D), one per category (tier 2: first-order Rao–Scott), or "kish" (1 + CV² of
// the survey rows' weights). false: refused, message in input_error, the analysis kept.
bool apply_design_effect_text(AppState& s, const std::string& text);
std::string design_effect_text(const Analysis& a);              // the design effects as the field shows them  // typed α (0 < α < 1); false: refused, message in input_error
void copy_writeup(AppState& s, bool sentence_only);          // the write-up in the chosen style (block, or the sentence)
void copy_table(AppState& s);                                 // the per-category table as TSV
// The test's goal: find a departure (false) or show the mix conforms within w0 (true, 0 < margin_w <= 1).
void set_test_goal(AppState& s, bool show_conformity, double margin_w);
// The margin as typed ("0.1" is w0, "2 pp" a shift in percentage points; core/conformity read_conformity_margin).
void set_conformity_margin_text(AppState& s, const std::string& text);
void sync_editor_from_model(AppState& s);                    // the model editor shows s.analysis.model
bool recompute(AppState& s);                                 // false: input_error set, old result kept
bool work_running(const AppState& s);                        // exact / Monte Carlo work, or a screen being tested
void step_job(AppState& s, double budget_ms);                // a slice of exact / Monte Carlo work (else of the screen)
void cancel_job(AppState& s);
void step_paste_job(AppState& s, double budget_ms);          // a slice of a long text's reading (apply_paste)
void cancel_paste_job(AppState& s);                          // the counts on screen stay
void drop_paste_job(AppState& s);                            // stops it silently (new data replace it)
double job_fraction(const AppState& s);
bool reading_running(const AppState& s);                     // a long text or a file being read (progress, Cancel)
// A file chosen or dropped (its name and size): whole (the page reads it and calls apply_input),
// streaming (the page hands its chunks to feed_file_stream), or refused (over kWholeFileBytes,
// said on screen with the limit).
FileStart open_file_stream(AppState& s, std::string_view name, double size);
char* file_stream_buffer(AppState& s, std::size_t bytes);    // where the next chunk goes
// The next `bytes` of the file (`last`: its end). 1 go on, 0 stop (read, refused or cancelled),
// 2 read it whole instead (it is not raw numbers for the digit test), the size allowing.
int feed_file_stream(AppState& s, std::size_t bytes, bool last);
void file_stream_failed(AppState& s, const std::string& why);  // the browser could not read the file

void restore_session(AppState& s);
bool open_share_fragment(AppState& s, const std::string& fragment);  // false: refused, message shown        // share link in the URL, else the autosaved analysis, else an example
void start_fresh(AppState& s);            // forget the autosaved analysis; back to the first example
void open_recent(AppState& s, int index);
void remove_recent(AppState& s, int index);   // forget one entry of the recent list (in every tab)
void reload_recent(AppState& s);              // another tab changed the list: read it again
void copy_share_link(AppState& s);
void download_document(AppState& s);      // the analysis document (JSON)
void download_table(AppState& s);         // the per-category table (CSV)
void download_workbook(AppState& s);      // the per-category table and the write-up's numbers (.xlsx)
void queue_chart_export(AppState& s, ResultTab chart, int purpose);
void request_print(AppState& s);          // chart images first, then the print layout

}  // namespace tallyproof::web
