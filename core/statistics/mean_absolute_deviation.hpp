// Mean absolute deviation of observed digit shares from a digit law, with Nigrini's conformity
// bands (Nigrini 2012, "Benford's Law", Wiley, Table 7.1; the cut-offs are quoted from memory).
// MAD = (1/K) sum_i |observed share_i - expected share_i| over the K digits. Exact to rounding.
#pragma once
#include <vector>

#include "digit_laws.hpp"
#include "status.hpp"

namespace tallyproof {

enum class Conformity {
    close,           // close conformity
    acceptable,      // acceptable conformity
    marginal,        // marginally acceptable conformity
    nonconformity,   // nonconformity
    not_applicable,  // no published bands for this test (last-digit tests)
};

const char* conformity_label(Conformity c);  // "Close conformity", ...

// The three cut-offs (close / acceptable / marginal upper limits) for a test, or false when
// Nigrini gives none. First digit 0.006, 0.012, 0.015; second 0.008, 0.010, 0.012; first two
// 0.0012, 0.0018, 0.0022. A MAD equal to a cut-off belongs to the better band.
bool conformity_cutoffs(DigitTest test, double cutoffs[3]);

struct MeanAbsoluteDeviation {
    Status status;
    double mad = 0;
    Conformity band = Conformity::not_applicable;
    const char* label = "";
};

// MAD of observed counts (one per digit_values(test) entry) against digit_probabilities(test).
MeanAbsoluteDeviation mean_absolute_deviation(const std::vector<double>& observed_counts, DigitTest test);

// MAD of observed counts against any expected shares (same length, summing to 1); no band.
MeanAbsoluteDeviation mean_absolute_deviation(const std::vector<double>& observed_counts,
                                              const std::vector<double>& expected_shares);

}  // namespace tallyproof
