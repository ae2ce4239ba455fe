// Screening many groups: per-group statistics and p against SciPy chisquare, q-values against
// statsmodels multipletests and R p.adjust, against-the-rest against SciPy chi2_contingency
// (tests/reference/group_screen.csv, made by tests/reference/generate_group_screen.py); the
// grouped-table readers (long, wide, raw) and their refusals; thin groups and drivers.
#include <doctest/doctest.h>

#include "reference_csv.hpp"

#include <cmath>
#include <map>

#include "analysis_document.hpp"
#include "goodness_of_fit.hpp"
#include "screen_groups.hpp"
#include "grouped_table.hpp"
#include "pvalue_job.hpp"
#include "screen_document.hpp"
#include "screen_report.hpp"

using namespace tallyproof;

namespace {

bool near_rel(double a, double b, double rel) { return std::fabs(a - b) <= rel * std::fabs(b); }

struct RefGroup {
    std::string name;
    std::vector<double> counts, shares;
    double statistic, df, p, bh_sm, holm_sm, bh_r, holm_r;
};

}  // namespace

TEST_CASE("screen against SciPy chisquare / chi2_contingency, statsmodels multipletests and R p.adjust") {
    std::map<std::pair<std::string, std::string>, std::vector<RefGroup>> cases;
    for (const auto& f : tallyproof_test::reference_rows("group_screen.csv")) {
        REQUIRE(f.size() == 12);
        cases[{f[0], f[1]}].push_back(RefGroup{f[2], tallyproof_test::split_numbers(f[3]), tallyproof_test::split_numbers(f[4]),
                                               std::stod(f[5]), std::stod(f[6]), std::stod(f[7]), std::stod(f[8]),
                                               std::stod(f[9]), std::stod(f[10]), std::stod(f[11])});
    }
    REQUIRE(cases.size() == 6);
    std::size_t checked = 0;
    for (const auto& [key, rows] : cases) {
        CAPTURE(key.first);
        CAPTURE(key.second);
        GroupedCounts counts;
        for (std::size_t i = 0; i < rows[0].counts.size(); ++i) counts.categories.push_back("C" + std::to_string(i + 1));
        for (const auto& r : rows) {
            counts.groups.push_back(r.name);
            counts.group_lines.push_back(0);
            counts.counts.insert(counts.counts.end(), r.counts.begin(), r.counts.end());
        }
        Analysis base;
        base.model.kind = ModelKind::shares;
        base.model.values = rows[0].shares;
        for (MultiplicityMethod m : {MultiplicityMethod::benjamini_hochberg, MultiplicityMethod::holm}) {
            ScreenChoice choice;
            choice.against = key.second == "rest" ? ScreenAgainst::rest : ScreenAgainst::model;
            choice.adjust = m;
            const ScreenResult s = screen_groups(base, counts, choice);
            REQUIRE(s.status.ok);
            REQUIRE(s.groups.size() == rows.size());
            for (std::size_t g = 0; g < rows.size(); ++g) {
                CAPTURE(rows[g].name);
                const GroupRow& row = s.groups[g];
                REQUIRE(row.tested);
                CHECK(near_rel(row.statistic, rows[g].statistic, 1e-12));  // SciPy 1.10
                CHECK(row.df == rows[g].df);
                CHECK(near_rel(row.p.p, rows[g].p, 1e-10));                // SciPy 1.10 (chi2.sf)
                const bool bh = m == MultiplicityMethod::benjamini_hochberg;
                CHECK(near_rel(row.q.p, bh ? rows[g].bh_sm : rows[g].holm_sm, 1e-10));  // statsmodels 0.13
                CHECK(near_rel(row.q.p, bh ? rows[g].bh_r : rows[g].holm_r, 1e-10));    // R 4.2 p.adjust
                CHECK(row.flagged == (row.q.p <= 0.05));
                ++checked;
            }
        }
    }
    CHECK(checked == 2 * 2 * (12 + 20 + 30));
}

TEST_CASE("the quick per-group test gives the single analysis's numbers") {
    // Counts of no source: any fixed counts do, the check is screen == analyse().
    GroupedCounts counts;
    counts.categories = {"1", "2", "3", "4", "5", "6", "7", "8", "9"};
    const std::vector<std::vector<double>> rows = {{30, 18, 12, 10, 8, 7, 6, 5, 4}, {20, 20, 20, 10, 10, 5, 5, 5, 5},
                                                   {60, 35, 25, 19, 16, 13, 11, 10, 9}, {9, 9, 9, 9, 9, 9, 9, 9, 9}};
    for (std::size_t g = 0; g < rows.size(); ++g) {
        counts.groups.push_back("supplier " + std::to_string(g));
        counts.counts.insert(counts.counts.end(), rows[g].begin(), rows[g].end());
    }
    Analysis base;
    base.model.kind = ModelKind::benford_first;
    for (double lambda : {1.0, 0.0, 2.0 / 3.0}) {
        base.statistic.lambda = lambda;
        const ScreenResult s = screen_groups(base, counts, ScreenChoice{});
        REQUIRE(s.status.ok);
        for (std::size_t g = 0; g < rows.size(); ++g) {
            Analysis a = base;
            a.categories = counts.categories;
            a.observed = rows[g];
            const Result r = analyse_completely(a);
            REQUIRE(r.status.ok);
            CHECK(s.groups[g].statistic == r.statistic);
            CHECK(s.groups[g].df == r.df);
            CHECK(s.groups[g].w == r.effect.estimate);  // the chance-corrected w a single analysis reports
            CHECK(s.groups[g].cohen_w == r.effect.w);
            CHECK(s.groups[g].mad == r.digits.mad);
            CHECK(s.groups[g].band == r.digits.band);
            CHECK(s.groups[g].thin == !r.validity.cochran_holds);
            if (!s.groups[g].thin) CHECK(s.groups[g].p.log10_p == r.upper.log10_p);
        }
    }
}

TEST_CASE("a thin group gets an exact p-value, never a silent asymptotic one") {
    GroupedCounts counts;
    counts.categories = {"A", "B", "C"};
    counts.groups = {"big", "thin"};
    counts.counts = {40, 35, 45, 4, 0, 1};
    Analysis base;  // equal shares
    const ScreenResult s = screen_groups(base, counts, ScreenChoice{});
    REQUIRE(s.status.ok);
    CHECK_FALSE(s.groups[0].thin);
    REQUIRE(s.groups[1].thin);
    CHECK(s.groups[1].method == PValueMethod::exact);
    CHECK(s.thin == 1);
    // The exact multinomial p of (4, 0, 1) under equal shares, as the single analysis gives it.
    Analysis a;
    a.categories = counts.categories;
    a.observed = {4, 0, 1};
    a.pvalue.method = PValueMethod::exact;
    const Result r = analyse_completely(a);
    CHECK(s.groups[1].p.p == r.p.p);
    CHECK(s.groups[1].note.find("exact") != std::string::npos);
}

TEST_CASE("flagged groups name their drivers; a group of zero total is listed, not tested") {
    GroupedCounts counts;
    counts.categories = {"0", "1", "2", "3", "4", "5", "6", "7", "8", "9"};
    counts.groups = {"R1", "R2", "R3", "R4"};
    counts.counts = {10, 11, 9, 10, 10, 10, 11, 9, 10, 10,  //
                     40, 5, 5, 5, 5, 40, 5, 5, 5, 5,        //
                     0, 0, 0, 0, 0, 0, 0, 0, 0, 0,          //
                     12, 9, 10, 11, 8, 10, 10, 9, 11, 10};
    counts.group_lines = {2, 12, 22, 32};
    Analysis base;
    base.model.kind = ModelKind::last_digit;
    const ScreenResult s = screen_groups(base, counts, ScreenChoice{});
    REQUIRE(s.status.ok);
    CHECK(s.tested == 3);
    CHECK(s.flagged == 1);
    CHECK(s.groups[1].flagged);
    REQUIRE(s.groups[1].drivers.size() >= 2);
    CHECK(s.groups[1].drivers[0].category == "0");
    CHECK(s.groups[1].drivers[0].direction == "more than expected");
    CHECK_FALSE(s.groups[2].tested);
    REQUIRE(!s.notes.empty());
    CHECK(s.notes[0].find("\"R3\" (line 22)") != std::string::npos);
    const std::string summary = screen_summary(s);
    CHECK(summary.find("1 of 4 groups departs from") != std::string::npos);
    CHECK(summary.find("false discovery rate of 5% (1 not tested): R2 (q = ") != std::string::npos);
    // The printed page: the summary, the flagged group with its drivers, and no unflagged group listed.
    const std::string page = screen_print_text(s);
    CHECK(page.find(summary) != std::string::npos);
    CHECK(page.find("Flagged groups, smallest q first:\n  R2: N = 120") != std::string::npos);
    CHECK(page.find("; driven by 0: more than expected") != std::string::npos);
    CHECK(page.find("  R1:") == std::string::npos);
    CHECK(page.find("more flagged groups") == std::string::npos);
    CHECK(screen_print_text(s, 0).find("... and 1 more flagged groups") != std::string::npos);
    // Against the rest: the same flagged group, with drivers from the adjusted residuals.
    ScreenChoice rest;
    rest.against = ScreenAgainst::rest;
    const ScreenResult r = screen_groups(base, counts, rest);
    REQUIRE(r.status.ok);
    CHECK(r.groups[1].flagged);
    CHECK_FALSE(r.groups[1].drivers.empty());
    CHECK(r.groups[1].df == 9);
}

TEST_CASE("a fitted model is fitted to each group on its own") {
    GroupedCounts counts;
    counts.categories = {"0", "1", "2", "3"};
    counts.groups = {"A", "B"};
    counts.counts = {50, 30, 15, 5, 20, 40, 30, 10};
    Analysis base;
    base.model.kind = ModelKind::poisson;
    base.ordered = true;
    const ScreenResult s = screen_groups(base, counts, ScreenChoice{});
    REQUIRE(s.status.ok);
    CHECK(s.model_description == "Poisson (parameters estimated per group)");
    Analysis b = base;
    b.categories = counts.categories;
    b.observed = {20, 40, 30, 10};
    const Result r = analyse(b);  // B alone: its own mean, df = 4 - 1 - 1
    REQUIRE(r.status.ok);
    CHECK(s.groups[1].statistic == r.statistic);
    CHECK(s.groups[1].df == 2);
}

TEST_CASE("long, wide and raw tables with a group column give the same counts") {
    const std::string long_text = "reader,digit,count\nAnn,0,3\nAnn,1,1\nBob,0,2\nBob,1,4\nCy,1,5\n";
    const std::string wide_text = "reader\t0\t1\nAnn\t3\t1\nBob\t2\t4\nCy\t0\t5\n";
    const std::string raw_text = "reader;digit\nAnn;0\nAnn;0\nBob;1\nAnn;1\nAnn;0\nBob;0\nBob;1\nBob;0\nBob;1\nBob;1\n"
                                 "Cy;1\nCy;1\nCy;1\nCy;1\nCy;1\n";
    const std::vector<double> want = {3, 1, 2, 4, 0, 5};
    GroupReadOptions by;
    by.by = "reader";
    const GroupedCounts l = read_grouped_text(long_text, by), w = read_grouped_text(wide_text, by), r = read_grouped_text(raw_text, by);
    REQUIRE(l.status.ok);
    REQUIRE(w.status.ok);
    REQUIRE(r.status.ok);
    CHECK(l.shape == GroupShape::long_table);
    CHECK(w.shape == GroupShape::wide_table);
    CHECK(r.shape == GroupShape::raw_values);
    for (const GroupedCounts* g : {&l, &w, &r}) {
        CHECK(g->groups == std::vector<std::string>{"Ann", "Bob", "Cy"});
        CHECK(g->categories == std::vector<std::string>{"0", "1"});
        CHECK(g->counts == want);
    }
    bool said_zero = false;
    for (const auto& n : l.notes) said_zero = said_zero || n.find("1 combinations of group and category do not appear") != std::string::npos;
    CHECK(said_zero);
    // The note names the first missing combination: Cy (first on line 6) has no row for "0".
    bool named = false;
    for (const auto& n : l.notes) named = named || n.find("group \"Cy\", first on line 6, has no row for category \"0\"") != std::string::npos;
    CHECK(named);
    // Detected without --by: column 1, as the notes say.
    const GroupedCounts d = read_grouped_text(long_text);
    REQUIRE(d.status.ok);
    CHECK(d.group_column == 1);
    CHECK(d.notes[0].find("detected") != std::string::npos);
    // The group column by number: column 2 holds the groups here.
    GroupReadOptions second;
    second.by = "2";
    const GroupedCounts n = read_grouped_text("A\tAnn\t3\nB\tAnn\t1\nA\tBob\t2\nB\tBob\t4\n", second);
    REQUIRE(n.status.ok);
    CHECK(n.groups == std::vector<std::string>{"Ann", "Bob"});
    CHECK(n.counts == std::vector<double>{3, 1, 2, 4});
    // Raw digits per group: the last digit of each value.
    GroupReadOptions digits;
    digits.parse.digits = DigitTest::first;
    const GroupedCounts fd = read_grouped_text("Ann\t123\nAnn\t45\nBob\t19\nBob\t2000\nBob\t9.5\n", digits);
    REQUIRE(fd.status.ok);
    CHECK(fd.categories.size() == 9);
    CHECK(fd.count(0, 0) == 1);  // Ann: 1
    CHECK(fd.count(0, 3) == 1);  // Ann: 4
    CHECK(fd.count(1, 0) == 1);  // Bob: 1
    CHECK(fd.count(1, 1) == 1);  // Bob: 2
    CHECK(fd.count(1, 8) == 1);  // Bob: 9
}

TEST_CASE("grouped tables: refusals name the line and the group") {
    GroupedCounts g = read_grouped_text("Ann\tA\t3\nAnn\tB\t1\n\tB\t1\nBob\tA\t2\n");
    CHECK_FALSE(g.status.ok);
    CHECK(g.status.line == 3);
    CHECK(g.status.message.find("group cell is empty") != std::string::npos);
    GroupReadOptions third;  // the group column missing from a short row, not merely empty
    third.by = "3";
    g = read_grouped_text("A\t3\tAnn\nB\t1\tAnn\nA\t2\nB\t4\tBob\n", third);
    CHECK_FALSE(g.status.ok);
    CHECK(g.status.line == 3);
    CHECK(g.status.column == 3);
    CHECK(g.status.message.find("the row has only 2 cells, so the group column (3) is missing") != std::string::npos);
    g = read_grouped_text("Ann\tA\t3\nAnn\tB\t1\n");
    CHECK_FALSE(g.status.ok);
    CHECK(g.status.message.find("Only one group (\"Ann\")") != std::string::npos);
    g = read_grouped_text("Ann\tA\t3\nBob\tA\tmany\nBob\tB\t1\n");
    CHECK_FALSE(g.status.ok);
    CHECK(g.status.line == 2);
    CHECK(g.status.message.find("\"many\" is not a count") != std::string::npos);
    g = read_grouped_text("who\tA\tB\nAnn\t1\t2\nBob\t3\t4\nAnn\t5\t6\n");  // a repeated group: read as a long table
    CHECK(g.shape == GroupShape::long_table);
    GroupReadOptions wide;
    wide.shape = GroupShape::wide_table;
    g = read_grouped_text("who\tA\tB\nAnn\t1\t2\nBob\t3\t4\nAnn\t5\t6\n", wide);
    CHECK_FALSE(g.status.ok);
    CHECK(g.status.line == 4);
    CHECK(g.status.message.find("appears again (first on line 2)") != std::string::npos);
    GroupReadOptions by;
    by.by = "supplier";
    g = read_grouped_text("reader\tdigit\tcount\nAnn\t0\t1\nBob\t0\t2\n", by);
    CHECK_FALSE(g.status.ok);
    CHECK(g.status.message.find("No column is named \"supplier\"") != std::string::npos);
    by.by = "7";
    g = read_grouped_text("reader\tdigit\tcount\nAnn\t0\t1\nBob\t0\t2\n", by);
    CHECK_FALSE(g.status.ok);
    CHECK(g.status.message.find("has 3 columns") != std::string::npos);
    // A long table whose groups each have one line is still long: text beside the group names.
    g = read_grouped_text("g;c;n\na;x;1\nb;y;2\n");
    CHECK(g.shape == GroupShape::long_table);
    // Raw values: a refused value is named by its line and column in the pasted table.
    GroupReadOptions bins;
    bins.parse.bins.kind = BinChoice::Kind::edges;
    bins.parse.bins.edges = {0, 20, 40};
    g = read_grouped_text("g\tv\na\t12\na\tabc\nb\t15\nb\t33\n", bins);
    CHECK_FALSE(g.status.ok);
    CHECK(g.status.line == 3);
    CHECK(g.status.column == 2);
    CHECK(g.status.message.rfind("Line 3, column 2: \"abc\"", 0) == 0);
    ScreenChoice bad;
    bad.q = 1.5;
    GroupedCounts two = read_grouped_text("Ann\tA\t3\nAnn\tB\t1\nBob\tA\t2\nBob\tB\t2\n");
    REQUIRE(two.status.ok);
    CHECK_FALSE(screen_groups(Analysis{}, two, bad).status.ok);
}

TEST_CASE("the screening document: groups and screen members") {
    const char* doc = R"({"format": "tallyproof/1", "categories": ["A", "B"], "model": {"kind": "equal"},
        "groups": [{"name": "x", "observed": [10, 12]}, {"name": "y", "observed": [30, 2]}],
        "screen": {"against": "rest", "adjust": "holm", "q": 0.1}})";
    GroupedCounts counts;
    ScreenChoice choice;
    bool is_screen = false;
    REQUIRE(read_screen_document(doc, &counts, &choice, &is_screen).ok);
    CHECK(is_screen);
    CHECK(counts.groups == std::vector<std::string>{"x", "y"});
    CHECK(counts.counts == std::vector<double>{10, 12, 30, 2});
    CHECK(choice.against == ScreenAgainst::rest);
    CHECK(choice.adjust == MultiplicityMethod::holm);
    CHECK(choice.q == 0.1);
    const char* bad = R"({"categories": ["A", "B"], "groups": [{"name": "x", "observed": [10]}, {"name": "y", "observed": [1, 2]}]})";
    const Status s = read_screen_document(bad, &counts, &choice, &is_screen);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("groups[0].observed has 1 counts but there are 2 categories") != std::string::npos);
}

namespace {

// Invented counts (no source): 300 collectors' last digits, some thin (exact p), some flagged.
GroupedCounts many_groups(std::size_t groups) {
    GroupedCounts c;
    for (int d = 0; d < 10; ++d) c.categories.push_back(std::to_string(d));
    std::uint64_t state = 26;
    for (std::size_t g = 0; g < groups; ++g) {
        c.groups.push_back("C" + std::to_string(g));
        c.group_lines.push_back(static_cast<int>(g) + 2);
        const int n = g % 37 == 0 ? 12 : 60 + static_cast<int>(g % 90);
        std::vector<double> row(10, 0.0);
        for (int i = 0; i < n; ++i) {
            state = state * 6364136223846793005ULL + 1442695040888963407ULL;
            const int d = static_cast<int>((state >> 33) % 10);
            row[g % 25 == 3 && i % 3 == 0 ? (i % 2 ? 0 : 5) : d] += 1;
        }
        c.counts.insert(c.counts.end(), row.begin(), row.end());
    }
    return c;
}

}  // namespace

TEST_CASE("a screen run in slices gives the one-call result bit for bit; a cancelled one gives none") {
    const GroupedCounts counts = many_groups(300);
    Analysis base;
    base.model.kind = ModelKind::last_digit;
    for (ScreenAgainst against : {ScreenAgainst::model, ScreenAgainst::rest}) {
        ScreenChoice choice;
        choice.against = against;
        const ScreenResult whole = screen_groups(base, counts, choice);
        REQUIRE(whole.status.ok);
        CHECK(whole.flagged > 0);
        if (against == ScreenAgainst::model) CHECK(whole.thin > 0);  // thin groups took the exact path
        ScreenJob job;
        start_screen_job(base, counts, choice, &job);
        double last = -1;
        int steps = 0;
        while (!job.progress.done) {
            const WorkProgress p = step_screen_job(&job, 7);
            CHECK(p.fraction >= last);
            CHECK((p.done || p.fraction < 1));
            last = p.fraction;
            ++steps;
        }
        CHECK(steps > 40);
        const ScreenResult& sliced = job.result;
        REQUIRE(sliced.status.ok);
        REQUIRE(sliced.groups.size() == whole.groups.size());
        CHECK(sliced.flagged == whole.flagged);
        CHECK(sliced.notes == whole.notes);
        CHECK(sliced.cautions == whole.cautions);
        CHECK(sliced.model_description == whole.model_description);
        for (std::size_t g = 0; g < whole.groups.size(); ++g) {
            CAPTURE(g);
            CHECK(sliced.groups[g].statistic == whole.groups[g].statistic);
            CHECK(sliced.groups[g].p.log10_p == whole.groups[g].p.log10_p);
            CHECK(sliced.groups[g].q.log10_p == whole.groups[g].q.log10_p);
            CHECK(sliced.groups[g].method == whole.groups[g].method);
            CHECK(sliced.groups[g].drivers.size() == whole.groups[g].drivers.size());
        }
    }
    ScreenJob job;
    start_screen_job(base, counts, ScreenChoice{}, &job);
    step_screen_job(&job, 50);
    cancel_screen_job(&job);
    CHECK(job.progress.cancelled);
    CHECK_FALSE(job.progress.done);
    CHECK(step_screen_job(&job, 1000).cancelled);
    ScreenJob refused;  // a refusal ends the job at once, with the same message as the one call
    Analysis conformity = base;
    conformity.conformity.requested = true;
    start_screen_job(conformity, counts, ScreenChoice{}, &refused);
    CHECK(refused.progress.done);
    CHECK_FALSE(refused.result.status.ok);
    CHECK(refused.result.status.message == screen_groups(conformity, counts, ScreenChoice{}).status.message);
}

TEST_CASE("a wide table headed by numbered categories; group names under the label rules") {
    std::string text = "Collector,0,1,2,3,4,5,6,7,8,9\n";
    for (int g = 0; g < 12; ++g) {
        text += "C" + std::to_string(g);
        for (int d = 0; d < 10; ++d) text += "," + std::to_string(5 + (g * 7 + d * 3) % 11);
        text += "\n";
    }
    GroupedCounts c = read_grouped_text(text);
    REQUIRE(c.status.ok);
    CHECK(c.groups.size() == 12);
    CHECK(c.header);
    CHECK(c.numbered_header);
    CHECK(c.categories.front() == "0");
    CHECK(c.categories.back() == "9");
    GroupReadOptions no_header;
    no_header.header = false;
    c = read_grouped_text(text, no_header);
    CHECK(c.groups.size() == 13);
    CHECK(c.categories.front() == "Category 1");
    // Rows that all count up alike: no header guessed.
    c = read_grouped_text("A,1,2,3\nB,2,3,4\nC,3,4,5\n");
    CHECK(c.groups.size() == 3);
    CHECK_FALSE(c.header);
    // NFC: composed and decomposed are one group; invisible characters as codes; look-alikes found.
    c = read_grouped_text("g\tc\tn\nCaf\xC3\xA9\tx\t1\nCafe\xCC\x81\tx\t2\nCaf\xC3\xA9\ty\t3\nNorth\tx\t1\nnorth\ty\t2\n\xE2\x80\xAE" "b\tx\t1\n");
    REQUIRE(c.status.ok);
    REQUIRE(c.groups.size() == 4);
    CHECK(c.groups[0] == "Caf\xC3\xA9");
    CHECK(c.count(0, 0) == 3);
    CHECK(c.groups[3] == "<U+202E>b");
    REQUIRE(c.look_alike_groups.size() == 1);
    CHECK(c.look_alike_groups[0] == std::vector<std::size_t>{1, 2});
    // Faults about the groups themselves are marked for the reading policy.
    CHECK(read_grouped_text("g\tc\tn\nA\tx\t1\nA\ty\t2\n").group_problem);
    CHECK(read_grouped_text("g\tc\tn\nA\tx\t1\n\ty\t2\nB\tx\t1\n").group_problem);
    CHECK_FALSE(read_grouped_text("g\tc\tn\nA\tx\t1\nA\ty\tmany\nB\tx\t1\n").group_problem);
}

TEST_CASE("a screen's document reads back to the same groups, settings and view") {
    const GroupedCounts counts = many_groups(40);
    Analysis base;
    base.model.kind = ModelKind::ratio;
    base.model.values = {2, 1, 1, 1, 1, 1, 1, 1, 1, 2};
    base.statistic.lambda = 0;
    ScreenChoice choice;
    choice.adjust = MultiplicityMethod::holm;
    choice.q = 0.01;
    ScreenView view;
    view.sort = "w";
    view.ascending = false;
    view.opened = "C3";
    const std::string doc = write_screen_document(base, counts, choice, view);
    Analysis a;
    REQUIRE(read_analysis_document(doc, &a).ok);
    CHECK(a.model.values == base.model.values);
    CHECK(a.statistic.lambda == 0);
    GroupedCounts back;
    ScreenChoice choice_back;
    ScreenView view_back;
    bool is_screen = false;
    REQUIRE(read_screen_document(doc, &back, &choice_back, &view_back, &is_screen).ok);
    CHECK(is_screen);
    CHECK(back.groups == counts.groups);
    CHECK(back.categories == counts.categories);
    CHECK(back.counts == counts.counts);
    CHECK(choice_back.adjust == MultiplicityMethod::holm);
    CHECK(choice_back.q == 0.01);
    CHECK(view_back.sort == "w");
    CHECK_FALSE(view_back.ascending);
    CHECK(view_back.opened == "C3");
    const ScreenResult s1 = screen_groups(base, counts, choice), s2 = screen_groups(a, back, choice_back);
    REQUIRE(s1.status.ok);
    for (std::size_t g = 0; g < s1.groups.size(); ++g) CHECK(s1.groups[g].q.log10_p == s2.groups[g].q.log10_p);
    // "groups" null or not a list: refused naming the member.
    for (const char* bad : {R"({"observed":[1,2],"groups":null})", R"({"observed":[1,2],"groups":3})"}) {
        CAPTURE(bad);
        const Status st = read_analysis_document(bad, &a);
        CHECK_FALSE(st.ok);
        CHECK(st.message.find("\"groups\" must be a list") != std::string::npos);
    }
}
