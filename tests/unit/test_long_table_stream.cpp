// Long tables counted as they are split (grouped_table.hpp: rows not held past the first
// kPlanRows): the counts against the test's own tally of the generated rows (a std::map summing
// each group and category, the definition of a long table's counts: common practice), and every
// field of the reading against the same text read from rows split first (read_grouped_rows,
// which holds every row and plans on all of them).
#include <doctest/doctest.h>

#include <algorithm>
#include <cstdint>
#include <map>
#include <random>
#include <string>
#include <vector>

#include "delimited_text.hpp"
#include "grouped_table.hpp"
#include "table_shape.hpp"

using namespace tallyproof;

namespace {

// The text's non-blank records as held rows (what parse_input hands the groups reader).
std::vector<TableRow> split_rows(const std::string& text, Separator sep) {
    DelimitedReader reader(skip_byte_order_mark(text), sep);
    std::vector<TableRow> rows;
    Record rec;
    while (reader.next(&rec)) {
        if (rec.blank()) continue;
        TableRow row;
        row.line = rec.line;
        for (auto c : rec.cells) row.cells.emplace_back(c);
        rows.push_back(std::move(row));
    }
    return rows;
}

void same_reading(const GroupedCounts& a, const GroupedCounts& b) {
    CHECK(a.status.ok == b.status.ok);
    CHECK(a.status.message == b.status.message);
    CHECK(a.status.line == b.status.line);
    CHECK(a.shape == b.shape);
    CHECK(a.header == b.header);
    CHECK(a.group_column == b.group_column);
    CHECK(a.group_column_name == b.group_column_name);
    CHECK(a.categories == b.categories);
    CHECK(a.groups == b.groups);
    CHECK(a.group_lines == b.group_lines);
    CHECK(a.counts == b.counts);
    CHECK(a.ordered == b.ordered);
    CHECK(a.notes == b.notes);
    CHECK(a.problems.size() == b.problems.size());
}

struct Table {
    std::string text;
    std::map<std::pair<std::string, std::string>, double> tally;  // (group, category) -> count
};

// `groups` groups of categories "1".."k" (numbers, so read in numeric order), rows shuffled or
// sorted by group; every seventh combination left out, every eleventh row written twice.
Table long_table(int groups, int k, bool sorted, std::uint32_t seed) {
    std::mt19937 rng(seed);
    std::vector<std::string> rows;
    Table t;
    for (int g = 0; g < groups; ++g)
        for (int c = k; c >= 1; --c) {  // categories first met in descending order
            if ((g * k + c) % 7 == 3) continue;
            const std::string group = "site-" + std::to_string(g), category = std::to_string(c);
            const int n = static_cast<int>(rng() % 50);
            rows.push_back(group + "," + category + "," + std::to_string(n));
            t.tally[{group, category}] += n;
            if ((g * k + c) % 11 == 5) {
                rows.push_back(group + "," + category + ",2");
                t.tally[{group, category}] += 2;
            }
        }
    if (!sorted) std::shuffle(rows.begin(), rows.end(), rng);
    t.text = "Site,Grade,Units\n";
    for (const auto& r : rows) t.text += r + "\r\n";
    return t;
}

}  // namespace

TEST_CASE("a long table counted as it is split: the counts of the test's own tally, the reading of held rows") {
    for (const bool sorted : {true, false}) {
        CAPTURE(sorted);
        const Table t = long_table(3000, 6, sorted, sorted ? 7u : 8u);
        const GroupedCounts streamed = read_grouped_text(t.text);
        REQUIRE(streamed.status.ok);
        CHECK(streamed.shape == GroupShape::long_table);
        CHECK(streamed.header);
        REQUIRE(streamed.categories == std::vector<std::string>{"1", "2", "3", "4", "5", "6"});
        REQUIRE(streamed.groups.size() == 3000);
        for (std::size_t g = 0; g < streamed.groups.size(); ++g)
            for (std::size_t c = 0; c < streamed.categories.size(); ++c) {
                const auto it = t.tally.find({streamed.groups[g], streamed.categories[c]});
                CHECK(streamed.count(g, c) == (it == t.tally.end() ? 0.0 : it->second));
            }
        same_reading(streamed, read_grouped_rows(split_rows(t.text, Separator::comma), Separator::comma));
    }
}

TEST_CASE("a long table counted as it is split: late categories, respelled groups, refusals on later lines") {
    // A category first met on line 5000, after many groups (the rows laid out wider then); a group
    // written composed and decomposed (one group, noted); quoted cells.
    std::string text;
    for (int g = 0; g < 1500; ++g)
        for (const char* c : {"pass", "rework"}) text += "\"lot " + std::to_string(g) + "\"\t" + c + "\t" + std::to_string(g % 9) + "\n";
    text += "caf\xC3\xA9\tpass\t3\ncafe\xCC\x81\tscrap\t4\n";
    text += "lot 7\tscrap\t1\n";
    const GroupedCounts a = read_grouped_text(text);
    REQUIRE(a.status.ok);
    CHECK(a.categories == std::vector<std::string>{"pass", "rework", "scrap"});
    CHECK(a.groups.size() == 1501);
    CHECK(a.count(7, 2) == 1);
    CHECK(a.count(1500, 0) == 3);
    CHECK(a.count(1500, 2) == 4);
    CHECK(a.count(1499, 1) == 1499 % 9);
    same_reading(a, read_grouped_rows(split_rows(text, Separator::tab), Separator::tab));

    // A count that is not one, far below the first rows: refused at its line, as when held.
    std::string bad = text;
    bad += "lot 8\tscrap\tmany\n";
    const GroupedCounts b = read_grouped_text(bad);
    CHECK_FALSE(b.status.ok);
    CHECK(b.status.line == 3004);
    same_reading(b, read_grouped_rows(split_rows(bad, Separator::tab), Separator::tab));

    // A row wider than group, category and count: refused at its line.
    std::string wide = text + "lot 9\tscrap\t1\t5\n";
    const GroupedCounts w = read_grouped_text(wide);
    CHECK_FALSE(w.status.ok);
    CHECK(w.status.line == 3004);
    CHECK(w.status.message.find("expected group, category and count") != std::string::npos);
    same_reading(w, read_grouped_rows(split_rows(wide, Separator::tab), Separator::tab));
}

TEST_CASE("long tables past the held-row limit are read; wide tables still read whole") {
    // 2,000,100 rows of 20 groups: more rows than kMaxGroupRows, memory that of 20 x 5 counts.
    std::string text;
    text.reserve(40u << 20);
    double total = 0;
    for (std::size_t r = 0; r < kMaxGroupRows + 100; ++r) {
        text += "g" + std::to_string(r % 20) + "," + std::to_string(r % 5) + ",1\n";
        total += 1;
    }
    GroupedRowsJob job;
    start_grouped_text(text, GroupReadOptions{}, &job);
    std::size_t steps = 0;
    double last_fraction = 0;
    bool rising = true;
    while (!step_grouped_rows(&job, 50000)) {
        ++steps;
        const double f = grouped_rows_fraction(job);
        rising = rising && f >= last_fraction && f < 1.0;
        last_fraction = f;
        CHECK(job.rows.size() <= kPlanRows);  // never more rows held than the plan's
    }
    CHECK(rising);
    CHECK(steps > 30);
    const GroupedCounts& g = job.out;
    REQUIRE(g.status.ok);
    CHECK(g.groups.size() == 20);
    CHECK(g.categories.size() == 5);
    double sum = 0;
    for (double c : g.counts) sum += c;
    CHECK(sum == total);
    bool noted = false;
    for (const auto& n : g.notes) noted = noted || n.find("rows repeat a group and category already seen (first on line 21)") != std::string::npos;
    CHECK(noted);

    // A wide table: one row per group, counted from held rows as before.
    std::string wide = "Site,A,B,C\n";
    for (int i = 0; i < 3000; ++i) wide += "s" + std::to_string(i) + "," + std::to_string(i % 4) + ",2,3\n";
    const GroupedCounts w = read_grouped_text(wide);
    REQUIRE(w.status.ok);
    CHECK(w.shape == GroupShape::wide_table);
    CHECK(w.groups.size() == 3000);
    CHECK(w.count(2999, 0) == 3);
}
