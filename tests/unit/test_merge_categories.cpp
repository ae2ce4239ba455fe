// Merging thin categories on expected counts: worked cases derived by hand in the comments,
// and properties checked over many generated inputs (totals kept, every index used once,
// ordered groups contiguous, the rule satisfied, refusals only where no split exists).
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>

#include "merge_categories.hpp"

using namespace tallyproof;

namespace {

using Groups = std::vector<std::vector<std::size_t>>;

MergeOptions options(MergeRule rule, bool ordered, double minimum = 5) {
    MergeOptions o;
    o.rule = rule;
    o.ordered = ordered;
    o.minimum = minimum;
    return o;
}

// Deterministic generator so every run checks the same inputs (common practice: a 64-bit LCG).
struct Lcg {
    std::uint64_t s;
    double uniform() {
        s = s * 6364136223846793005ULL + 1442695040888963407ULL;
        return static_cast<double>(s >> 11) / 9007199254740992.0;
    }
};

}  // namespace

TEST_CASE("ordered, all at least 5: thinnest joins its smaller neighbour") {
    // By hand, E = 1 2 10 10 3 4 (labels 1..6):
    //  1 (first) has one neighbour  -> [1,2]=3 10 10 3 4
    //  smallest 3 ties at groups 1 and 4: the leftmost, [1,2], joins its only neighbour 10
    //                               -> [1..3]=13 10 3 4
    //  3 (category 5): neighbours 10 and 4 -> the smaller, 4 -> 13 10 [5,6]=7: all >= 5.
    MergeResult r;
    REQUIRE(merge_categories({"1", "2", "3", "4", "5", "6"}, {0, 4, 9, 12, 1, 4}, {1, 2, 10, 10, 3, 4},
                             options(MergeRule::all_at_least_5, true), &r)
                .ok);
    CHECK(r.groups == Groups{{0, 1, 2}, {3}, {4, 5}});
    CHECK(r.labels == std::vector<std::string>{"1\u20133", "4", "5\u20136"});
    CHECK(r.observed == std::vector<double>{13, 12, 5});
    CHECK(r.expected == std::vector<double>{13, 10, 7});
    CHECK(r.categories == 3);  // df = 3 - 1 - m for the caller
    CHECK(r.merged);
    CHECK(r.note.find("6 categories into 3") != std::string::npos);
}

TEST_CASE("ordered, Cochran stops earlier than all-5") {
    // By hand, E = 0.5 6 7 8 9 4.5 10 5 (k = 8, total 50):
    //  Cochran fails (0.5 < 1). 0.5 joins its only neighbour 6 -> 6.5 7 8 9 4.5 10 5: k = 7,
    //  one below 5 (14% <= 20%), none below 1 -> Cochran holds after one join.
    //  All-5 goes on: 4.5 has neighbours 9 and 10 -> joins 9 -> 6.5 7 8 13.5 10 5.
    const std::vector<double> e{0.5, 6, 7, 8, 9, 4.5, 10, 5}, o{1, 5, 8, 7, 10, 3, 9, 7};
    const std::vector<std::string> labels{"a", "b", "c", "d", "e", "f", "g", "h"};
    MergeResult r;
    REQUIRE(merge_categories(labels, o, e, options(MergeRule::cochran, true), &r).ok);
    CHECK(r.groups == Groups{{0, 1}, {2}, {3}, {4}, {5}, {6}, {7}});
    CHECK(r.labels[0] == "a\u2013b");
    CHECK(r.expected[0] == 6.5);
    CHECK(r.observed[0] == 6);
    REQUIRE(merge_categories(labels, o, e, options(MergeRule::all_at_least_5, true), &r).ok);
    CHECK(r.groups == Groups{{0, 1}, {2}, {3}, {4, 5}, {6}, {7}});
    CHECK(r.labels[3] == "e\u2013f");
    CHECK(r.expected[3] == 13.5);
    CHECK(r.observed[3] == 13);
}

TEST_CASE("ordered, custom minimum") {
    // By hand, E = 3 3 3 3, minimum 6: first 3 joins its neighbour -> 6 3 3; the leftmost 3
    // (second group) has neighbours 6 and 3 -> joins the 3 -> 6 6.
    MergeResult r;
    REQUIRE(merge_categories({}, {2, 4, 3, 3}, {3, 3, 3, 3}, options(MergeRule::custom_minimum, true, 6), &r).ok);
    CHECK(r.groups == Groups{{0, 1}, {2, 3}});
    CHECK(r.labels == std::vector<std::string>{"1\u20132", "3\u20134"});  // default labels 1..k
    CHECK(r.observed == std::vector<double>{6, 6});
}

TEST_CASE("ordered: a tie between neighbours goes left") {
    // By hand, E = 6 2 6 9, all-5: 2 has neighbours 6 and 6, the tie goes left -> 8 6 9.
    MergeResult r;
    REQUIRE(merge_categories({}, {5, 3, 6, 9}, {6, 2, 6, 9}, options(MergeRule::all_at_least_5, true), &r).ok);
    CHECK(r.groups == Groups{{0, 1}, {2}, {3}});
    CHECK(r.observed == std::vector<double>{8, 6, 9});
}

TEST_CASE("ordered: when the greedy join ends in one group, a left-to-right split is used") {
    // By hand, E = 4 1 1 4, all-5: 1 (leftmost) joins the smaller neighbour 1 -> 4 2 4; 2 has
    // neighbours 4 and 4, a tie goes left -> 6 4 -> 10: one group. But 4+1 | 1+4 = 5 | 5 works,
    // which the left-to-right sweep finds.
    MergeResult r;
    REQUIRE(merge_categories({"w", "x", "y", "z"}, {3, 2, 0, 5}, {4, 1, 1, 4}, options(MergeRule::all_at_least_5, true),
                             &r)
                .ok);
    CHECK(r.groups == Groups{{0, 1}, {2, 3}});
    CHECK(r.expected == std::vector<double>{5, 5});
    CHECK(r.note.find("left to right") != std::string::npos);
}

TEST_CASE("ordered: refused when no two groups can reach the rule") {
    // By hand: E = 2 2 2 totals 6, so no split into two groups of at least 5 exists.
    MergeResult r;
    Status s = merge_categories({}, {1, 2, 3}, {2, 2, 2}, options(MergeRule::all_at_least_5, true), &r);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("at least two groups") != std::string::npos);
    CHECK(s.message.find("exact or Monte Carlo") != std::string::npos);
    CHECK(r.groups.empty());
    s = merge_categories({}, {1, 2, 3}, {2, 2, 2}, options(MergeRule::cochran, true), &r);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("Cochran") != std::string::npos);
}

TEST_CASE("unordered, all at least 5: thin cells pooled, then the smallest remaining cell") {
    // By hand, E = A 2, B 8, C 1, D 6, E 0.5, F 12.5 (total 30). Thin (< 5): A, C, E, pooled
    // to 3.5, still thin, so the smallest remaining cell D (6) joins: Other = 9.5. B 8, F 12.5.
    MergeResult r;
    const std::vector<double> o{3, 7, 0, 9, 1, 10};
    REQUIRE(merge_categories({"A", "B", "C", "D", "E", "F"}, o, {2, 8, 1, 6, 0.5, 12.5},
                             options(MergeRule::all_at_least_5, false), &r)
                .ok);
    CHECK(r.groups == Groups{{1}, {5}, {0, 2, 3, 4}});
    CHECK(r.labels == std::vector<std::string>{"B", "F", "Other (A, C, D, E)"});
    CHECK(r.observed == std::vector<double>{7, 10, 13});  // 3 + 0 + 9 + 1 = 13
    CHECK(r.expected == std::vector<double>{8, 12.5, 9.5});
    CHECK(r.categories == 3);
}

TEST_CASE("unordered, Cochran pools only what it must") {
    // By hand, E = 0.4 0.7 3 and eight 10s (k = 11): below 1 twice, so Cochran fails. Pool the
    // two smallest: Other 1.1 -> k = 10 with 1.1 and 3 below 5 (20%), none below 1: holds.
    // All-5 must go on: Other 0.4+0.7+3 = 4.1 is thin, so the smallest remaining cell (a 10;
    // the first of the ties, category D) joins: Other (A, B, C, D) = 14.1.
    std::vector<double> e{0.4, 0.7, 3}, o{0, 2, 4};
    for (int i = 0; i < 8; ++i) {
        e.push_back(10);
        o.push_back(9 + i);
    }
    const std::vector<std::string> labels{"A", "B", "C", "D", "E", "F", "G", "H", "I", "J", "K"};
    MergeResult r;
    REQUIRE(merge_categories(labels, o, e, options(MergeRule::cochran, false), &r).ok);
    CHECK(r.categories == 10);
    CHECK(r.groups.back() == std::vector<std::size_t>{0, 1});
    CHECK(r.labels.back() == "Other (A, B)");
    CHECK(r.expected.back() == doctest::Approx(1.1).epsilon(1e-15));
    CHECK(r.observed.back() == 2);
    REQUIRE(merge_categories(labels, o, e, options(MergeRule::all_at_least_5, false), &r).ok);
    CHECK(r.categories == 8);
    CHECK(r.groups.back() == std::vector<std::size_t>{0, 1, 2, 3});
    CHECK(r.labels.back() == "Other (A, B, C, D)");
    CHECK(r.expected.back() == doctest::Approx(14.1).epsilon(1e-15));
    CHECK(r.observed.back() == 15);  // 0 + 2 + 4 + 9
}

TEST_CASE("unordered: refused when even all but the largest cell stays thin") {
    // By hand: E = 2 2 2: pooling two leaves 4 | 2, pooling all three leaves one group.
    MergeResult r;
    Status s = merge_categories({"x", "y", "z"}, {1, 2, 3}, {2, 2, 2}, options(MergeRule::all_at_least_5, false), &r);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("\"Other\"") != std::string::npos);
    // A known limit of the single-pool design: E = 3 3 3 3 could form two pairs of 6, but one
    // "Other" group plus untouched cells cannot (9 | 3), so it is refused.
    CHECK_FALSE(merge_categories({}, {3, 3, 3, 3}, {3, 3, 3, 3}, options(MergeRule::all_at_least_5, false), &r).ok);
}

TEST_CASE("nothing merged when the rule already holds or no rule is asked for") {
    MergeResult r;
    REQUIRE(merge_categories({"a", "b"}, {1, 2}, {1.5, 1.5}, options(MergeRule::none, true), &r).ok);
    CHECK(r.groups == Groups{{0}, {1}});
    CHECK_FALSE(r.merged);
    CHECK(r.note.empty());
    REQUIRE(merge_categories({"a", "b", "c"}, {5, 6, 7}, {6, 6, 6}, options(MergeRule::all_at_least_5, false), &r).ok);
    CHECK(r.labels == std::vector<std::string>{"a", "b", "c"});
    CHECK_FALSE(r.merged);
}

TEST_CASE("merging never looks at the observed counts") {
    // Same expected counts, wildly different observed: identical merge maps.
    MergeResult a, b;
    const std::vector<double> e{1, 2, 10, 10, 3, 4};
    REQUIRE(merge_categories({}, {0, 0, 0, 0, 0, 30}, e, options(MergeRule::cochran, true), &a).ok);
    REQUIRE(merge_categories({}, {30, 0, 0, 0, 0, 0}, e, options(MergeRule::cochran, true), &b).ok);
    CHECK(a.groups == b.groups);
}

TEST_CASE("properties over generated inputs") {
    Lcg rng{12345};
    int merged_cases = 0, refused_cases = 0;
    for (int trial = 0; trial < 600; ++trial) {
        const std::size_t k = 2 + static_cast<std::size_t>(rng.uniform() * 14);
        std::vector<double> e(k), o(k);
        double e_total = 0, o_total = 0;
        for (std::size_t i = 0; i < k; ++i) {
            // a mix of thin and thick cells, some exactly 0, 1 or 5
            const double u = rng.uniform();
            e[i] = u < 0.05 ? 0.0 : (u < 0.1 ? 1.0 : (u < 0.15 ? 5.0 : rng.uniform() * (rng.uniform() < 0.5 ? 4 : 30)));
            o[i] = std::floor(rng.uniform() * 40);
            e_total += e[i];
            o_total += o[i];
        }
        if (e_total == 0) e[0] = e_total = 1;
        for (MergeRule rule : {MergeRule::all_at_least_5, MergeRule::cochran, MergeRule::custom_minimum}) {
            for (bool ordered : {true, false}) {
                CAPTURE(trial);
                CAPTURE(static_cast<int>(rule));
                CAPTURE(ordered);
                const MergeOptions opt = options(rule, ordered, 3.5);
                MergeResult r;
                const Status s = merge_categories({}, o, e, opt, &r);
                const double t = rule == MergeRule::custom_minimum ? 3.5 : 5.0;
                if (!s.ok) {
                    ++refused_cases;
                    CHECK(!s.message.empty());
                    if (ordered) {
                        // no contiguous split into two groups of at least t exists
                        double prefix = 0;
                        for (std::size_t j = 0; j + 1 < k; ++j) {
                            prefix += e[j];
                            CHECK_FALSE((prefix >= t && e_total - prefix >= t * (1 + 1e-12)));
                        }
                    } else {
                        const double largest = *std::max_element(e.begin(), e.end());
                        CHECK_FALSE((largest >= t && e_total - largest >= t * (1 + 1e-12)));
                    }
                    continue;
                }
                if (r.merged) ++merged_cases;
                CHECK(r.categories == r.groups.size());
                CHECK(r.categories >= 2);
                CHECK(r.labels.size() == r.categories);
                CHECK(r.observed.size() == r.categories);
                CHECK(r.expected.size() == r.categories);
                CHECK(merge_rule_holds(r.expected, rule, 3.5));
                std::vector<int> used(k, 0);
                double oe = 0, ee = 0;
                for (std::size_t g = 0; g < r.groups.size(); ++g) {
                    CHECK(!r.groups[g].empty());
                    CHECK(std::is_sorted(r.groups[g].begin(), r.groups[g].end()));
                    for (std::size_t i : r.groups[g]) ++used[i];
                    oe += r.observed[g];
                    ee += r.expected[g];
                    if (ordered) {  // contiguous, and the groups follow the original order
                        CHECK(r.groups[g].back() - r.groups[g].front() + 1 == r.groups[g].size());
                        if (g > 0) CHECK(r.groups[g].front() == r.groups[g - 1].back() + 1);
                    }
                }
                CHECK(std::all_of(used.begin(), used.end(), [](int u) { return u == 1; }));
                CHECK(oe == o_total);  // whole numbers: exact
                CHECK(ee == doctest::Approx(e_total).epsilon(1e-13));
            }
        }
    }
    // the generator must exercise both outcomes for the checks above to mean anything
    CHECK(merged_cases > 100);
    CHECK(refused_cases > 10);
}

TEST_CASE("bad arguments are refused") {
    MergeResult r;
    const MergeOptions opt = options(MergeRule::cochran, true);
    CHECK_FALSE(merge_categories({}, {}, {}, opt, &r).ok);
    CHECK_FALSE(merge_categories({}, {3}, {3}, options(MergeRule::none, true), &r).ok);  // one category
    CHECK_FALSE(merge_categories({}, {1, 2}, {1, 2, 3}, opt, &r).ok);
    CHECK_FALSE(merge_categories({"a"}, {1, 2}, {1, 2}, opt, &r).ok);
    Status s = merge_categories({"a", "b"}, {1, -2}, {1, 2}, opt, &r);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("\"b\"") != std::string::npos);
    CHECK_FALSE(merge_categories({}, {1, 2.5}, {1, 2}, opt, &r).ok);
    CHECK_FALSE(merge_categories({}, {1, 2}, {1, -2}, opt, &r).ok);
    CHECK_FALSE(merge_categories({}, {1, 2}, {1, std::numeric_limits<double>::quiet_NaN()}, opt, &r).ok);
    CHECK_FALSE(merge_categories({}, {1, 2}, {1, std::numeric_limits<double>::infinity()}, opt, &r).ok);
    CHECK_FALSE(merge_categories({}, {1, 2}, {0, 0}, opt, &r).ok);
    CHECK_FALSE(merge_categories({}, {1, 2}, {1, 2}, options(MergeRule::custom_minimum, true, 0), &r).ok);
    CHECK_FALSE(merge_categories({}, {1, 2}, {1, 2},
                                 options(MergeRule::custom_minimum, true, std::numeric_limits<double>::quiet_NaN()), &r)
                    .ok);
    CHECK(r.groups.empty());
}

TEST_CASE("rule names round-trip") {
    for (MergeRule rule : {MergeRule::none, MergeRule::all_at_least_5, MergeRule::cochran, MergeRule::custom_minimum}) {
        MergeRule back = MergeRule::none;
        CHECK(merge_rule_from_name(merge_rule_name(rule), &back));
        CHECK(back == rule);
    }
    MergeRule x;
    CHECK_FALSE(merge_rule_from_name("Cochran!", &x));
}
