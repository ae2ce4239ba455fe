// The results block to paste into a report: one sentence in the common APA-like reporting style
// for a chi-square test (statistic symbol(df, N = n) = value, p, effect size with its interval,
// the p-value method), notes on merging and estimated parameters, and the category table, as
// plain text, Markdown or spreadsheet-ready TSV. Wording: "not consistent with" / "no evidence
// against" the stated mix; a test never proves a mix. Numbers are the Result's, rounded for print.
#pragma once
#include "power_divergence.hpp"  // statistic_symbol
#include <string>
#include <vector>

#include "analysis.hpp"
#include "result.hpp"
#include "table_export.hpp"

namespace tallyproof {

enum class WriteupStyle { plain, markdown, tsv };

struct WriteupOptions {
    WriteupStyle style = WriteupStyle::plain;
    bool decimal_comma = false;        // 12,84 and p = ,005; lists separated by ';', thousands by a thin space
    std::string subject = "the counts";  // what was tested, as in "found that the grades were ..."
};

// The one sentence, e.g. "A chi-square goodness-of-fit test found that the grades were not
// consistent with the stated mix, χ²(3, N = 400) = 12.84, p = .005, w = 0.18, 95% CI [0.08, 0.26] (exact)."
std::string writeup_sentence(const Analysis& a, const Result& r, const WriteupOptions& o);
// The whole block in the chosen style: sentence, notes (merging, estimated parameters, small
// expected counts, a p-value method that was refused) and the table of tested categories.
std::string writeup(const Analysis& a, const Result& r, const WriteupOptions& o);
// The write-up's quantities as (name, value) rows: test, statistic symbol and value, df, N, p, the
// p-value method, the design correction, lower-tail p, w with its interval, conclusion, sentence,
// notes. The TSV style begins with them; a workbook's "Numbers" sheet holds them (number cells
// keep the Result's double).
std::vector<std::vector<TableCell>> writeup_quantities(const Analysis& a, const Result& r, const WriteupOptions& o);

}  // namespace tallyproof
