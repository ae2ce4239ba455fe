// Analysis: the value type describing one goodness-of-fit analysis (the input side of the
// analysis document): categories with observed counts, the expected mix and the test settings.
#pragma once
#include <string>
#include <vector>

namespace tallyproof {

enum class ModelKind {
    equal,   // every category equally likely
    shares,  // stated shares (fractions or percentages), rescaled to sum 1
    ratio,   // ratios such as 9:3:3:1
    counts,  // expected counts, rescaled to the observed total when they differ by rounding
};

const char* model_kind_name(ModelKind kind);                       // "equal", "shares", ...
bool model_kind_from_name(const std::string& name, ModelKind* kind);  // false if unknown

struct Model {
    ModelKind kind = ModelKind::equal;
    std::vector<double> values;  // shares / ratio terms / expected counts, one per category
};

struct Analysis {
    std::vector<std::string> categories;  // labels, one per category
    std::vector<double> observed;         // non-negative whole counts
    bool ordered = false;                 // categories have a natural order
    Model model;
    double alpha = 0.05;                  // significance level of the decision
};

}  // namespace tallyproof
