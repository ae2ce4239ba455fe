// Table shapes: pasted rows read as a table of counts (label + count, label + observed +
// expected, a single column or a single row of counts), with header and totals rows, and the
// detection of which shape (table or raw observations) a paste has. Rules are common practice
// for spreadsheet clipboard text, stated in the notes they produce.
#pragma once
#include <string>
#include <vector>

#include "parsed_input.hpp"

namespace tallyproof {

// True when the cell reads as a number with either decimal mark, or is written as a number that
// cannot be used ("1e400", "NaN", "#DIV/0!"): such a cell is refused where it stands, never taken
// for a header.
bool looks_numeric(const std::string& cell);

// Space-separated words regrouped as [label, numbers...]: the trailing numbers (one, or two when
// every row ends in two and the last column has fractions or percent signs) follow one label.
void regroup_space_words(std::vector<TableRow>* rows);

// The shape of `rows` (a leading sample when `more_rows`); `why` receives the reason when the
// choice between a counts column and raw whole numbers was a judgement.
InputShape detect_shape(const std::vector<TableRow>& rows, bool more_rows, const ParseOptions& options,
                        std::string* why);

// True when the first row of the sample is a header row above raw numbers in a single column or grid.
bool raw_header_row(const std::vector<TableRow>& sample);

// Reads a table-shaped paste (the four table shapes) into `out` (shape and separator set).
void read_table(const std::vector<TableRow>& rows, const ParseOptions& options, ParsedInput* out);

}  // namespace tallyproof
