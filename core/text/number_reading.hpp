// Number reading: one spreadsheet cell read as a number the way people write them in the
// common locales (decimal point or comma; thousands grouped by , . space ' or no-break spaces;
// currency signs, percent signs, accounting parentheses, Unicode minus, exponents). Conventions
// are common practice (CLDR number patterns, from memory); the value is correctly rounded.
#pragma once
#include <cstddef>
#include <string>
#include <string_view>

namespace tallyproof {

enum class DecimalMark { point, comma };
const char* decimal_mark_name(DecimalMark mark);  // "decimal point", "decimal comma"

struct NumberReading {
    bool ok = false;
    double value = 0;
    bool negative = false;
    bool percent = false;        // written with a % sign (value is as written: "12%" -> 12)
    bool currency = false;       // written with $ € £ ¥
    bool grouped = false;        // thousands separators were used
    bool exponent = false;
    int decimals = 0;            // digits written after the decimal mark
    bool out_of_range = false;   // written as a number beyond the double range; ok is false and value is
                                 // an infinity ("1e400") or zero ("1e-400")
};

// Reads `cell` with the given decimal mark; the other of . and , may only group thousands.
// When `canonical` is given it receives the written digits as "-1234.50e3" (no grouping,
// decimal point), the form digit tallies need. Never allocates when canonical is null.
NumberReading read_number(std::string_view cell, DecimalMark mark, std::string* canonical = nullptr);

// A number typed into a field or given as a command-line option (α, a margin w0, λ, a
// parameter, a value of the model editor): the one reader of typed numbers on the page and in
// the tool. The text is read as read_number reads a pasted cell, with the decimal mark decided
// by the text itself, so "0.05", "0,05", ".05", "+0.05", "1e-3", "1 000", "1,234.5" and "1.234,5"
// are all read. A text that reads with either mark is read with the decimal point when it
// holds a point ("1.234" is 1.234, as typed numbers were always read) and refused when its only
// mark is a comma ("1,234": 1.234 or 1234?). A percent or currency sign is refused: each field
// says its unit ("5 %" is not taken for 0.05). "inf", "infinity" and "∞" (any case, signed) and
// "nan" are read as the values they name, and a number beyond the double range ("1e400") as the
// infinity or zero it rounds to, so that the caller's own range check names the problem.
// Spaces around the number are ignored. Returns false, leaving `value`, when it is not a number.
bool read_typed_number(std::string_view text, double* value);

// What one cell says about the decimal mark of its column.
enum class MarkEvidence {
    not_a_number,  // neither reading works
    neutral,       // both readings give the same value ("12", "7%")
    point,         // only the decimal-point reading works ("12.5", "1,234,567")
    comma,         // only the decimal-comma reading works ("12,5", "1.234.567")
    ambiguous,     // both work with different values ("1,234", "1.234")
};
MarkEvidence decimal_mark_evidence(std::string_view cell);

// True when the cell is written as a number that cannot be used: beyond the double range with
// either decimal mark ("1e400", "1e-400"), not a number or an infinity ("NaN", "-Inf", "∞"), or a
// spreadsheet error value ("#DIV/0!", "#N/A"). Such a cell is data, never a header.
bool is_unusable_number(std::string_view cell);

// Tally of the evidence a column's cells give, and the decision it supports.
struct MarkVotes {
    std::size_t point = 0, comma = 0, ambiguous = 0;
    bool whole_if_point = true;  // every ambiguous cell is a whole number read with a decimal point
    bool whole_if_comma = true;  // ... read with a decimal comma
    std::string first_ambiguous;  // the first ambiguous cell as written
    int line = 0, column = 0;     // where it is
    void add(std::string_view cell, int line, int column);
};

// Decides a column's decimal mark: the only mark any cell supports; else, for count columns
// (`want_whole`), the reading that makes every ambiguous cell whole; else `fallback`. When an
// ambiguous cell decided nothing by itself, `note` and `alternative` say what was chosen.
DecimalMark decide_decimal_mark(const MarkVotes& votes, bool want_whole, DecimalMark fallback,
                                std::string* note, std::string* alternative);

// Trims ASCII white space and the no-break spaces U+00A0 and U+202F at both ends.
std::string_view trim_cell_ends(std::string_view cell);
// The same, returning at once when both ends are printable ASCII (the usual cell: inline).
inline std::string_view trim_cell(std::string_view cell) {
    auto printable = [](char c) { return static_cast<unsigned char>(c - 0x21) < 0x5E; };  // '!'..'~'
    if (!cell.empty() && printable(cell.front()) && printable(cell.back())) return cell;
    return trim_cell_ends(cell);
}

}  // namespace tallyproof
