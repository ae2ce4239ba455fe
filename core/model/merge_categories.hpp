// Merging thin categories before a chi-square goodness-of-fit test, decided on expected counts
// only, until a validity rule holds: all expected at least 5, Cochran's rule (Cochran 1954,
// Biometrics 10:417-451) or a stated minimum. Ordered categories are joined to a neighbour;
// unordered ones are pooled into one "Other" group. Counts are summed exactly (observed are
// whole numbers below 2^53); expected sums are compensated (Neumaier 1974), within an ulp or two.
#pragma once
#include <cstddef>
#include <string>
#include <vector>

#include "status.hpp"

namespace tallyproof {

struct Analysis;

enum class MergeRule {
    none,            // leave the categories as they are
    all_at_least_5,  // every expected count >= 5
    cochran,         // none below 1 and at most 20% below 5
    custom_minimum,  // every expected count >= MergeOptions::minimum
};

const char* merge_rule_name(MergeRule rule);                          // "none", "all-5", "cochran", "minimum"
bool merge_rule_from_name(const std::string& name, MergeRule* rule);  // false if unknown

struct MergeOptions {
    MergeRule rule = MergeRule::cochran;
    double minimum = 5;    // used by custom_minimum only; must be finite and > 0
    bool ordered = false;  // categories have a natural order: merge neighbours only
};

struct MergeResult {
    std::vector<std::vector<std::size_t>> groups;  // per group, original 0-based indices, ascending
    std::vector<std::string> labels;               // "4–5" (ordered) or "Other (A, C)" (pooled)
    std::vector<double> observed;                  // summed per group; totals equal the originals
    std::vector<double> expected;                  // summed per group
    std::size_t categories = 0;                    // groups.size(): df = categories - 1 - m
    bool merged = false;                           // some group holds more than one category
    std::string note;                              // plain-language account of what was merged
};

// True when `expected` satisfies `rule` (`minimum` is read for custom_minimum only).
bool merge_rule_holds(const std::vector<double>& expected, MergeRule rule, double minimum);

// Merges categories until `options.rule` holds. `labels` may be empty (categories are then
// called "1", "2", ...). Refuses bad counts, and refuses when no merge of the kind described
// leaves at least two groups satisfying the rule.
Status merge_categories(const std::vector<std::string>& labels, const std::vector<double>& observed,
                        const std::vector<double>& expected, const MergeOptions& options, MergeResult* result);

// Joins each of `groups` (0-based indices into a->categories, disjoint) into one category named
// `names[g]`, in the place of the group's first member, for categories that are one and the same
// (look-alike labels): observed counts are added, and so are the model's values (shares, ratio
// terms, expected counts) when it has one per category. Refuses bins of measurements (their edges
// cannot be joined out of order) and bad indices; `a` is unchanged then.
Status join_categories(const std::vector<std::vector<std::size_t>>& groups, const std::vector<std::string>& names,
                       Analysis* a);

}  // namespace tallyproof
