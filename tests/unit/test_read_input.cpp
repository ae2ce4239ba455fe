// read_input (core/input/read_input.hpp): what a text is as a whole (one sample, groups or a
// refusal) and which expected mix goes with the counts read. The pastes are written by the
// test and the counts are read off them by hand; the policy is ours (DEVELOPERS.md, "Many
// groups"), so these checks pin it: the page and the command-line tool both call it. The groups
// offered beside a one-sample reading come from the rows the one-sample reader split; they must
// equal a reading of the whole text (two paths, one answer).
#include <doctest/doctest.h>

#include <string>
#include <vector>

#include "grouped_table.hpp"
#include "paste_parser.hpp"
#include "read_input.hpp"

using namespace tallyproof;
using S = std::vector<std::string>;
using D = std::vector<double>;

namespace {
// A long table: a group named on several lines, then category and count.
const char* kLong = "Line 1\tA\t3\nLine 1\tB\t5\nLine 2\tA\t4\nLine 2\tB\t6\nLine 3\tA\t2\nLine 3\tB\t1\n";
// A wide table of two categories: also a label, observed, expected paste.
const char* kWide = "Shift,Pass,Fail\nEarly,40,10\nLate,35,15\nNight,30,20\n";

void same_groups(const GroupedCounts& a, const GroupedCounts& b) {
    CHECK(a.status.ok == b.status.ok);
    CHECK(a.shape == b.shape);
    CHECK(a.groups == b.groups);
    CHECK(a.categories == b.categories);
    CHECK(a.counts == b.counts);
    CHECK(a.notes == b.notes);
    CHECK(a.group_column == b.group_column);
}
}  // namespace

TEST_CASE("a column of counts is one sample, with no groups offered (one column holds no groups)") {
    const InputReading r = read_input("12\n30\n18\n", ParseOptions{});
    CHECK(r.kind == InputKind::sample);
    CHECK(r.status.ok);
    CHECK(r.sample.observed == D{12, 30, 18});
    CHECK_FALSE(r.groups_offered);
    // Label and count on two columns would also read as raw values with a group column: offered.
    const InputReading two = read_input("Red\t12\nGreen\t30\nBlue\t18\n", ParseOptions{});
    CHECK(two.kind == InputKind::sample);
    CHECK(two.sample.categories == S{"Red", "Green", "Blue"});
    CHECK(two.groups_offered);
    CHECK(two.groups.shape == GroupShape::raw_values);
    same_groups(two.groups, read_grouped_text("Red\t12\nGreen\t30\nBlue\t18\n"));
}

TEST_CASE("a long table refused as one sample is read as groups, unless groups are never wanted") {
    const InputReading r = read_input(kLong, ParseOptions{});
    REQUIRE(r.kind == InputKind::groups);
    CHECK_FALSE(r.sample.status.ok);  // the one-sample refusal stays readable
    CHECK(r.groups.groups == S{"Line 1", "Line 2", "Line 3"});
    CHECK(r.groups.categories == S{"A", "B"});
    CHECK(r.groups.counts == D{3, 5, 4, 6, 2, 1});
    same_groups(r.groups, read_grouped_text(kLong));

    ReadInputOptions never;
    never.groups = GroupsReading::never;
    const InputReading n = read_input(kLong, ParseOptions{}, never);
    CHECK(n.kind == InputKind::refused);
    CHECK_FALSE(n.status.ok);
    CHECK(n.status.message == r.sample.status.message);
}

TEST_CASE("raw values with a group column are never taken for groups by themselves") {
    // Two columns, the second text: refused as one sample? Then not groups either (only offered
    // under "Read as"), since a typo in a count column would read as text to tally.
    const char* raw = "Ann\t3\nAnn\tx\nBob\t2\nBob\t4\nBob\t1\n";
    const InputReading r = read_input(raw, ParseOptions{});
    CHECK(r.kind != InputKind::groups);
    const GroupedCounts g = read_grouped_text(raw);
    CHECK(g.shape == GroupShape::raw_values);  // what a groups reading would have made of it
    CHECK_FALSE(read_refused_as_groups(raw, ParseOptions{}).status.ok);
}

TEST_CASE("a wide table read as one sample also offers groups, read from the same rows") {
    const InputReading r = read_input(kWide, ParseOptions{});
    REQUIRE(r.kind == InputKind::sample);
    CHECK(r.sample.categories == S{"Early", "Late", "Night"});
    CHECK(r.sample.observed == D{40, 35, 30});
    REQUIRE(r.groups_offered);
    CHECK(r.groups.groups == S{"Early", "Late", "Night"});
    CHECK(r.groups.categories == S{"Pass", "Fail"});
    CHECK(r.groups.counts == D{40, 10, 35, 15, 30, 20});
    same_groups(r.groups, read_grouped_text(kWide));

    ReadInputOptions no_offer;
    no_offer.offer_groups = false;
    CHECK_FALSE(read_input(kWide, ParseOptions{}, no_offer).groups_offered);
    // Read with a separator of the user's choice, the groups are read from the whole text again.
    ParseOptions comma;
    comma.separator = Separator::comma;
    const InputReading c = read_input(kWide, comma);
    REQUIRE(c.groups_offered);
    same_groups(c.groups, r.groups);
}

TEST_CASE("groups always: the groups' own refusal") {
    ReadInputOptions always;
    always.groups = GroupsReading::always;
    const InputReading r = read_input("12\n30\n", ParseOptions{}, always);
    CHECK(r.kind == InputKind::refused);
    CHECK(r.status.message.find("only one column") != std::string::npos);
    const InputReading g = read_input(kLong, ParseOptions{}, always);
    CHECK(g.kind == InputKind::groups);
    same_groups(g.groups, read_grouped_text(kLong));
}

TEST_CASE("the stated mix gives way to equal shares when it no longer fits the new counts") {
    const ParsedInput three = parse_input("A\t10\nB\t20\nC\t30\n");
    const ParsedInput four = parse_input("A\t10\nB\t20\nC\t30\nD\t40\n");
    REQUIRE(three.status.ok);
    REQUIRE(four.status.ok);
    // Shares, ratios, counts and a previous sample: kept with one value per category, else equal.
    for (ModelKind kind : {ModelKind::shares, ModelKind::ratio, ModelKind::counts, ModelKind::reference_sample}) {
        CAPTURE(model_kind_name(kind));
        Analysis a;
        a.model.kind = kind;
        a.model.values = {1, 2, 3};
        CHECK_FALSE(apply_input_mix(three, &a));
        CHECK(a.model.kind == kind);
        CHECK(a.model.values == D{1, 2, 3});
        CHECK(a.observed == D{10, 20, 30});
        CHECK_FALSE(apply_input_mix(four, &a));
        CHECK(a.model.kind == ModelKind::equal);
        CHECK(a.model.values.empty());
        CHECK(a.observed == D{10, 20, 30, 40});
    }
    // A digit law and a fitted distribution belong to the counts they were chosen for.
    for (ModelKind kind : {ModelKind::benford_first, ModelKind::poisson}) {
        Analysis a;
        a.model.kind = kind;
        a.model.parameters = {{"lambda", 2.0}};
        apply_input_mix(three, &a);
        CHECK(a.model.kind == ModelKind::equal);
        CHECK(a.model.parameters.empty());
    }
    // Test settings stay.
    Analysis a;
    a.alpha = 0.01;
    a.model.kind = ModelKind::shares;
    a.model.values = {1, 1};
    apply_input_mix(three, &a);
    CHECK(a.alpha == 0.01);
    CHECK(a.model.kind == ModelKind::equal);
}

TEST_CASE("a paste that states its mix sets it; bin edges go with the counts they made") {
    Analysis a;
    a.model.kind = ModelKind::reference_sample;
    a.model.values = {5, 5, 5, 5};
    const ParsedInput stated = parse_input("Grade\tObserved\tExpected\nA\t10\t0.2\nB\t25\t0.5\nC\t15\t0.3\n");
    REQUIRE(stated.status.ok);
    CHECK(apply_input_mix(stated, &a));
    CHECK(a.model.kind == ModelKind::shares);
    CHECK(a.model.values == D{0.2, 0.5, 0.3});

    ParseOptions bins;
    bins.bins.kind = BinChoice::Kind::edges;
    bins.bins.edges = {0, 10, 20, 30};
    const ParsedInput binned = parse_input("1\n5\n12\n15\n18\n25\n", bins);
    REQUIRE(binned.status.ok);
    Analysis b;
    CHECK_FALSE(apply_input_mix(binned, &b));
    CHECK(b.model.kind == ModelKind::equal);
    CHECK(b.model.edges == D{0, 10, 20, 30});
    CHECK(b.observed == D{2, 3, 1});
    // ...and a reading without bins leaves none behind.
    CHECK_FALSE(apply_input_mix(parse_input("A\t1\nB\t2\n"), &b));
    CHECK(b.model.edges.empty());
}

TEST_CASE("groups share the same rule: a previous sample of other categories gives way to equal shares") {
    const GroupedCounts g = read_grouped_text(kLong);
    REQUIRE(g.status.ok);
    Analysis a;
    a.model.kind = ModelKind::reference_sample;
    a.model.values = {7, 8, 9};  // three categories; the groups have two
    CHECK_FALSE(apply_groups_mix(g, &a));
    CHECK(a.model.kind == ModelKind::equal);
    CHECK(a.categories == S{"A", "B"});
    CHECK(a.observed.empty());  // the groups' counts are not one sample
    Analysis kept;
    kept.model.kind = ModelKind::ratio;
    kept.model.values = {3, 1};
    apply_groups_mix(g, &kept);
    CHECK(kept.model.kind == ModelKind::ratio);
    CHECK(kept.model.values == D{3, 1});
}

TEST_CASE("a stated mix is kept only for the same categories, and the notes say which happened") {
    // New counts with the same number of categories but other labels (a defect file after a
    // fruit example) must not be tested against the old shares: common practice, the expected
    // shares are a property of the categories they name.
    const ParsedInput fruit = parse_input("Apple\t20\nPear\t50\nPlum\t25\nFig\t5\n");
    const ParsedInput fruit_again = parse_input("Apple\t22\nPear\t48\nPlum\t24\nFig\t6\n");
    const ParsedInput defects = parse_input("Scratch\t31\nDent\t12\nCrack\t40\nOther\t17\n");
    REQUIRE(fruit.status.ok);
    REQUIRE(defects.status.ok);
    Analysis a;
    apply_input_mix(fruit, &a);
    a.model.kind = ModelKind::shares;
    a.model.values = {0.2, 0.5, 0.25, 0.05};
    std::vector<std::string> notes;
    CHECK_FALSE(apply_input_mix(fruit_again, &a, &notes));
    CHECK(a.model.kind == ModelKind::shares);
    CHECK(a.model.values == D{0.2, 0.5, 0.25, 0.05});
    REQUIRE(notes.size() == 1);
    CHECK(notes[0].find("is kept") != std::string::npos);
    notes.clear();
    CHECK_FALSE(apply_input_mix(defects, &a, &notes));
    CHECK(a.model.kind == ModelKind::equal);
    CHECK(a.model.values.empty());
    CHECK(a.categories == S{"Scratch", "Dent", "Crack", "Other"});
    REQUIRE(notes.size() == 1);
    CHECK(notes[0].find("was for other categories") != std::string::npos);
    // Equal shares need no note either way.
    notes.clear();
    apply_input_mix(fruit, &a, &notes);
    CHECK(notes.empty());
}

TEST_CASE("a table of groups refused for its groups gives the groups' message, as --by does") {
    // The messages of tests/cli/test_cli_screen_rules.py (tallyproof --by reader): the page and the
    // tool say the same.
    const InputReading one = read_input("reader\tdigit\tcount\nA\t0\t3\nA\t1\t2\n", ParseOptions{});
    CHECK(one.kind == InputKind::refused);
    CHECK(one.status.message.find("Only one group (\"A\")") != std::string::npos);
    const InputReading empty = read_input("reader\tdigit\tcount\nA\t0\t3\n\t1\t2\nB\t0\t1\nB\t1\t1\n", ParseOptions{});
    CHECK(empty.kind == InputKind::refused);
    CHECK(empty.status.message.find("the group cell is empty") != std::string::npos);
    // A plain refused one-sample paste keeps its own message.
    const InputReading text = read_input("A\tx\nB\t2\n", ParseOptions{});
    CHECK(text.kind == InputKind::refused);
    CHECK(text.status.message == text.sample.status.message);
}
