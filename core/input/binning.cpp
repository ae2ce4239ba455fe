// Counts raw numbers into bins. Equal widths take two passes over the text (minimum and
// maximum first), and so do equal probabilities (the moments that fit the model first,
// equal_probability_bins), keeping memory independent of the number of values; a value on an
// inner edge goes to the bin above, the maximum into the last bin. Exact counts.
#include "binning.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "equal_probability_bins.hpp"
#include "number_format.hpp"

namespace tallyproof {
namespace {

std::string plain(double x, int digits = 6) { return format_general(x, digits); }  // inf, -inf as written

// The fewest significant digits (6 or more) that write neighbouring edges differently, so that
// every bin label is distinct (edges placed at quantiles can lie close together).
int label_digits(const std::vector<double>& edges) {
    for (int d = 6; d < 17; ++d) {
        bool distinct = true;
        for (std::size_t i = 0; i + 1 < edges.size() && distinct; ++i) distinct = plain(edges[i], d) != plain(edges[i + 1], d);
        if (distinct) return d;
    }
    return 17;
}

constexpr int kMaxBins = 10000;

// One raw value to count into bins; a cell that is not a number is a located problem.
bool read_value(std::string_view cell, int line, int column, ParsedInput* out, double* v) {
    const NumberReading n = read_number(cell, out->decimal);
    if (!n.ok) {
        add_problem(out, line, column,
                    cell_location(line, column) + quote_cell(cell) + " is not a number; expected a measurement.");
        return false;
    }
    *v = n.value;
    return true;
}

// Equal-width bins from the smallest to the largest value: their edges, or false (out->status).
bool equal_width_edges(const RawSource& src, const BinChoice& bins, ParsedInput* out, std::vector<double>* edges) {
    if (bins.bins < 1 || bins.bins > kMaxBins) {
        out->status = Status::failure("Equal-width bins: expected a number of bins from 1 to " +
                                      std::to_string(kMaxBins) + ", got " + std::to_string(bins.bins) + ".");
        return false;
    }
    double lo = HUGE_VAL, hi = -HUGE_VAL;
    const Status read = for_each_raw_cell(src, [&](std::string_view cell, int line, int column) {
        double v = 0;
        if (!read_value(cell, line, column, out, &v)) return out->problems.size() < kMaxProblems;
        lo = std::min(lo, v);
        hi = std::max(hi, v);
        return true;
    });
    if (!read.ok) add_problem(out, read.line, read.column, read.message);
    if (!out->status.ok) return false;
    if (!(lo < hi)) {
        out->status = Status::failure(lo == hi ? "All values are " + plain(lo) + ": equal-width bins need a spread of values."
                                               : "No values to count into bins.");
        return false;
    }
    edges->clear();
    for (int i = 0; i <= bins.bins; ++i) edges->push_back(lo + (hi - lo) * i / bins.bins);
    edges->back() = hi;
    out->notes.push_back(std::to_string(bins.bins) + " bins of equal width " + plain((hi - lo) / bins.bins) +
                         " from the smallest value " + plain(lo) + " to the largest " + plain(hi) + ".");
    return true;
}

// Equal-probability bins under the model (equal_probability_bins.hpp): their edges, or false.
bool equal_probability_edges(const RawSource& src, const BinChoice& bins, ParsedInput* out, std::vector<double>* edges) {
    const ModelKind kind = bins.model.value_or(ModelKind::normal);
    if (!places_equal_probability_bins(kind) || bins.bins < 2 || bins.bins > kMaxEqualProbabilityBins) {
        out->status = equal_probability_bins(kind, RawMoments{}, bins.parameters, bins.bins).status;
        return false;
    }
    RawMoments moments;
    const Status read = for_each_raw_cell(src, [&](std::string_view cell, int line, int column) {
        double v = 0;
        if (!read_value(cell, line, column, out, &v)) return out->problems.size() < kMaxProblems;
        if (kind == ModelKind::lognormal && !(v > 0)) {
            add_problem(out, line, column, cell_location(line, column) + quote_cell(cell) +
                                               " is not above 0; the lognormal model needs positive values.");
            return out->problems.size() < kMaxProblems;
        }
        if (kind == ModelKind::exponential && v < 0) {
            add_problem(out, line, column, cell_location(line, column) + quote_cell(cell) +
                                               " is negative; the exponential model needs values of 0 or more.");
            return out->problems.size() < kMaxProblems;
        }
        moments.add(kind == ModelKind::lognormal ? std::log(v) : v);
        return true;
    });
    if (!read.ok) add_problem(out, read.line, read.column, read.message);
    if (!out->status.ok) return false;
    EqualProbabilityBins placed = equal_probability_bins(kind, moments, bins.parameters, bins.bins);
    if (!placed.status.ok) {
        out->status = placed.status;
        return false;
    }
    *edges = std::move(placed.edges);
    if (!bins.model)
        out->notes.push_back("No continuous model was chosen, so the equal-probability bins are placed under the "
                             "normal model (lognormal and exponential can be chosen instead).");
    out->notes.push_back(placed.note);
    bool estimated = false;
    for (const auto& p : placed.parameters) estimated = estimated || p.estimated;
    if (estimated)
        out->notes.push_back("The test fits the estimated parameters again by maximum likelihood on the bin counts, "
                             "so each expected count is near, not exactly, N/" + std::to_string(bins.bins) +
                             ", and df = k − 1 − m (Moore and Spruill 1975).");
    out->bin_model = kind;
    out->bin_parameters = bins.parameters;
    return true;
}

}  // namespace

std::string bin_label(double lo, double hi, bool closed_right, int digits) {
    return "[" + plain(lo, digits) + ", " + plain(hi, digits) + (closed_right ? "]" : ")");
}

void count_into_bins(const RawSource& src, const BinChoice& bins, ParsedInput* out) {
    std::vector<double> edges = bins.edges;
    if (bins.kind == BinChoice::Kind::equal_width && !equal_width_edges(src, bins, out, &edges)) return;
    if (bins.kind == BinChoice::Kind::equal_probability && !equal_probability_edges(src, bins, out, &edges)) return;
    if (edges.size() < 2 || edges.size() > static_cast<std::size_t>(kMaxBins) + 1) {
        out->status = Status::failure("Bins: expected from 2 to " + std::to_string(kMaxBins + 1) + " edges, got " +
                                      std::to_string(edges.size()) + ".");
        return;
    }
    for (std::size_t i = 0; i + 1 < edges.size(); ++i)
        if (!(edges[i] < edges[i + 1])) {
            out->status = Status::failure("Bin edges must increase strictly: edge " + std::to_string(i + 2) + " (" +
                                          plain(edges[i + 1]) + ") does not exceed edge " + std::to_string(i + 1) +
                                          " (" + plain(edges[i]) + ").");
            return;
        }
    std::vector<double> counts(edges.size() - 1, 0.0);
    std::size_t values = 0;
    const Status read = for_each_raw_cell(src, [&](std::string_view cell, int line, int column) {
        double v = 0;
        if (!read_value(cell, line, column, out, &v)) return out->problems.size() < kMaxProblems;
        std::size_t b;
        if (v == edges.back()) b = counts.size() - 1;
        else {
            const auto it = std::upper_bound(edges.begin(), edges.end(), v);
            if (it == edges.begin() || it == edges.end()) {
                add_problem(out, line, column,
                            cell_location(line, column) + quote_cell(cell) + " is outside the bins (" + plain(edges.front()) +
                                " to " + plain(edges.back()) + "); expected a value inside, or open end edges -inf and inf.");
                return out->problems.size() < kMaxProblems;
            }
            b = static_cast<std::size_t>(it - edges.begin()) - 1;
        }
        counts[b] += 1;
        ++values;
        return true;
    });
    if (!read.ok) add_problem(out, read.line, read.column, read.message);
    if (!out->status.ok) return;
    out->edges = edges;
    out->ordered = true;
    const int digits = label_digits(edges);
    for (std::size_t i = 0; i < counts.size(); ++i) {
        out->categories.push_back(bin_label(edges[i], edges[i + 1], i + 1 == counts.size() && std::isfinite(edges[i + 1]), digits));
        out->observed.push_back(counts[i]);
    }
    out->notes.push_back("Counted " + std::to_string(values) + " raw numbers into " + std::to_string(counts.size()) +
                         " bins (each includes its lower edge; the last also its upper edge).");
}

}  // namespace tallyproof
