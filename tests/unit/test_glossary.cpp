// The glossary: its search for terms in a text, and that every abbreviation and symbol the report
// and the write-up print for a wide range of analyses has an entry. The abbreviation detector here
// is written independently of the glossary (Greek letters, superscripts, short capitals, single
// letters, "df"), so a new symbol printed without an entry fails this test. The meanings
// themselves are common practice (no source); they are read by people, not checked here.
#include <doctest/doctest.h>

#include <set>
#include <string>
#include <vector>

#include "glossary.hpp"
#include "pvalue_job.hpp"
#include "report.hpp"
#include "writeup.hpp"

using namespace tallyproof;

namespace {

std::vector<std::string> terms(const std::string& text) {
    std::vector<std::string> out;
    for (const GlossaryEntry* e : glossary_terms_in(text)) out.emplace_back(e->term);
    return out;
}

bool ascii_letter(char c) { return (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z'); }

// Tokens of `text` that a newcomer would read as an abbreviation or a symbol.
std::set<std::string> abbreviations(const std::string& text) {
    std::set<std::string> out;
    static const char* symbols[] = {"χ²", "G²", "T²", "GM²", "NM²", "λ", "α", "◆", "w0"};
    for (const char* s : symbols)
        if (text.find(s) != std::string::npos) out.insert(s);
    std::size_t i = 0;
    while (i < text.size()) {
        if (!ascii_letter(text[i])) { ++i; continue; }
        std::size_t j = i;
        while (j < text.size() && (ascii_letter(text[j]) || (text[j] >= '0' && text[j] <= '9'))) ++j;
        const std::string word = text.substr(i, j - i);
        const bool after_apostrophe = i > 0 && text[i - 1] == '\'';  // the "s" of "Cohen's"
        bool capitals = word.size() >= 2 && word.size() <= 5;
        for (char c : word) capitals = capitals && c >= 'A' && c <= 'Z';
        const bool single = word.size() == 1 && word != "a" && word != "A" && word != "I" && !after_apostrophe;
        if (capitals || single || word == "df" || word == "Fei") out.insert(word);
        i = j;
    }
    return out;
}

Analysis counts(std::vector<double> observed) {
    Analysis a;
    for (std::size_t i = 0; i < observed.size(); ++i) a.categories.push_back("Category " + std::to_string(i + 1));
    a.observed = std::move(observed);
    return a;
}

}  // namespace

TEST_CASE("glossary: terms are found where they stand on their own, the longest first") {
    CHECK(terms("O − E is the gap") == std::vector<std::string>{"O − E"});
    CHECK(terms("Every Expected Observation") .empty());  // the E of "Every" is no term
    CHECK(terms("w0 = 0.1 and w = 0.2") == std::vector<std::string>{"w0", "w"});
    CHECK(terms("the p-value, p = .04") == std::vector<std::string>{"p"});
    CHECK(terms("χ²(3, N = 100)") == std::vector<std::string>{"χ²", "N"});
    CHECK(terms("χ² share and χ²") == std::vector<std::string>{"χ² share", "χ²"});
    CHECK(terms("Cohen's w") == std::vector<std::string>{"Cohen's w"});
    CHECK(terms("GM² and G²") == std::vector<std::string>{"GM²", "G²"});
    // Other spellings in the report and the tables are explained by the same entry.
    CHECK(terms("Category  Observed  Contribution  Adj. residual") == std::vector<std::string>{"Contribution", "Adj. res."});
    CHECK(terms("Lower-tail p (a fit closer than chance allows?)") == std::vector<std::string>{"lower-tail p"});
    CHECK(glossary_notes("nothing to explain here").empty());
    CHECK(glossary_notes("df = 3").rfind("df: Degrees of freedom", 0) == 0);
    CHECK(glossary_notes("p = .04", true) == "p: p-value: if the stated mix were right, the chance of counts departing from it at least as far as these do.");
}

TEST_CASE("glossary: one entry per term, each with a meaning, and a Markdown table of them all") {
    std::set<std::string> seen;
    for (const auto& e : glossary()) {
        CHECK_MESSAGE(seen.insert(std::string(e.term)).second, "twice: " << e.term);
        CHECK(e.meaning.size() > 20);
        CHECK(glossary_entry(e.term) == &e);
    }
    const std::string md = glossary_markdown();
    for (const auto& e : glossary()) CHECK(md.find("| " + std::string(e.term) + " |") != std::string::npos);
    CHECK(glossary_entry("no such term") == nullptr);
}

TEST_CASE("glossary: every abbreviation in the report and the write-up of many analyses has an entry") {
    std::vector<Analysis> cases;
    cases.push_back(counts({30, 20, 10, 40}));                       // equal shares, rejected
    Analysis g = counts({12, 18, 9, 11});
    g.statistic.lambda = 0;                                          // G²
    cases.push_back(g);
    for (double lambda : {2.0 / 3.0, -0.5, -1.0, -2.0}) {           // CR, T², GM², NM² (no zero counts)
        Analysis c = counts({12, 18, 9, 11});
        c.statistic.lambda = lambda;
        cases.push_back(c);
    }
    Analysis mc = counts({3, 1, 0, 6, 2});
    mc.pvalue.method = PValueMethod::monte_carlo;
    mc.pvalue.replicates = 2000;
    cases.push_back(mc);
    Analysis ex = counts({3, 1, 0, 6, 2});
    ex.pvalue.method = PValueMethod::exact;
    ex.pvalue.ordering = ExactOrdering::probability;
    cases.push_back(ex);
    Analysis conform = counts({330, 352, 338});
    conform.conformity.requested = true;
    conform.conformity.margin_w = 0.1;
    cases.push_back(conform);
    Analysis shares = counts({50, 30, 20});
    shares.model.kind = ModelKind::shares;
    shares.model.values = {0.6, 0.3, 0.1};                           // Fei is shown for unequal shares
    shares.plan.requested = true;
    cases.push_back(shares);
    Analysis poisson = counts({20, 35, 25, 12, 8});
    poisson.categories = {"0", "1", "2", "3", "4 or more"};
    poisson.ordered = true;
    poisson.model.kind = ModelKind::poisson;
    cases.push_back(poisson);
    Analysis benford = counts({30, 18, 12, 10, 8, 7, 6, 5, 4});
    benford.categories = {"1", "2", "3", "4", "5", "6", "7", "8", "9"};
    benford.model.kind = ModelKind::benford_first;
    cases.push_back(benford);
    Analysis previous = counts({150, 420, 190, 40});
    previous.model.kind = ModelKind::reference_sample;
    previous.model.values = {140, 390, 230, 40};
    cases.push_back(previous);
    Analysis thin = counts({4, 1, 2, 9, 1, 3, 12, 8});
    thin.merge.rule = MergeRule::all_at_least_5;
    cases.push_back(thin);
    // Survey data with weights, strata and clusters (the design-corrected test), and a crude correction.
    Analysis survey = counts({0, 0, 0});
    survey.design.requested = true;
    SurveySample& s = survey.design.sample;
    s.categories = survey.categories;
    s.strata = {"North", "South"};
    s.clusters = {"1", "2", "3", "4"};
    for (std::size_t i = 0; i < 24; ++i) {
        s.category.push_back((i * 7 + i / 5) % 3);
        s.weight.push_back(1.0 + static_cast<double>(i % 4));
        s.cluster.push_back(i % 4);
        s.stratum.push_back(i % 4 < 2 ? 0 : 1);
        survey.observed[s.category.back()] += 1;  // the respondents per category
    }
    cases.push_back(survey);
    Analysis crude = counts({50, 30, 20});
    crude.design.requested = true;
    crude.design.overall_design_effect = 1.8;
    cases.push_back(crude);

    // The detector itself finds what a newcomer would stop at (and not the "s" of "Cohen's").
    CHECK(abbreviations("df = 3, N = 5; χ² share of Cohen's w, as TSV, Fei 0.2 and a p") ==
          std::set<std::string>{"df", "N", "χ²", "w", "TSV", "Fei", "p"});
    CHECK(abbreviations("Report (G² with λ = 0), BH q-values").count("q") == 1);
    for (const Analysis& a : cases) {
        const Result r = analyse_completely(a);
        REQUIRE_MESSAGE(r.status.ok, r.status.message);
        for (WriteupStyle style : {WriteupStyle::plain, WriteupStyle::markdown, WriteupStyle::tsv}) {
            WriteupOptions o;
            o.style = style;
            std::string text = report_text(a, r) + "\n" + writeup(a, r, o);
            for (const std::string& c : r.tested_categories) {  // the user's own labels are not ours to explain
                for (std::size_t at; (at = text.find(c)) != std::string::npos;) text.replace(at, c.size(), " ");
            }
            std::set<std::string> explained;
            for (const std::string& t : terms(text)) explained.insert(t);
            for (const std::string& token : abbreviations(text)) {
                bool covered = explained.count(token) > 0;
                for (const std::string& t : explained) covered = covered || t.find(token) != std::string::npos;
                CHECK_MESSAGE(covered, "\"" << token << "\" has no glossary entry; it appears in:\n" << text);
            }
        }
    }
}
