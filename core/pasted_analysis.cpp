// Mapping from the detected paste (paste_parser) to the analysis document's model kinds.
#include "pasted_analysis.hpp"

#include "null_model.hpp"

namespace tallyproof {

bool apply_pasted_input(const ParsedInput& parsed, Analysis* a) {
    a->categories = parsed.categories;
    a->observed = parsed.observed;
    a->ordered = parsed.ordered;
    if (!parsed.expected.empty() && parsed.expected_kind != ExpectedKind::none) {
        a->model = Model{};
        a->model.kind = parsed.expected_kind == ExpectedKind::ratios   ? ModelKind::ratio
                        : parsed.expected_kind == ExpectedKind::counts ? ModelKind::counts
                                                                       : ModelKind::shares;
        a->model.values = parsed.expected;
        return true;
    }
    if (parsed.digit_test) {
        a->model = Model{};
        a->model.kind = model_kind_of(*parsed.digit_test);
        return true;
    }
    if (parsed.bin_model) {  // equal-probability bins: the model that placed them, with explicit edges
        a->model = Model{};
        a->model.kind = *parsed.bin_model;
        a->model.parameters = parsed.bin_parameters;
        a->model.edges = parsed.edges;
        return true;
    }
    if (!parsed.edges.empty()) a->model.edges = parsed.edges;
    return false;
}

}  // namespace tallyproof
