// The glossary: every abbreviation and symbol the page, the report and the write-up show, with its
// meaning in words. Both views and the print layout take their explanations from here (the canvas
// as hover and tap tooltips, the form view as accessible descriptions and a list, print as a
// footnote); docs/glossary.md is `tallyproof --glossary`. Notation, stated once: χ² is the value
// of Pearson's statistic and χ²(df) the chi-square distribution it is referred to. The meanings
// are common practice; the two sources that are not (Fei, the Cressie-Read family) are named in
// docs/methods.md.
#pragma once
#include <string>
#include <string_view>
#include <vector>

namespace tallyproof {

struct GlossaryEntry {
    std::string_view term;     // as shown: "O", "Adj. res.", "χ²", "df", "Fei"
    std::string_view meaning;  // one or two sentences in plain words
};

// Every entry, in the order docs/glossary.md lists them.
const std::vector<GlossaryEntry>& glossary();

// The entry whose term is exactly `term`, or nullptr.
const GlossaryEntry* glossary_entry(std::string_view term);

// The glossary terms that occur in `text`, each once, in order of first appearance. A term counts
// where it stands on its own (not inside a longer word: the "E" of "Every" is not a term), and
// the longest term wins where two start at the same place ("O − E" over "O", "w0" over "w").
std::vector<const GlossaryEntry*> glossary_terms_in(std::string_view text);

// "term: meaning" lines, one per term found in `text`; empty when there is none. `brief`: each
// meaning's first sentence only (the print layout's footnote).
std::string glossary_notes(std::string_view text, bool brief = false);

// The whole glossary as a Markdown table (docs/glossary.md).
std::string glossary_markdown();

}  // namespace tallyproof
