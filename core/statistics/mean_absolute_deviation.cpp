// Mean absolute deviation (Nigrini 2012, "Benford's Law", Wiley, ch. 7) and the
// band it falls in. Bands are by MAD alone, which does not grow with N the way chi-square does;
// that is Nigrini's reason for preferring it on large data sets.
#include "mean_absolute_deviation.hpp"

#include <cmath>
#include <cstdio>

namespace tallyproof {

const char* conformity_label(Conformity c) {
    switch (c) {
        case Conformity::close: return "Close conformity";
        case Conformity::acceptable: return "Acceptable conformity";
        case Conformity::marginal: return "Marginally acceptable conformity";
        case Conformity::nonconformity: return "Nonconformity";
        case Conformity::not_applicable: return "No conformity bands for this test";
    }
    return "";
}

bool conformity_cutoffs(DigitTest test, double cutoffs[3]) {
    // Nigrini (2012), Table 7.1, from memory.
    static const double first[3] = {0.006, 0.012, 0.015};
    static const double second[3] = {0.008, 0.010, 0.012};
    static const double first_two[3] = {0.0012, 0.0018, 0.0022};
    const double* c = test == DigitTest::first ? first
                    : test == DigitTest::second ? second
                    : test == DigitTest::first_two ? first_two : nullptr;
    if (!c) return false;
    for (int i = 0; i < 3; ++i) cutoffs[i] = c[i];
    return true;
}

MeanAbsoluteDeviation mean_absolute_deviation(const std::vector<double>& observed,
                                              const std::vector<double>& expected) {
    MeanAbsoluteDeviation r;
    r.label = conformity_label(Conformity::not_applicable);
    if (observed.empty() || observed.size() != expected.size()) {
        r.status = Status::failure("There are " + std::to_string(observed.size()) + " observed counts but " +
                                   std::to_string(expected.size()) + " expected shares.");
        return r;
    }
    double n = 0, e = 0;
    for (std::size_t i = 0; i < observed.size(); ++i) {
        char buf[120];
        if (!std::isfinite(observed[i]) || observed[i] < 0) {
            std::snprintf(buf, sizeof buf, "Observed count %g for digit %zu must be a non-negative number.", observed[i], i + 1);
            r.status = Status::failure(buf);
            return r;
        }
        if (!std::isfinite(expected[i]) || expected[i] < 0) {
            std::snprintf(buf, sizeof buf, "Expected share %g for digit %zu must be a non-negative number.", expected[i], i + 1);
            r.status = Status::failure(buf);
            return r;
        }
        n += observed[i];
        e += expected[i];
    }
    if (!(n > 0)) { r.status = Status::failure("The observed digit counts are all zero."); return r; }
    if (!(std::fabs(e - 1) <= 1e-9)) {
        char buf[120];
        std::snprintf(buf, sizeof buf, "The expected shares sum to %.12g, not 1.", e);
        r.status = Status::failure(buf);
        return r;
    }
    double s = 0;
    for (std::size_t i = 0; i < observed.size(); ++i) s += std::fabs(observed[i] / n - expected[i]);
    r.mad = s / static_cast<double>(observed.size());
    return r;
}

MeanAbsoluteDeviation mean_absolute_deviation(const std::vector<double>& observed, DigitTest test) {
    MeanAbsoluteDeviation r = mean_absolute_deviation(observed, digit_probabilities(test));
    if (!r.status.ok) return r;
    double c[3];
    if (conformity_cutoffs(test, c)) {
        r.band = r.mad <= c[0] ? Conformity::close
               : r.mad <= c[1] ? Conformity::acceptable
               : r.mad <= c[2] ? Conformity::marginal : Conformity::nonconformity;
    }
    r.label = conformity_label(r.band);
    return r;
}

}  // namespace tallyproof
