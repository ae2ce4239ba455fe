// The glossary's entries and the search for its terms in a text. The meanings are common practice
// in the trade; Fei (Ben-Shachar et al. 2023) and the power-divergence family (Cressie and Read
// 1984) are the two with a named source, given in docs/methods.md.
#include "glossary.hpp"

#include <algorithm>
#include <cstddef>
#include <utility>

namespace tallyproof {
namespace {

const std::vector<GlossaryEntry> kEntries = {
    {"χ²", "Pearson's chi-square statistic: the sum over categories of (O − E)²/E. It is 0 when the counts match the mix "
           "exactly and grows as they depart from it. χ²(df) is the chi-square distribution it is compared with."},
    {"df", "Degrees of freedom: the number of categories tested, minus 1, minus the parameters estimated from the data "
           "(for a fitted distribution). It picks the chi-square curve the statistic is compared with."},
    {"N", "Sample size: the total of the observed counts."},
    {"k", "The number of categories."},
    {"p", "p-value: if the stated mix were right, the chance of counts departing from it at least as far as these do. A "
          "small p is evidence against the mix; a large p is not evidence for it."},
    {"α", "Significance level (alpha): the p-value below which a departure is called significant, chosen before looking "
          "at the data; 0.05 by common practice."},
    {"O", "Observed count: how many items fell in this category."},
    {"E", "Expected count: how many items the stated mix predicts for this category (N times its expected share)."},
    {"O − E", "Observed minus expected: positive where the category has more items than the mix predicts, negative where "
              "it has fewer."},
    {"χ² share", "This category's part of the statistic, as a percentage of the whole: it shows where the statistic comes "
                 "from. Which categories drive the result is decided by one rule, their Holm-adjusted p below α (◆)."},
    {"Contribution", "This category's term of the statistic, (O − E)²/E for χ²: the terms add up to the statistic and show "
                     "where it comes from. Which categories drive the result is decided by their Holm-adjusted p (◆)."},
    {"Adj. res.", "Adjusted residual: O − E divided by its standard error if the mix were right; the sign gives the direction. "
                  "Taken alone, beyond about ±2 a category is unusual, but with many categories some are by chance: a "
                  "category drives the result only when its Holm-adjusted p is below α (◆), the one rule used everywhere."},
    {"Holm p", "The category's own p-value (this category against all the others together), adjusted by Holm's method "
               "because every category is tested at once. Adjusted p-values are capped at 1, which means no evidence "
               "against this category."},
    {"◆", "Marks a category that drives the result, by the one rule used on the page, in the write-up and by the "
          "command-line tool: its Holm-adjusted p (this category against all the others) is below α."},
    {"G²", "Likelihood ratio G², 2 Σ O ln(O/E): an alternative to χ² (λ = 0 in the power-divergence family), "
           "compared with the same chi-square distribution."},
    {"T²", "Freeman-Tukey T², 4 Σ (√O − √E)²: λ = −1/2 in the power-divergence family."},
    {"GM²", "Modified likelihood ratio GM², 2 Σ E ln(E/O): λ = −1 in the power-divergence family."},
    {"NM²", "Neyman NM², Σ (O − E)²/O (Neyman's modified chi-square): λ = −2 in the power-divergence family."},
    {"CR", "Cressie-Read CR: the power-divergence statistic at the chosen λ (Cressie and Read recommend λ = 2/3)."},
    {"λ", "Lambda picks one statistic of the power-divergence family: λ = 1 is Pearson χ², 0 the likelihood ratio G², "
          "2/3 Cressie-Read CR, −1/2 Freeman-Tukey T², −1 the modified likelihood ratio GM², −2 Neyman NM². All of them are compared with the same chi-square distribution."},
    {"w", "Effect size w: how far the true mix seems to lie from the stated one, on Cohen's scale (0.1 small, 0.3 medium, "
          "0.5 large). It is estimated from the noncentrality, √(max(0, χ² − df)/N), so counts that fit as well as "
          "chance allows give 0."},
    {"Cohen's w", "√(χ²/N), w as Cohen defined it. It is biased upwards by about df/N: counts drawn from the stated mix "
                  "itself still give about √(df/N)."},
    {"w0", "Conformity margin: the largest departure, on the w scale, that still counts as conforming. Take it from the "
           "contract or the local rule; 0.1 is Cohen's small effect. It can be given as percentage points instead (pp)."},
    {"pp", "Percentage points: a conformity margin as the largest shift of share between two categories (from one to the "
           "other) that still counts as conforming. w0 = d √(1/p₁ + 1/p₂), with d the shift as a fraction and p₁, p₂ the "
           "two smallest expected shares (a shift between them moves w the most)."},
    {"CI", "Confidence interval: the values of the effect size compatible with the data at the stated confidence (95%)."},
    {"Fei", "Fei: w rescaled to run from 0 to 1 for these expected shares. 0 when the counts match the mix exactly, 1 "
            "when every item falls in the category the mix expects least."},
    {"noncentrality", "How far the chi-square distribution moves when the mix departs by w: N·w². A test's power and the "
                      "conformity test come from the chi-square distribution with this noncentrality."},
    {"MAD", "Mean absolute deviation: the average gap between the observed and the expected digit shares, compared with "
            "published conformity bands (Nigrini). Unlike χ², it does not grow with N."},
    {"q", "q-value: a group's p-value adjusted for screening many groups at once. Flagging the groups with q below the "
          "chosen level keeps the false discovery rate at that level."},
    {"BH", "Benjamini-Hochberg: the method that turns the p-values of many groups into q-values that control the false "
           "discovery rate."},
    {"FDR", "False discovery rate: the expected share, among the flagged groups, of groups flagged by chance alone."},
    {"asymptotic", "The p-value from the chi-square curve: a large-sample approximation, trusted when the expected counts "
                   "are not too small (see the validity note)."},
    {"Cochran's rule", "No expected count below 1 and at most 20% of them below 5: the usual rule of thumb under which "
                       "the asymptotic p-value is trusted."},
    {"Monte Carlo", "A p-value by simulation: many samples of the same N are drawn from the stated mix, and p is the share "
                    "of them at least as extreme as the observed counts."},
    {"replicates", "The simulated samples drawn for a Monte Carlo p-value; more replicates give a smaller standard error."},
    {"seed", "The starting number of the random generator: the same seed gives the same Monte Carlo p-value again."},
    {"by statistic", "For an exact or Monte Carlo p-value: an outcome counts as at least as extreme when its statistic is "
                     "at least the observed one (the usual choice)."},
    {"by probability", "For an exact or Monte Carlo p-value: an outcome counts as at least as extreme when it is no more "
                       "probable than the observed counts (the exact multinomial test in its classical form)."},
    {"lower-tail p", "The chance of counts fitting the mix at least as closely as these do. A very small value means a fit "
                     "closer than chance usually allows, a reason to ask how the data were recorded."},
    {"TSV", "Tab-separated values: text that pastes into a spreadsheet as rows and columns."},
    {"CSV", "Comma-separated values: a spreadsheet saved as plain text."},
    {"JSON", "A plain-text data format: the analysis file, which reopens the same analysis in Tallyproof."},
    {"PNG", "An image file of the chart, for a slide or a document."},
    {"PDF", "A document file that prints the same everywhere; the browser's print dialog saves one."},
    {"δ̄", "Mean design effect of survey data: how many times larger the shares' variance is under the survey's design "
           "(weights, strata, clusters) than in a simple random sample of the same size, averaged over the directions the "
           "test looks in (Rao and Scott). The corrected test divides χ² by it."},
    {"a²", "The squared coefficient of variation of the design effects: how unequal they are. The second-order (Satterthwaite) "
           "correction divides χ² by δ̄(1 + a²) and the df by (1 + a²)."},
    {"PSU", "Primary sampling unit: the cluster drawn first in a survey (a school, a store, a village), within which "
            "respondents were then sampled. Respondents of one PSU tend to answer alike."},
    {"F", "The F statistic of the design-corrected test: the corrected χ² divided by its df, compared with the F "
          "distribution whose second df comes from the number of PSUs less the number of strata."},
    {"CV²", "Squared coefficient of variation: the variance of values divided by the square of their mean. Kish's design "
            "effect of unequal weights is 1 + CV² of the weights."},
    {"effective n", "The sample size a simple random sample would need to give the same precision as the survey: n divided "
                    "by the mean design effect."},
    {"design effect", "A category's design effect: the variance of its share under the survey's design divided by the "
                      "variance a simple random sample of the same size would give (Kish)."},
};

// Other spellings of a term in the report and the tables: explained by the same entry.
const std::vector<std::pair<std::string_view, std::string_view>> kAliases = {
    {"Adj. residual", "Adj. res."},       {"Adjusted residual", "Adj. res."}, {"adjusted residual", "Adj. res."},
    {"Lower-tail p", "lower-tail p"},     {"Asymptotic p", "asymptotic"},     {"Holm-adjusted p", "Holm p"},
    {"Cohen's w before the correction", "Cohen's w"},
    {"Design effects", "design effect"}, {"Overall design effect", "design effect"}, {"Mean design effect δ̄", "δ̄"},
};

bool word_byte(unsigned char c) { return (c >= '0' && c <= '9') || (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z') || c == '_'; }

// The term starts at `at` in `text` and stands on its own there.
bool stands_at(std::string_view text, std::size_t at, std::string_view term) {
    if (text.compare(at, term.size(), term) != 0) return false;
    const bool open_before = at == 0 || !word_byte(static_cast<unsigned char>(text[at - 1])) || !word_byte(static_cast<unsigned char>(term.front()));
    const std::size_t end = at + term.size();
    const bool open_after = end >= text.size() || !word_byte(static_cast<unsigned char>(text[end])) || !word_byte(static_cast<unsigned char>(term.back()));
    // "p-value" and "p-values" are p; "w0" is not w ("0" is a word byte); "E" in "E." still is E.
    return open_before && open_after;
}

std::string markdown_cell(std::string_view s) {
    std::string out;
    for (char c : s) {
        if (c == '|') out += "\\|";
        else out += c;
    }
    return out;
}

}  // namespace

const std::vector<GlossaryEntry>& glossary() { return kEntries; }

const GlossaryEntry* glossary_entry(std::string_view term) {
    for (const auto& e : kEntries)
        if (e.term == term) return &e;
    return nullptr;
}

std::vector<const GlossaryEntry*> glossary_terms_in(std::string_view text) {
    struct Spelling { std::string_view text; const GlossaryEntry* entry; };
    static const std::vector<Spelling> longest_first = [] {
        std::vector<Spelling> v;
        for (const auto& e : kEntries) v.push_back({e.term, &e});
        for (const auto& [alias, term] : kAliases) v.push_back({alias, glossary_entry(term)});
        std::stable_sort(v.begin(), v.end(), [](const Spelling& a, const Spelling& b) { return a.text.size() > b.text.size(); });
        return v;
    }();
    std::vector<const GlossaryEntry*> found;
    for (std::size_t at = 0; at < text.size();) {
        const Spelling* hit = nullptr;
        for (const Spelling& sp : longest_first)
            if (sp.entry && stands_at(text, at, sp.text)) { hit = &sp; break; }
        if (!hit) { ++at; continue; }
        if (std::find(found.begin(), found.end(), hit->entry) == found.end()) found.push_back(hit->entry);
        at += hit->text.size();
    }
    return found;
}

std::string glossary_notes(std::string_view text, bool brief) {
    std::string out;
    for (const GlossaryEntry* e : glossary_terms_in(text)) {
        if (!out.empty()) out += '\n';
        std::string_view meaning = e->meaning;
        if (brief)  // up to the first full stop that ends a sentence (". " or the end), not "e.g."
            for (std::size_t at = meaning.find(". "); at != std::string_view::npos; at = meaning.find(". ", at + 1))
                if (at > 3 && meaning.substr(at - 3, 3) != "e.g") { meaning = meaning.substr(0, at + 1); break; }
        out.append(e->term).append(": ").append(meaning);
    }
    return out;
}

std::string glossary_markdown() {
    std::string s = "| Shown as | Meaning |\n|---|---|\n";
    for (const auto& e : kEntries) s.append("| ").append(markdown_cell(e.term)).append(" | ").append(markdown_cell(e.meaning)).append(" |\n");
    return s;
}

}  // namespace tallyproof
