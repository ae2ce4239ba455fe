// Tallies raw observations as the text streams past. Digit tallies use digit_extraction's
// DigitCounter (Nigrini 2012 conventions) on the digits each number is written with, once
// read_number has accepted it, so that digits stay as written in every locale. Exact counting.
#include "raw_observations.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numeric>
#include <unordered_map>

#include "digit_extraction.hpp"
#include "number_format.hpp"
#include "plain_number_lines.hpp"

namespace tallyproof {
namespace {

std::string plain(double x) { return format_general(x, 15); }

std::string fold_ascii(std::string_view s) {
    std::string f(s);
    for (char& c : f)
        if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
    return f;
}

constexpr double kMaxWholeRange = 1000;  // whole-number categories min..max at most this many
constexpr long long kSmallWhole = 1024;  // whole numbers 0..1023 are counted in an array

// A cell written as plain digits with an optional minus ("12", "-3"; at most 15 digits, so
// below the 1e15 limit and exact): its value, as read_number would give it, without the
// general reader. False for every other form, which read_number then reads.
bool plain_whole(std::string_view cell, long long* value) {
    std::size_t i = !cell.empty() && cell[0] == '-' ? 1 : 0;
    const std::size_t digits = cell.size() - i;
    if (digits == 0 || digits > 15) return false;
    long long v = 0;
    for (; i < cell.size(); ++i) {
        const unsigned d = static_cast<unsigned char>(cell[i]) - static_cast<unsigned>('0');
        if (d > 9) return false;
        v = v * 10 + static_cast<long long>(d);
    }
    *value = cell[0] == '-' ? -v : v;  // "-0" is 0, as static_cast<long long>(-0.0)
    return true;
}

}  // namespace

void tally_raw_text(const RawSource& src, const ParseOptions& options, ParsedInput* out) {
    std::unordered_map<std::string, std::size_t> index;
    std::size_t values = 0;
    std::string key;
    const Status read = for_each_raw_cell(src, [&](std::string_view cell, int line, int column) {
        key = options.case_fold ? fold_ascii(cell) : std::string(cell);
        auto it = index.find(key);
        if (it == index.end()) {
            if (out->categories.size() >= kMaxCategories) {
                add_problem(out, line, column,
                            cell_location(line, column) + quote_cell(cell) + " would be category " +
                                std::to_string(kMaxCategories + 1) + "; expected at most " +
                                std::to_string(kMaxCategories) + " different values.");
                return false;
            }
            index.emplace(key, out->categories.size());
            out->categories.emplace_back(valid_utf8(cell) ? std::string(cell) : utf8_or_replacement(cell));
            out->observed.push_back(1);
        } else {
            out->observed[it->second] += 1;
        }
        ++values;
        return true;
    });
    if (!read.ok) add_problem(out, read.line, read.column, read.message);
    if (!out->status.ok) return;
    if (options.sorted) {
        std::vector<std::size_t> order(out->categories.size());
        std::iota(order.begin(), order.end(), 0);
        std::sort(order.begin(), order.end(),
                  [&](std::size_t a, std::size_t b) { return out->categories[a] < out->categories[b]; });
        std::vector<std::string> c;
        std::vector<double> o;
        for (std::size_t i : order) { c.push_back(std::move(out->categories[i])); o.push_back(out->observed[i]); }
        out->categories = std::move(c);
        out->observed = std::move(o);
    }
    out->notes.push_back("Read " + std::to_string(values) + " raw text values and tallied them into " +
                         std::to_string(out->categories.size()) + " categories" +
                         (options.case_fold ? " (upper and lower case counted together)" : "") +
                         (options.sorted ? ", in sorted order." : ", in order of first appearance."));
}

void tally_raw_whole_numbers(const RawSource& src, const ParseOptions&, ParsedInput* out) {
    std::unordered_map<long long, double> tally;
    std::vector<std::size_t> small(kSmallWhole, 0);  // counts of 0..kSmallWhole-1, the usual values, without hashing
    std::size_t values = 0;
    const Status read = for_each_raw_cell(src, [&](std::string_view cell, int line, int column) {
        long long v = 0;
        if (!plain_whole(cell, &v)) {
            const NumberReading n = read_number(cell, out->decimal);
            if (!n.ok || n.percent || n.value != std::floor(n.value) || std::fabs(n.value) > 1e15) {
                add_problem(out, line, column,
                            cell_location(line, column) + quote_cell(cell) +
                                " is not a whole number; raw observations here must all be whole numbers.");
                return out->problems.size() < kMaxProblems;
            }
            v = static_cast<long long>(n.value);
        }
        if (v >= 0 && v < kSmallWhole) ++small[static_cast<std::size_t>(v)];
        else tally[v] += 1;
        ++values;
        return true;
    });
    if (!read.ok) add_problem(out, read.line, read.column, read.message);
    if (!out->status.ok) return;
    for (long long v = 0; v < kSmallWhole; ++v)
        if (small[static_cast<std::size_t>(v)] > 0) tally[v] += static_cast<double>(small[static_cast<std::size_t>(v)]);
    if (tally.empty()) return;
    long long lo = tally.begin()->first, hi = lo;
    for (const auto& [v, c] : tally) { lo = std::min(lo, v); hi = std::max(hi, v); }
    const double span = static_cast<double>(hi) - static_cast<double>(lo) + 1;
    if (span > kMaxWholeRange) {
        out->status = Status::failure("The whole numbers run from " + std::to_string(lo) + " to " + std::to_string(hi) +
                                      ", which would make " + plain(span) + " categories; expected at most " +
                                      plain(kMaxWholeRange) + ": count them into bins instead.");
        return;
    }
    std::size_t filled = 0;
    for (long long v = lo; v <= hi; ++v) {
        const auto it = tally.find(v);
        out->categories.push_back(std::to_string(v));
        out->observed.push_back(it == tally.end() ? 0 : it->second);
        if (it == tally.end()) ++filled;
    }
    out->ordered = true;
    out->notes.push_back("Read " + std::to_string(values) + " raw whole numbers as ordered categories " +
                         std::to_string(lo) + " to " + std::to_string(hi) +
                         (filled ? " (" + std::to_string(filled) + " value" + (filled == 1 ? "" : "s") +
                                       " in between never occur" + (filled == 1 ? "s and has" : " and have") + " count 0)."
                                 : "."));
}

void tally_raw_digits(const RawSource& src, DigitTest test, ParsedInput* out) {
    DigitCounter counter(test);
    std::pair<int, int> first_where[kDigitExclusionReasons] = {};  // line and column of the first value left out, per reason
    const DecimalMark mark = out->decimal;
    if (plain_lines_serve(counter, mark)) {  // plain-number lines on the fast path, the same counts (plain_number_lines.hpp)
        std::size_t ends = 0;
        const Status read = count_digit_lines(src, mark, 0, &counter, first_where, &ends);
        const DigitTally total = counter.tally();
        if (!read.ok) { add_problem(out, read.line, read.column, read.message); return; }
        put_digit_tally(total, first_where, test, out);
        return;
    }
    const Status read = for_each_raw_cell(src, [&](std::string_view cell, int line, int column) {
        const int why = counter.add_cell(cell, mark);
        if (why >= 0 && first_where[why].first == 0) first_where[why] = {line, column};  // lines count from 1
        return true;
    });
    const DigitTally total = counter.tally();
    if (!read.ok) { add_problem(out, read.line, read.column, read.message); return; }
    put_digit_tally(total, first_where, test, out);
}

void put_digit_tally(const DigitTally& total, const std::pair<int, int>* first_where, DigitTest test, ParsedInput* out) {
    out->digit_test = test;
    out->ordered = true;
    for (std::size_t i = 0; i < total.digits.size(); ++i) {
        out->categories.push_back(std::to_string(total.digits[i]));
        out->observed.push_back(total.counts[i]);
    }
    out->notes.push_back("Read " + std::to_string(total.values) + " raw numbers for the " + digit_test_name(test) +
                         " test; " + std::to_string(total.used) + " are counted.");
    for (std::size_t w = 0; w < total.excluded.size(); ++w) {
        if (total.excluded[w] == 0) continue;
        out->notes.push_back(std::to_string(total.excluded[w]) + " value" + (total.excluded[w] == 1 ? "" : "s") +
                             " left out: " + digit_exclusion_name(static_cast<DigitExclusion>(w)) + " (first at line " +
                             std::to_string(first_where[w].first) + ", column " + std::to_string(first_where[w].second) +
                             ").");
    }
    if (total.used == 0)
        out->status = Status::failure("None of the " + std::to_string(total.values) + " values can be used for the " +
                                      digit_test_name(test) + " test.");
}

}  // namespace tallyproof
