// ParsedInput's names and located problems (parsed_input.hpp).
#include "parsed_input.hpp"

namespace tallyproof {
namespace {

struct ShapeName { InputShape shape; const char* name; const char* words; };
constexpr ShapeName kShapes[] = {
    {InputShape::label_count, "label-count", "label and count"},
    {InputShape::label_observed_expected, "label-observed-expected", "label, observed and expected"},
    {InputShape::counts_column, "counts-column", "a single column of counts"},
    {InputShape::counts_row, "counts-row", "a single row of counts"},
    {InputShape::raw_text, "raw-text", "raw text values"},
    {InputShape::raw_whole_numbers, "raw-whole-numbers", "raw whole numbers"},
    {InputShape::raw_digits, "raw-digits", "raw numbers for a digit test"},
    {InputShape::raw_bins, "raw-bins", "raw numbers counted into bins"},
};

}  // namespace

const char* input_shape_words(InputShape shape) {
    for (const auto& n : kShapes)
        if (n.shape == shape) return n.words;
    return "";
}

void add_problem(ParsedInput* out, int line, int column, const std::string& message) {
    if (out->status.ok) out->status = Status::failure(message, line, column);
    if (out->problems.size() < kMaxProblems) out->problems.push_back(CellProblem{line, column, message});
}

const char* input_shape_name(InputShape shape) {
    for (const auto& n : kShapes)
        if (n.shape == shape) return n.name;
    return "label-count";
}

bool input_shape_from_name(const std::string& name, InputShape* shape) {
    for (const auto& n : kShapes)
        if (name == n.name) { *shape = n.shape; return true; }
    return false;
}

const char* expected_kind_name(ExpectedKind kind) {
    switch (kind) {
        case ExpectedKind::none: return "none";
        case ExpectedKind::shares: return "shares";
        case ExpectedKind::percentages: return "percentages";
        case ExpectedKind::ratios: return "ratios";
        case ExpectedKind::counts: return "counts";
        case ExpectedKind::previous_sample: return "previous-sample";
    }
    return "none";
}

const char* third_column_name(ThirdColumn choice) {
    switch (choice) {
        case ThirdColumn::automatic: return "auto";
        case ThirdColumn::expected: return "expected";
        case ThirdColumn::previous_sample: return "previous";
    }
    return "auto";
}

bool third_column_from_name(const std::string& name, ThirdColumn* choice) {
    for (ThirdColumn c : {ThirdColumn::automatic, ThirdColumn::expected, ThirdColumn::previous_sample})
        if (name == third_column_name(c)) { *choice = c; return true; }
    return false;
}

}  // namespace tallyproof
