// Spreadsheet export: OWASP's CSV-injection rules (https://owasp.org/www-community/attacks/CSV_Injection)
// and RFC 4180 quoting, checked cell by cell by rule, and a whole table read back with an RFC 4180
// reader written here, so hostile labels cannot shift columns or start a formula.
#include <doctest/doctest.h>

#include <cmath>
#include <cstdlib>
#include <string>
#include <vector>

#include "table_export.hpp"

using namespace tallyproof;

namespace {

TableExportOptions csv() { return {}; }
TableExportOptions tsv() {
    TableExportOptions o;
    o.format = TableFormat::tsv;
    return o;
}

// RFC 4180 section 2 reader (CRLF records, quoted fields with doubled quotes), independent of
// the writer, for reading our output back.
std::vector<std::vector<std::string>> read_rfc4180(const std::string& s, char sep) {
    std::vector<std::vector<std::string>> rows(1);
    std::string field;
    bool quoted = false, in_quotes = false;
    for (std::size_t i = 0; i < s.size(); ++i) {
        const char c = s[i];
        if (in_quotes) {
            if (c == '"' && i + 1 < s.size() && s[i + 1] == '"') { field += '"'; ++i; }
            else if (c == '"') in_quotes = false;
            else field += c;
        } else if (c == '"' && field.empty() && !quoted) { in_quotes = quoted = true; }
        else if (c == sep) { rows.back().push_back(field); field.clear(); quoted = false; }
        else if (c == '\r' && i + 1 < s.size() && s[i + 1] == '\n') {
            rows.back().push_back(field); field.clear(); quoted = false; rows.emplace_back(); ++i;
        } else field += c;
    }
    if (!field.empty() || !rows.back().empty()) rows.back().push_back(field);
    else rows.pop_back();
    return rows;
}

bool is_number(const std::string& s) {
    if (s.empty()) return false;
    char* end = nullptr;
    std::strtod(s.c_str(), &end);
    return end == s.c_str() + s.size();
}

const char* hostile[] = {
    "=1+1", "+SUM(A1:A3)", "-2+3", "@SUM(1)", "\t=1", "\r=1", "=HYPERLINK(\"http://x.invalid\",\"click\")",
    "  =cmd|' /C calc'!A0", "<script>alert(1)</script>", "a,b;c", "say \"hi\"", "two\nlines", "tab\there", "\x01\x7F",
    "=", "-", "Ω=1", "",
};

// Tested cells as from analyse() for x = (120, 90, 110, 80), equal shares, N = 400. Values from
// R 4.2: chisq.test(x, p = rep(1/4, 4)) gives X2 = 10, (O-E)^2/E = 4 1 1 4, residuals 2 -1 1 -2,
// stdres 2.309401077 -1.154700538 1.154700538 -2.309401077; Holm-adjusted binom.test p-values
// 0.08326845694 0.49686013163 0.49686013163 0.08326845694. Interval ends are placeholders (only
// their writing is tested); the last is NaN, as when Sison-Glaz fails.
Result sample(const std::vector<std::string>& labels) {
    Result r;
    r.n = 400;
    r.tested_categories = labels;
    r.tested_observed = {120, 90, 110, 80};
    r.tested_expected = {100, 100, 100, 100};
    r.contributions = {4, 1, 1, 4};
    const double pres[] = {2, -1, 1, -2}, ares[] = {2.309401077, -1.154700538, 1.154700538, -2.309401077};
    const double padj[] = {0.08326845694, 0.49686013163, 0.49686013163, 0.08326845694};
    const char* dir[] = {"more than expected", "fewer than expected", "more than expected", "fewer than expected"};
    for (int i = 0; i < 4; ++i) {
        CategoryDiagnostic d;
        d.pearson_residual = pres[i];
        d.adjusted_residual = ares[i];
        d.binomial = {padj[i] / 2, std::log10(padj[i] / 2)};
        d.adjusted = {padj[i], std::log10(padj[i])};
        d.direction = dir[i];
        d.sison_glaz = {0.25 + 0.01 * i, 0.5};
        r.diagnostics.categories.push_back(d);
    }
    r.diagnostics.categories[3].sison_glaz = {NAN, NAN};
    r.diagnostics.alpha = 0.05;
    return r;
}

}  // namespace

TEST_CASE("OWASP: text starting with = + - @ tab or CR gets a single quote") {
    CHECK(neutralised_text("=1+1", csv()) == "'=1+1");                  // OWASP: '=' trigger
    CHECK(neutralised_text("+SUM(A1:A3)", csv()) == "'+SUM(A1:A3)");    // OWASP: '+'
    CHECK(neutralised_text("-2+3", csv()) == "'-2+3");                  // OWASP: '-'
    CHECK(neutralised_text("-1.41", csv()) == "'-1.41");                // a label that looks like a number is still text
    CHECK(neutralised_text("@SUM(1)", csv()) == "'@SUM(1)");            // OWASP: '@'
    CHECK(neutralised_text("\t=1", csv()) == "'\t=1");                  // OWASP: tab (0x09); tab needs no quotes in CSV
    CHECK(neutralised_text("\r=1", csv()) == "\"'\r=1\"");              // OWASP: CR (0x0D); RFC 4180: line break -> quoted
    CHECK(neutralised_text("  =1", csv()) == "'  =1");                  // after blanks some programs still see a formula
    CHECK(neutralised_text("1-2", csv()) == "1-2");                     // only the start matters
    CHECK(neutralised_text("Ω=1", csv()) == "Ω=1");
    CHECK(neutralised_text("<script>alert(1)</script>", csv()) == "<script>alert(1)</script>");  // inert in a spreadsheet
    CHECK(neutralised_text("", csv()) == "");
}

TEST_CASE("RFC 4180 quoting, and TSV's flattening") {
    CHECK(neutralised_text("a,b", csv()) == "\"a,b\"");                // RFC 4180 2.6: separator -> quoted
    CHECK(neutralised_text("say \"hi\"", csv()) == "\"say \"\"hi\"\"\"");  // RFC 4180 2.7: quotes doubled
    CHECK(neutralised_text("two\nlines", csv()) == "\"two\nlines\"");  // RFC 4180 2.6: line break -> quoted
    CHECK(neutralised_text("=HYPERLINK(\"u\",\"x\")", csv()) == "\"'=HYPERLINK(\"\"u\"\",\"\"x\"\")\"");
    TableExportOptions semi = csv();
    semi.decimal_comma = true;
    CHECK(table_separator(semi) == ';');
    CHECK(neutralised_text("a;b", semi) == "\"a;b\"");
    CHECK(neutralised_text("a,b", semi) == "a,b");  // a comma is not the separator here
    // TSV cannot hold tabs or line breaks in a cell (IANA text/tab-separated-values): they become spaces.
    CHECK(neutralised_text("tab\there", tsv()) == "tab here");
    CHECK(neutralised_text("two\r\nlines", tsv()) == "two  lines");
    CHECK(neutralised_text("\t=1", tsv()) == "' =1");
    CHECK(neutralised_text("say \"hi\"", tsv()) == "\"say \"\"hi\"\"\"");  // quoted as spreadsheets paste it
    CHECK(neutralised_text("\x01x\x7F", csv()) == " x ");  // other control characters: spaces
}

TEST_CASE("numbers stay numbers") {
    const std::vector<std::vector<TableCell>> rows = {{number_cell(-1.41), text_cell("-1.41"), count_cell(120), number_cell(NAN)}};
    CHECK(write_table(rows, csv()) == "-1.41,'-1.41,120,\r\n");  // only the text cell is prefixed
    TableExportOptions semi = csv();
    semi.decimal_comma = true;
    CHECK(write_table(rows, semi) == "-1,41;'-1.41;120;\r\n");  // labels keep their own '.'
    CHECK(write_table(rows, tsv()) == "-1.41\t'-1.41\t120\t\n");
    CHECK(number_cell(2.309401077).text == "2.3094");   // %.6g, C printf
    CHECK(number_cell(-0.0).text == "0");
    CHECK(probability_cell({0.08326845694, -1.0795}).text == "0.08327");  // 4 significant digits
    // 10^-400.5 = 3.162... x 10^-401: below the double range, written from log10, never as 0.
    CHECK(probability_cell({0.0, -400.5}).text == "3.16e-401");
    CHECK(probability_cell({NAN, NAN}).text == "");
}

TEST_CASE("the category table") {
    const Result r = sample({"A", "=SUM(A1:A9)", "say \"hi\", twice", "two\nlines"});
    const std::string out = category_table(r, csv());
    const auto rows = read_rfc4180(out, ',');
    REQUIRE(rows.size() == 5);
    CHECK(rows[0] == std::vector<std::string>{"Category", "Observed", "Expected", "Observed share", "Expected share",
                                              "Contribution", "Pearson residual", "Adjusted residual", "Category p",
                                              "Adjusted p (Holm)", "Direction", "Sison-Glaz 95% lower", "Sison-Glaz 95% upper"});
    // Row values: R's numbers above, 120/400 = 0.3, 100/400 = 0.25 (closed form), %.6g / %.4g.
    CHECK(rows[1] == std::vector<std::string>{"A", "120", "100", "0.3", "0.25", "4", "2", "2.3094", "0.04163", "0.08327",
                                              "more than expected", "0.25", "0.5"});
    CHECK(rows[2][0] == "'=SUM(A1:A9)");
    CHECK(rows[2][6] == "-1");  // a negative number we wrote: bare
    CHECK(rows[2][7] == "-1.1547");
    CHECK(rows[3][0] == "say \"hi\", twice");
    CHECK(rows[4][0] == "two\nlines");
    CHECK(rows[4][11] == "");  // NaN interval: empty cell
    CHECK(out.substr(0, 9) == "Category,");
    CHECK(out.find("\r\n") == out.find('\n') - 1);  // CRLF records (RFC 4180 2.1)

    TableExportOptions bom = csv();
    bom.byte_order_mark = true;
    CHECK(category_table(r, bom).rfind("\xEF\xBB\xBF" "Category,", 0) == 0);

    TableExportOptions semi = csv();
    semi.decimal_comma = true;
    const auto srows = read_rfc4180(category_table(r, semi), ';');
    REQUIRE(srows.size() == 5);
    CHECK(srows[1][3] == "0,3");
    CHECK(srows[2][7] == "-1,1547");
}

TEST_CASE("hostile labels come out inert in CSV and TSV") {
    for (const char* label : hostile) {
        INFO(label);
        const Result r = sample({label, "B", "C", "D"});
        for (bool comma : {false, true}) {
            TableExportOptions o = csv();
            o.decimal_comma = comma;
            const auto rows = read_rfc4180(category_table(r, o), comma ? ';' : ',');
            REQUIRE(rows.size() == 5);  // no label adds a record...
            for (const auto& row : rows) {
                REQUIRE(row.size() == 13);  // ...or a column
                for (const auto& f : row) {
                    const bool trigger = !f.empty() && std::string("=+-@\t\r").find(f[0]) != std::string::npos;
                    std::string g = f;
                    for (char& c : g) if (comma && c == ',') c = '.';
                    CHECK_MESSAGE((!trigger || is_number(g)), f);  // only our numbers may start with '-'
                }
            }
        }
        const std::string t = category_table(r, tsv());
        std::size_t lines = 0;
        for (char c : t) lines += c == '\n';
        CHECK(lines == 5);
        CHECK(t.find('\r') == std::string::npos);
        const std::string first_cell = t.substr(t.find('\n') + 1, t.find('\t', t.find('\n')) - t.find('\n') - 1);
        CHECK(first_cell.find_first_of("=+-@") != 0);
    }
}

TEST_CASE("a refused result gives the header only") {
    Result r;
    r.status = Status::failure("There are no categories.");
    CHECK(read_rfc4180(category_table(r, csv()), ',').size() == 1);
}
