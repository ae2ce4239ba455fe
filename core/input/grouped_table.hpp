// Grouped tables: pasted text holding the counts of many groups (samples) at once, read into a
// groups x categories matrix for screening (screen_groups.hpp). Three shapes: a long table (group,
// category, count per line), a wide table (a header row naming the categories, one row per
// group) and raw observations with a group column (group, value per line; the values tallied
// per group as the one-sample reader tallies them: text, whole numbers, a digit or bins).
// The group column and the shape are detected and stated in notes; both can be overridden.
// Rules are common practice for spreadsheet exports, each stated in the note it produces.
#pragma once
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <unordered_map>
#include <utility>
#include <vector>

#include "delimited_text.hpp"
#include "parsed_input.hpp"

namespace tallyproof {

enum class GroupShape {
    long_table,  // group, category, count on every line
    wide_table,  // one row per group, one column per category (header row naming them)
    raw_values,  // group, value on every line; values tallied per group
};
const char* group_shape_name(GroupShape shape);                          // "long", "wide", "raw"
bool group_shape_from_name(const std::string& name, GroupShape* shape);  // false if unknown

struct GroupReadOptions {
    std::string by;                  // the group column: a header name or a 1-based number; empty: detect
    std::optional<GroupShape> shape; // override the detected shape
    std::optional<bool> header;      // the first line is (true) or is not (false) a header row; unset: detect
    ParseOptions parse;              // raw values: digits, bins, case folding...; decimal mark, separator
};

constexpr std::size_t kMaxGroups = 2000000;             // more groups are refused
constexpr std::size_t kMaxGroupCells = 20000000;        // groups x categories held at most
constexpr std::size_t kMaxGroupRows = 2000000;          // rows held at most: a wide table or raw values (rows are held
                                                        // whole); a long table is counted as it is split, rows not held
constexpr std::size_t kPlanRows = 1024;                 // a long table's layout is decided from its first rows

struct GroupedCounts {
    Status status;                        // !ok: the first problem, naming line and group
    GroupShape shape = GroupShape::long_table;
    int group_column = 1;                 // 1-based
    std::string group_column_name;        // its header cell, or "column N"
    std::vector<std::string> categories;  // shared by every group
    std::vector<std::string> groups;      // in first-seen order
    std::vector<int> group_lines;         // the line where each group first appears
    std::vector<double> counts;           // groups x categories, row-major
    bool ordered = false;                 // whole-number or digit categories, bins
    std::optional<DigitTest> digit_test;  // raw values tallied by a digit
    std::vector<double> edges;            // raw values counted into bins
    bool header = false;                  // the first line was read as a header row
    bool numbered_header = false;         // ...detected by its numbered categories (0..9, years, sizes)
    std::vector<std::vector<std::size_t>> look_alike_groups;  // groups whose names look the same (label_text.hpp)
    bool group_problem = false;           // refused for what the groups are (one group, a group cell empty
                                          // or missing): the text is a table of groups, and this is its message
    std::vector<std::string> notes;       // what was detected, plain sentences
    std::vector<CellProblem> problems;    // offending cells (at most kMaxProblems)

    double count(std::size_t group, std::size_t category) const { return counts[group * categories.size() + category]; }
};

// One sentence naming up to three sets of groups whose names look the same (empty when none).
std::string group_look_alike_note(const std::vector<std::string>& groups, const std::vector<std::vector<std::size_t>>& alike);

// Reads a grouped paste; never throws, refuses with a message naming the line (and the group).
// Group names, like category labels, enter through label_text.hpp: NFC (one group however it is
// written), characters that draw nothing shown as <U+XXXX>; names that look alike are noted.
GroupedCounts read_grouped_text(std::string_view text, const GroupReadOptions& options = {});
// The same, from the text's non-blank rows already split with separator `sep` (parse_input's
// `rows`): the text is not split again.
GroupedCounts read_grouped_rows(std::vector<TableRow> rows, Separator sep, const GroupReadOptions& options = {});


// Group names in first-seen order, as read: each group's index by its normalised name, the cell
// as first written, and the groups met in more than one Unicode form (noted once).
struct GroupNameIndex {
    std::unordered_map<std::string, std::size_t> index;
    std::vector<std::string> first_spelling;  // the cell as first written, per group
    std::vector<unsigned char> noted;         // per group: already in `respelled`
    std::vector<std::size_t> respelled;       // groups met in more than one spelling
    std::size_t find_or_add(const std::string& name, const std::string& spelling, int line, GroupedCounts* out);
};

// read_grouped_text / read_grouped_rows in steps, for a caller that must stay responsive (the
// page): the text split a budget of rows per step, the table's layout decided, its rows read a
// budget per step, then the notes and checks. The same operations in the same order as the
// one-call readers, so the same reading. A text given must outlive the job.
// A long table is counted as it is split: once its first kPlanRows rows decide a layout that
// the rest cannot change (a long table: a group repeated there, or text beside the groups, and
// no numbered header row), they are read and dropped, and every further line is counted into the
// groups x categories matrix straight from the text, so memory is that of the matrix and the
// names, not of the rows (and no row limit applies).
struct GroupedRowsJob {
    GroupedCounts out;              // complete when `done`
    bool done = false;
    // The run's state.
    GroupReadOptions options;
    Separator sep = Separator::tab;
    std::string_view text;          // being split (start_grouped_text)
    DelimitedReader reader{std::string_view(), Separator::tab};
    bool splitting = false, planned = false, stopped = false, rows_read = false, releasing = false;
    bool streaming = false;         // a long table counted as it is split (rows not held)
    bool stream_tried = false;      // the first kPlanRows rows were tried as such a table
    bool numbered_candidate = false;  // the plan looked at a numbered header row (a wide table's)
    std::vector<TableRow> rows;
    int first_line = 0;             // the line of the first row (the header row, when there is one)
    std::size_t next = 0, first = 0, group_col = 0, category_col = 0, count_col = 0, value_col = 0;
    std::vector<std::size_t> count_cols;  // a wide table's category columns
    DecimalMark mark = DecimalMark::point;
    bool numbered = false;
    double step = 0;                // the numbered header's step
    GroupNameIndex names;
    std::unordered_map<std::string, std::size_t> category_index;  // a long table's categories
    // A long table's counts as read: group g's category c at g * stride + c (categories in
    // first-seen order; the stride grows as categories appear), and whether a row gave it.
    std::vector<double> sums;
    std::vector<unsigned char> seen;
    std::size_t stride = 0;
    std::size_t long_rows = 0, repeated = 0;   // rows counted; rows that repeat a group and category
    int first_repeat = 0;                      // the line of the first repeat
    // The last group's cell as written and its index (a table sorted by group repeats it), and the
    // first category cells as written with their index: read again without normalising.
    std::string last_group_cell;
    std::size_t last_group = static_cast<std::size_t>(-1);
    std::vector<std::pair<std::string, std::size_t>> category_cells;
    std::vector<std::string_view> scratch;     // a held row's cells as views
};
void start_grouped_text(std::string_view text, const GroupReadOptions& options, GroupedRowsJob* job);
void start_grouped_rows(std::vector<TableRow> rows, Separator sep, const GroupReadOptions& options, GroupedRowsJob* job);
// About `budget` rows split or read (0: all); true when done (then job->out is the reading).
bool step_grouped_rows(GroupedRowsJob* job, std::size_t budget);
// Share of the job done, in [0, 1): for progress.
double grouped_rows_fraction(const GroupedRowsJob& job);

}  // namespace tallyproof
