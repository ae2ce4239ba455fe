// Mapping from the detected paste (paste_parser) to the analysis document's model kinds.
#include "pasted_analysis.hpp"

#include "fit_category_values.hpp"
#include "label_text.hpp"
#include "null_model.hpp"

namespace tallyproof {
namespace {

// Labels that are consecutive whole numbers (0, 1, 2, ... or ranges such as "5 or more" that
// follow on) have a natural order, as "Categories are in order" means.
bool consecutive_whole_numbers(const std::vector<std::string>& labels) {
    std::vector<IntegerBin> bins;
    return labels.size() >= 2 && integer_bins_from_labels(labels, &bins).ok;
}

bool take_paste(const ParsedInput& parsed, Analysis* a) {
    a->categories = parsed.categories;
    a->observed = parsed.observed;
    a->ordered = parsed.ordered || consecutive_whole_numbers(parsed.categories);
    if (!parsed.expected.empty() && parsed.expected_kind != ExpectedKind::none) {
        a->model = Model{};
        a->model.kind = parsed.expected_kind == ExpectedKind::ratios            ? ModelKind::ratio
                        : parsed.expected_kind == ExpectedKind::counts          ? ModelKind::counts
                        : parsed.expected_kind == ExpectedKind::previous_sample ? ModelKind::reference_sample
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

}  // namespace

bool apply_pasted_input(const ParsedInput& parsed, Analysis* a, std::vector<std::string>* notes) {
    const bool model_set = take_paste(parsed, a);
    // The one point where pasted labels enter an analysis (documents: read_analysis_document).
    const auto same = normalise_labels(&a->categories);
    if (same.empty()) return model_set;
    std::vector<std::string> names;
    for (const auto& g : same) names.push_back(a->categories[g.front()]);
    if (join_categories(same, names, a).ok && notes)
        notes->push_back("\"" + names.front().substr(0, 60) + "\"" + (same.size() > 1 ? " and other labels are" : " is") +
                         " written in more than one Unicode form (such as é as one character or as e and an accent): "
                         "each is counted as one category.");
    return model_set;
}

}  // namespace tallyproof
