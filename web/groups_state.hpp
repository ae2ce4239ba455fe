// The Groups view's state: a screen of many groups read from one paste (a long, wide or raw
// table with a group column), its results, the order the table shows, and the group opened as a
// single analysis. Changed only by the transitions below, which the canvas and the form view
// both call (one state, two views).
#pragma once
#include <string>
#include <vector>

#include "analysis.hpp"
#include "screen_groups.hpp"
#include "grouped_table.hpp"
#include "screen_funnel.hpp"
#include "screen_document.hpp"

namespace tallyproof::web {

struct AppState;

enum class GroupColumn { name, n, statistic, df, p, q, w, flag };  // the table's sortable columns

struct GroupsView {
    bool open = false;             // the results area shows the screen (or one of its groups)
    std::string text;              // the paste it was read from (read again when the reading changes)
    GroupReadOptions read;         // the group column and shape chosen ("" and none: detected)
    GroupedCounts counts;
    Analysis base;                 // model, statistic and p-value settings every group is tested with
    ScreenChoice choice;
    ScreenResult result;
    ScreenFunnel funnel;
    std::string report;            // screen_report_text, mirrored into the page
    GroupColumn sort = GroupColumn::q;
    bool ascending = true;
    std::vector<int> order;        // group indices in the order shown
    int opened = -1;               // the group shown as a single analysis, -1: the screen itself
    bool offered = false;          // the last one-sample paste also reads as groups: offer it
    // Testing the groups runs in slices between frames (the page's work tasks), with progress and
    // Cancel; `result` is the finished screen, or says why there is none while it runs.
    ScreenJob job;
    bool screening = false;
};

// Reads `text` as groups (options: the group column and shape; empty: detected) and opens the
// screen, testing each group with the analysis on screen's model and settings. False (nothing
// changed) when the text does not read as at least two groups; `why` then says why.
bool open_groups(AppState& s, const std::string& text, const GroupReadOptions& options, std::string* why = nullptr);
bool open_groups_read(AppState& s, const std::string& text, const GroupReadOptions& options, GroupedCounts counts);  // already read
bool open_groups_document(AppState& s, const GroupedCounts& counts, const ScreenChoice& choice);
// A screen document's view (sort column and direction, the opened group by name) applied to the
// screen just opened from it; an unknown group name leaves the table shown.
void apply_screen_view(AppState& s, const ScreenView& view);
// The analysis document of the screen on the page (groups, settings, sort, opened group): what
// autosave, the recent list, the share link and the analysis file carry while the screen is open.
std::string screen_document(const AppState& s);
// A screen this large is handed to the page without its table of every group (the form view asks
// for a page of rows at a time: screen_rows_json) and is not autosaved whole (browsers keep about
// 5 MB a site; its document is larger, and writing it would hold the page for seconds).
constexpr std::size_t kListedGroups = 5000;       // more groups: the result JSON lists none
constexpr std::size_t kKeptScreenCells = 200000;  // more groups x categories: not autosaved
bool screen_listed_whole(const AppState& s);
bool screen_kept_whole(const AppState& s);
// The rows shown at places [start, start + count) of the Groups view's order, as the "groups"
// objects of the result document, each with its "index" in the screen.
std::string screen_rows_json(const AppState& s, std::size_t start, std::size_t count);
std::string screen_title(const AppState& s);  // "40 groups · Benford's first-digit law · 1 flagged"
void set_screen_choice(AppState& s, const ScreenChoice& choice);  // against, adjustment, q
// Groups whose names look the same (GroupedCounts::look_alike_groups) joined, each under its
// first name, their counts added; the screen is tested again.
void merge_look_alike_groups(AppState& s);
void sort_groups(AppState& s, GroupColumn column, bool ascending);
void open_group(AppState& s, int group);      // its full single analysis, the screen kept
void back_to_groups(AppState& s);             // from an opened group to the screen
void leave_groups(AppState& s);               // back to one sample (the screen is dropped)
void recompute_groups(AppState& s);           // after a change of the base analysis's settings
void step_screen(AppState& s, double budget_ms);  // a slice of the screen's testing (about budget_ms)
void cancel_screen(AppState& s);              // stops the testing: no result, saying so
void drop_screen_job(AppState& s);            // stops it silently (a new screen replaces it)
void copy_screen_summary(AppState& s);        // the write-up of the screen: summary and cautions
void copy_groups_table(AppState& s);          // one row per group, TSV for a spreadsheet
void download_groups_table(AppState& s);      // the same as a CSV file
void download_groups_workbook(AppState& s);   // the groups table and the screen's numbers (.xlsx)
std::string group_banner(const AppState& s);
void show_groups_place(const AppState& s);    // mirrors the view's place into the form view  // "Group Ben (2 of 40): flagged, q = 0.0012"

}  // namespace tallyproof::web
