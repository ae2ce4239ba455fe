// Spreadsheet export of the category table. Formula injection is handled as OWASP's CSV
// Injection page advises (https://owasp.org/www-community/attacks/CSV_Injection): prefix text
// starting with = + - @ tab or CR with a single quote, and quote every field that needs it
// (RFC 4180 section 2: fields holding the separator, quotes or line breaks; quotes doubled).
// Cells are typed when they are made, so a number we formatted (even -1.41) is never altered,
// while a label that merely looks like a formula or a number is always treated as text.
#include "table_export.hpp"

#include <cmath>
#include <cstdio>

#include "multiplicity.hpp"
#include "number_format.hpp"

namespace tallyproof {
namespace {

bool formula_trigger(char c) { return c == '=' || c == '+' || c == '-' || c == '@' || c == '\t' || c == '\r'; }

std::string with_decimal_mark(std::string s, const TableExportOptions& o) {
    if (o.decimal_comma)
        for (char& c : s) if (c == '.') c = ',';
    return s;
}

const char* adjustment_label(MultiplicityMethod m) {
    switch (m) {
        case MultiplicityMethod::holm: return "Holm";
        case MultiplicityMethod::bonferroni: return "Bonferroni";
        case MultiplicityMethod::benjamini_hochberg: return "Benjamini-Hochberg";
        case MultiplicityMethod::none: return "none";
    }
    return "none";
}

}  // namespace

TableCell text_cell(std::string text) { return TableCell{false, std::move(text)}; }

TableCell number_cell(double x, int significant_digits) {
    if (!std::isfinite(x)) return TableCell{true, ""};
    if (x == 0) x = 0;  // no "-0"
    char buf[48];
    std::snprintf(buf, sizeof buf, "%.*g", significant_digits < 1 ? 1 : (significant_digits > 17 ? 17 : significant_digits), x);
    return TableCell{true, buf, x};
}

TableCell count_cell(double x) {
    if (!std::isfinite(x)) return TableCell{true, ""};
    if (x == std::floor(x) && std::fabs(x) < 1e15) {
        char buf[32];
        std::snprintf(buf, sizeof buf, "%.0f", x == 0 ? 0.0 : x);
        return TableCell{true, buf, x == 0 ? 0.0 : x};
    }
    return number_cell(x, 6);
}

TableCell probability_cell(const TailProbability& p) {
    if (std::isnan(p.p)) return TableCell{true, ""};
    TableCell c = p.p > 0 || std::isinf(p.log10_p) || std::isnan(p.log10_p)
                      ? number_cell(p.p, 4)
                      // Below the double range: mantissa and exponent from log10, so it is never written as 0.
                      : TableCell{true, format_power_of_ten(p.log10_p, 3, ExponentStyle::e_notation)};
    c.probability = true;
    return c;
}

char table_separator(const TableExportOptions& o) {
    if (o.format == TableFormat::tsv) return '\t';
    return o.decimal_comma ? ';' : ',';
}

std::string neutralised_text(std::string_view text, const TableExportOptions& o) {
    const bool tsv = o.format == TableFormat::tsv;
    std::string s;
    s.reserve(text.size() + 3);
    for (char ch : text) {
        const unsigned char c = static_cast<unsigned char>(ch);
        const bool line_or_tab = c == '\t' || c == '\r' || c == '\n';
        if ((c < 0x20 && !(line_or_tab && !tsv)) || c == 0x7F) s.push_back(' ');  // TSV cannot hold tabs or line breaks
        else s.push_back(ch);
    }
    // OWASP's triggers at the start; also after leading blanks, which some programs skip.
    std::size_t first = 0;
    while (first < s.size() && (s[first] == ' ' || s[first] == '\t' || s[first] == '\r' || s[first] == '\n')) ++first;
    if ((!s.empty() && (formula_trigger(s[0]) || s[0] == '\n')) || (first < s.size() && formula_trigger(s[first])))
        s.insert(s.begin(), '\'');
    const char sep = table_separator(o);
    bool quote = s.find('"') != std::string::npos;
    if (!tsv) quote = quote || s.find_first_of(std::string{sep, '\r', '\n'}) != std::string::npos;
    if (!quote) return s;
    std::string q = "\"";
    for (char c : s) {
        if (c == '"') q += "\"\"";
        else q.push_back(c);
    }
    return q + "\"";
}

std::string write_table(const std::vector<std::vector<TableCell>>& rows, const TableExportOptions& o) {
    const char sep = table_separator(o);
    const char* eol = o.format == TableFormat::csv ? "\r\n" : "\n";
    std::string out = o.byte_order_mark ? "\xEF\xBB\xBF" : "";
    for (const auto& row : rows) {
        for (std::size_t i = 0; i < row.size(); ++i) {
            if (i) out.push_back(sep);
            out += row[i].is_number ? with_decimal_mark(row[i].text, o) : neutralised_text(row[i].text, o);
        }
        out += eol;
    }
    return out;
}

std::vector<std::vector<TableCell>> category_rows(const Result& r, bool decimal_comma) {
    TableExportOptions o;
    o.decimal_comma = decimal_comma;
    // Sison-Glaz's simultaneous intervals, or Goodman's where those are not given (a total above
    // 1e8, α below 1e-10): the header names the method, so no interval column is left empty.
    bool sison = false;  // Sison-Glaz is left out for every cell at once (the total, α) or not at all
    for (const auto& d : r.diagnostics.categories) sison = sison || std::isfinite(d.sison_glaz.lower);
    const double alpha = r.diagnostics.alpha;
    const std::string level = alpha >= 1e-6 ? with_decimal_mark(format_plain(100 * (1 - alpha)), o) + "% "
                                            : "1 − α (α = " + with_decimal_mark(format_significant(alpha, 3), o) + ") ";
    const std::string sg = std::string(sison ? "Sison-Glaz " : "Goodman ") + level;
    std::vector<std::vector<TableCell>> rows;
    rows.push_back({text_cell("Category"), text_cell("Observed"), text_cell("Expected"), text_cell("Observed share"),
                    text_cell("Expected share"), text_cell("Contribution"), text_cell("Pearson residual"),
                    text_cell("Adjusted residual"), text_cell("Category p"),
                    text_cell(std::string("Adjusted p (") + adjustment_label(r.diagnostics.adjustment) + ")"),
                    text_cell("Direction"), text_cell(sg + "lower"), text_cell(sg + "upper")});
    if (!r.status.ok) return rows;
    const std::size_t k = r.tested_categories.size();
    for (std::size_t i = 0; i < k; ++i) {
        const double obs = i < r.tested_observed.size() ? r.tested_observed[i] : NAN;
        const double exp = i < r.tested_expected.size() ? r.tested_expected[i] : NAN;
        std::vector<TableCell> row = {text_cell(r.tested_categories[i]), count_cell(obs), number_cell(exp),
                                      number_cell(r.n > 0 ? obs / r.n : NAN), number_cell(r.n > 0 ? exp / r.n : NAN),
                                      number_cell(i < r.contributions.size() ? r.contributions[i] : NAN)};
        if (i < r.diagnostics.categories.size()) {
            const CategoryDiagnostic& d = r.diagnostics.categories[i];
            row.insert(row.end(), {number_cell(d.pearson_residual), number_cell(d.adjusted_residual), probability_cell(d.binomial),
                                   probability_cell(d.adjusted), text_cell(d.direction),
                                   number_cell(sison ? d.sison_glaz.lower : d.goodman.lower),
                                   number_cell(sison ? d.sison_glaz.upper : d.goodman.upper)});
        } else {
            row.insert(row.end(), {count_cell(NAN), count_cell(NAN), count_cell(NAN), count_cell(NAN), text_cell(""),
                                   count_cell(NAN), count_cell(NAN)});
        }
        rows.push_back(std::move(row));
    }
    return rows;
}

std::string category_table(const Result& r, const TableExportOptions& o) { return write_table(category_rows(r, o.decimal_comma), o); }

}  // namespace tallyproof
