// ParsedInput and its options: the value types of a read paste (its shape, categories, counts,
// third column, notes and located problems) and of how to read it (ParseOptions), shared by the
// paste parser and the readers of each shape (table_shape, raw_observations, binning,
// grouped_table), so none of them includes another's API for its types.
#pragma once
#include <cstddef>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "analysis.hpp"  // ModelKind
#include "delimited_text.hpp"
#include "digit_laws.hpp"
#include "number_reading.hpp"
#include "status.hpp"

namespace tallyproof {

enum class InputShape {
    label_count,              // label<TAB>count per line
    label_observed_expected,  // label, observed, expected per line
    counts_column,            // one count per line, labels Category 1..k
    counts_row,               // one row of counts across cells (optionally under a row of labels)
    raw_text,                 // raw observations: text values, tallied
    raw_whole_numbers,        // raw observations: whole numbers, ordered categories min..max
    raw_digits,               // raw numbers tallied by a digit (first, second, first two, last)
    raw_bins,                 // raw numbers counted into bins
};
const char* input_shape_name(InputShape shape);                           // "label-count", ...
const char* input_shape_words(InputShape shape);                          // "label and count", ...
bool input_shape_from_name(const std::string& name, InputShape* shape);  // false if unknown

// What a third column (label, observed, third) holds: expected values of four kinds, or a
// previous sample's counts (model kind reference-sample: a 2 x k test of homogeneity).
enum class ExpectedKind { none, shares, percentages, ratios, counts, previous_sample };
const char* expected_kind_name(ExpectedKind kind);  // "shares", "percentages", ..., "previous-sample"

// How the third column is read: automatic (a previous sample when its header names one, see
// previous_sample_header.hpp; else expected values), or as chosen.
enum class ThirdColumn { automatic, expected, previous_sample };
const char* third_column_name(ThirdColumn choice);                           // "auto", "expected", "previous"
bool third_column_from_name(const std::string& name, ThirdColumn* choice);  // false if unknown

struct BinChoice {
    enum class Kind { none, edges, equal_width, equal_probability } kind = Kind::none;
    std::vector<double> edges;  // Kind::edges: strictly increasing, may start at -inf / end at +inf
    int bins = 0;               // equal_width / equal_probability: the number of bins K
    // equal_probability: the model whose quantiles i/K are the edges (normal when not set; only
    // normal, lognormal and exponential can), and its given parameters (as Model::parameters;
    // the others are estimated from the raw values).
    std::optional<ModelKind> model;
    std::vector<std::pair<std::string, double>> parameters;
};

struct ParseOptions {
    std::optional<InputShape> shape;       // override the detected shape
    bool raw = false;                      // the cells are raw observations, one per cell
    std::optional<DigitTest> digits;       // tally this digit of raw numbers
    BinChoice bins;                        // count raw numbers into bins
    bool case_fold = false;                // raw text: "Red" and "red" are one category
    bool sorted = false;                   // raw text: categories in sorted, not first-seen, order
    std::optional<DecimalMark> decimal;    // override the detected decimal mark
    std::optional<Separator> separator;    // override the detected separator
    ThirdColumn third_column = ThirdColumn::automatic;  // label, observed, third: what the third holds
};

// One non-blank row of pasted text as split into cells (delimited_text.hpp).
struct TableRow {
    int line = 0;                    // 1-based line where the row starts
    std::vector<std::string> cells;  // trimmed, trailing empty cells dropped; never empty
};

struct CellProblem {
    int line = 0;    // 1-based
    int column = 0;  // 1-based cell index
    std::string message;
};

struct ParsedInput {
    Status status;                          // !ok: the first problem, naming line and column
    std::vector<std::string> categories;
    std::vector<double> observed;           // non-negative whole counts
    std::vector<double> expected;           // empty unless a third column was read (expected values or
                                            // the previous sample's whole counts, as expected_kind says)
    ExpectedKind expected_kind = ExpectedKind::none;
    std::vector<std::string> column_names;  // from a header row, when there is one
    InputShape shape = InputShape::label_count;
    Separator separator = Separator::tab;
    DecimalMark decimal = DecimalMark::point;
    bool ordered = false;                   // whole-number and digit categories, bins
    std::optional<DigitTest> digit_test;    // raw_digits: the digit tallied
    std::vector<double> edges;              // raw_bins: the k + 1 bin edges
    std::optional<ModelKind> bin_model;     // equal-probability bins: the model that placed them
    std::vector<std::pair<std::string, double>> bin_parameters;  // ... and its given parameters
    std::vector<std::string> notes;         // plain sentences: what was detected, dropped, left out
    std::vector<std::string> alternatives;  // other readings of ambiguous input
    std::vector<CellProblem> problems;      // offending cells (at most kMaxProblems)
};

// Adds a located problem: the first becomes out->status; at most kMaxProblems are kept.
void add_problem(ParsedInput* out, int line, int column, const std::string& message);

constexpr std::size_t kMaxInputBytes = 256u << 20;  // larger pastes are refused at once
constexpr std::size_t kMaxCategories = 100000;      // more categories are refused
constexpr std::size_t kMaxProblems = 100;           // offending cells listed

}  // namespace tallyproof
