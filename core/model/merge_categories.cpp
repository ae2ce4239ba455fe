// Merging of thin categories (common practice after Cochran 1954, Biometrics 10:417-451).
// Ordered: the group with the smallest expected count joins its neighbour with the smaller
// expected count, repeatedly, until the rule holds. Unordered: the thinnest cells are pooled
// into one "Other" group, in ascending order of expected count, until the rule holds.
#include "merge_categories.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numeric>

#include "analysis.hpp"
#include "number_format.hpp"
#include "validity.hpp"

namespace tallyproof {
namespace {

// Neumaier's compensated sum: the group totals agree with the full total to an ulp or two.
double compensated_sum(const std::vector<double>& values, const std::vector<std::size_t>& members) {
    double sum = 0, carry = 0;
    for (std::size_t i : members) {
        const double v = values[i], t = sum + v;
        carry += std::fabs(sum) >= std::fabs(v) ? (sum - t) + v : (v - t) + sum;
        sum = t;
    }
    return sum + carry;
}

double group_threshold(MergeRule rule, double minimum) {
    return rule == MergeRule::custom_minimum ? minimum : 5.0;
}

std::string rule_phrase(MergeRule rule, double minimum) {
    switch (rule) {
        case MergeRule::none: return "no rule";
        case MergeRule::all_at_least_5: return "every expected count at least 5";
        case MergeRule::cochran: return "Cochran's rule (none below 1, at most 20% below 5)";
        case MergeRule::custom_minimum: return "every expected count at least " + format_plain(minimum);
    }
    return "";
}

// Contiguous groups of at least `t` each, left to right, a short remainder joining the last
// group: the most groups any contiguous grouping can reach, used when the greedy join of the
// thinnest group ends in a single group although a split into two or more exists.
std::vector<std::vector<std::size_t>> sweep_groups(const std::vector<double>& expected, double t) {
    std::vector<std::vector<std::size_t>> groups;
    std::vector<std::size_t> current;
    double sum = 0;
    for (std::size_t i = 0; i < expected.size(); ++i) {
        current.push_back(i);
        sum += expected[i];
        if (sum >= t) {
            groups.push_back(current);
            current.clear();
            sum = 0;
        }
    }
    if (!current.empty()) {
        if (groups.empty()) groups.push_back(current);
        else groups.back().insert(groups.back().end(), current.begin(), current.end());
    }
    return groups;
}

std::vector<std::vector<std::size_t>> ordered_greedy(const std::vector<double>& expected, MergeRule rule,
                                                     double minimum) {
    std::vector<std::vector<std::size_t>> groups;
    std::vector<double> sums;
    for (std::size_t i = 0; i < expected.size(); ++i) {
        groups.push_back({i});
        sums.push_back(expected[i]);
    }
    while (groups.size() > 1 && !merge_rule_holds(sums, rule, minimum)) {
        // thinnest group; ties go to the leftmost, so the result does not depend on luck
        const std::size_t g = static_cast<std::size_t>(std::min_element(sums.begin(), sums.end()) - sums.begin());
        std::size_t left;  // the pair (left, left + 1) is joined
        if (g == 0) left = 0;
        else if (g + 1 == groups.size()) left = g - 1;
        else left = sums[g - 1] <= sums[g + 1] ? g - 1 : g;  // smaller neighbour; a tie goes left
        groups[left].insert(groups[left].end(), groups[left + 1].begin(), groups[left + 1].end());
        sums[left] += sums[left + 1];
        groups.erase(groups.begin() + static_cast<std::ptrdiff_t>(left) + 1);
        sums.erase(sums.begin() + static_cast<std::ptrdiff_t>(left) + 1);
    }
    return groups;
}

// Pools the j thinnest cells (ascending expected count, ties by index) for the first j >= 2
// at which the rule holds; the pool is the last group. Empty when even pooling all but the
// largest cell fails.
std::vector<std::vector<std::size_t>> unordered_pool(const std::vector<double>& expected, MergeRule rule,
                                                     double minimum) {
    const std::size_t k = expected.size();
    std::vector<std::size_t> order(k);
    std::iota(order.begin(), order.end(), 0);
    std::stable_sort(order.begin(), order.end(),
                     [&](std::size_t a, std::size_t b) { return expected[a] < expected[b]; });
    for (std::size_t j = 2; j + 1 <= k; ++j) {
        std::vector<std::size_t> pool(order.begin(), order.begin() + static_cast<std::ptrdiff_t>(j));
        std::sort(pool.begin(), pool.end());
        std::vector<std::vector<std::size_t>> groups;
        std::vector<double> sums;
        std::vector<bool> pooled(k, false);
        for (std::size_t i : pool) pooled[i] = true;
        for (std::size_t i = 0; i < k; ++i)
            if (!pooled[i]) {
                groups.push_back({i});
                sums.push_back(expected[i]);
            }
        groups.push_back(pool);
        sums.push_back(compensated_sum(expected, pool));
        if (merge_rule_holds(sums, rule, minimum)) return groups;
    }
    return {};
}

}  // namespace

const char* merge_rule_name(MergeRule rule) {
    switch (rule) {
        case MergeRule::none: return "none";
        case MergeRule::all_at_least_5: return "all-5";
        case MergeRule::cochran: return "cochran";
        case MergeRule::custom_minimum: return "minimum";
    }
    return "none";
}

bool merge_rule_from_name(const std::string& name, MergeRule* rule) {
    for (MergeRule r : {MergeRule::none, MergeRule::all_at_least_5, MergeRule::cochran, MergeRule::custom_minimum})
        if (name == merge_rule_name(r)) {
            *rule = r;
            return true;
        }
    return false;
}

bool merge_rule_holds(const std::vector<double>& expected, MergeRule rule, double minimum) {
    std::size_t below_5 = 0, below_1 = 0;
    for (double e : expected) {
        if (e < 5) ++below_5;
        if (e < 1) ++below_1;
    }
    switch (rule) {
        case MergeRule::none: return true;
        case MergeRule::all_at_least_5: return below_5 == 0;
        case MergeRule::cochran: return cochran_rule_holds(expected.size(), below_5, below_1);
        case MergeRule::custom_minimum:
            return std::all_of(expected.begin(), expected.end(), [&](double e) { return e >= minimum; });
    }
    return false;
}

// Only expected counts steer the merging. A grouping chosen by looking at the observed counts
// depends on the data, so X^2 no longer follows its chi-square reference distribution: pooling
// cells because they look small (or large) in the sample hides or manufactures deviations and
// biases the test. The expected counts are fixed by the hypothesis before the data are seen.
Status merge_categories(const std::vector<std::string>& labels, const std::vector<double>& observed,
                        const std::vector<double>& expected, const MergeOptions& options, MergeResult* result) {
    *result = MergeResult{};
    const std::size_t k = observed.size();
    if (k < 2) return Status::failure("Merging needs at least two categories; there are " + std::to_string(k) + ".");
    if (expected.size() != k)
        return Status::failure("There are " + std::to_string(k) + " observed counts but " +
                               std::to_string(expected.size()) + " expected counts.");
    if (!labels.empty() && labels.size() != k)
        return Status::failure("There are " + std::to_string(labels.size()) + " labels but " + std::to_string(k) +
                               " counts.");
    std::vector<std::string> names(k);
    for (std::size_t i = 0; i < k; ++i) names[i] = labels.empty() ? std::to_string(i + 1) : labels[i];
    double expected_total = 0;
    for (std::size_t i = 0; i < k; ++i) {
        const double o = observed[i], e = expected[i];
        if (!std::isfinite(o) || o < 0 || o != std::floor(o) || o >= 9007199254740992.0)
            return Status::failure("The count for \"" + names[i] + "\" must be a non-negative whole number.");
        if (!std::isfinite(e) || e < 0)
            return Status::failure("The expected count for \"" + names[i] + "\" must be a non-negative number.");
        expected_total += e;
    }
    if (!(expected_total > 0)) return Status::failure("The expected counts are all zero.");
    if (options.rule == MergeRule::custom_minimum && !(std::isfinite(options.minimum) && options.minimum > 0))
        return Status::failure("The minimum expected count for merging must be a positive number.");

    std::vector<std::vector<std::size_t>> groups;
    bool swept = false;
    if (merge_rule_holds(expected, options.rule, options.minimum)) {
        for (std::size_t i = 0; i < k; ++i) groups.push_back({i});
    } else if (options.ordered) {
        groups = ordered_greedy(expected, options.rule, options.minimum);
        if (groups.size() < 2) {
            groups = sweep_groups(expected, group_threshold(options.rule, options.minimum));
            swept = true;
        }
    } else {
        groups = unordered_pool(expected, options.rule, options.minimum);
    }
    std::vector<double> sums;
    for (const auto& g : groups) sums.push_back(compensated_sum(expected, g));
    if (groups.size() < 2 || !merge_rule_holds(sums, options.rule, options.minimum)) {
        return Status::failure(
            "Merging cannot satisfy " + rule_phrase(options.rule, options.minimum) +
            " with at least two groups (the expected counts total " + format_significant(expected_total, 4) +
            std::string(options.ordered ? ", merged as neighbours" : ", pooled into one \"Other\" group") +
            "). Use an exact or Monte Carlo p-value instead.");
    }

    MergeResult& r = *result;
    r.groups = groups;
    r.categories = groups.size();
    std::string merged_list;
    for (std::size_t g = 0; g < groups.size(); ++g) {
        const auto& members = groups[g];
        double o = 0;
        for (std::size_t i : members) o += observed[i];  // whole numbers below 2^53: exact
        r.observed.push_back(o);
        r.expected.push_back(sums[g]);
        std::string label;
        if (members.size() == 1) {
            label = names[members[0]];
        } else if (options.ordered) {
            label = names[members.front()] + "\u2013" + names[members.back()];
        } else {
            label = "Other (";
            for (std::size_t j = 0; j < members.size(); ++j) label += (j ? ", " : "") + names[members[j]];
            label += ")";
        }
        if (members.size() > 1) {
            r.merged = true;
            merged_list += (merged_list.empty() ? "" : "; ") + label + " (expected " + format_significant(sums[g], 3) + ")";
        }
        r.labels.push_back(label);
    }
    if (r.merged) {
        r.note = "Merged " + std::to_string(k) + " categories into " + std::to_string(r.categories) + " to satisfy " +
                 rule_phrase(options.rule, options.minimum) + ", using expected counts only: " + merged_list +
                 ". The degrees of freedom are counted on the " + std::to_string(r.categories) + " groups (already done in the df shown).";
        if (swept)
            r.note += " (Joining the thinnest group repeatedly would have left a single group, so neighbours were "
                      "grouped left to right instead.)";
    }
    return Status::success();
}

Status join_categories(const std::vector<std::vector<std::size_t>>& groups, const std::vector<std::string>& names,
                       Analysis* a) {
    const std::size_t k = a->observed.size();
    if (a->categories.size() != k || names.size() != groups.size())
        return Status::failure("There are " + std::to_string(a->categories.size()) + " labels but " + std::to_string(k) + " counts.");
    if (groups.empty()) return Status::success();
    if (!a->model.edges.empty() && a->model.edges.size() == k + 1)
        return Status::failure("Bins of measurements cannot be joined: change the bins instead.");
    std::vector<std::size_t> joined_into(k, k);  // k: not joined
    for (std::size_t g = 0; g < groups.size(); ++g) {
        if (groups[g].size() < 2) return Status::failure("A category can only be joined with another.");
        for (std::size_t i : groups[g]) {
            if (i >= k || joined_into[i] != k) return Status::failure("The categories to join are not distinct categories of this analysis.");
            joined_into[i] = g;
        }
    }
    const bool per_category_values = a->model.values.size() == k;
    Analysis out = *a;
    out.categories.clear();
    out.observed.clear();
    if (per_category_values) out.model.values.clear();
    std::vector<bool> done(groups.size(), false);
    for (std::size_t i = 0; i < k; ++i) {
        const std::size_t g = joined_into[i];
        if (g == k) {
            out.categories.push_back(a->categories[i]);
            out.observed.push_back(a->observed[i]);
            if (per_category_values) out.model.values.push_back(a->model.values[i]);
            continue;
        }
        if (done[g]) continue;
        done[g] = true;
        double o = 0;
        for (std::size_t m : groups[g]) o += a->observed[m];  // whole numbers below 2^53: exact
        out.categories.push_back(names[g]);
        out.observed.push_back(o);
        if (per_category_values) out.model.values.push_back(compensated_sum(a->model.values, groups[g]));
    }
    *a = std::move(out);
    return Status::success();
}

}  // namespace tallyproof
