// The reading policy of read_input.hpp: one sample first; a refused text tried as groups; a read
// one also tried as groups, to offer; the expected mix kept only while it fits the new counts.
#include "read_input.hpp"

#include "paste_parser.hpp"
#include "pasted_analysis.hpp"

namespace tallyproof {
namespace {

// A long or wide table of two or more groups is what GroupsReading::automatic takes for groups;
// anything else keeps the one-sample refusal (status not ok).
GroupedCounts taken_as_groups(GroupedCounts g) {
    if (g.status.ok && (g.groups.size() < 2 || g.shape == GroupShape::raw_values))
        g.status = Status::failure("Not a long or wide table of two or more groups.");
    return g;
}

// The options a one-sample reading and a groups reading share, and whether the two readers split
// the text the same way: the groups reader picks the separator without the one-sample reader's
// hint that numbers are expected (digits, bins, a decimal comma).
bool splits_alike(const ParseOptions& sample, const ParseOptions& groups) {
    if (sample.separator != groups.separator) return false;
    if (sample.separator) return true;
    const bool numbers_expected = sample.digits || sample.bins.kind != BinChoice::Kind::none ||
                                  (sample.decimal && *sample.decimal == DecimalMark::comma);
    return !numbers_expected;
}

}  // namespace

GroupedCounts read_refused_as_groups(std::string_view text, const ParseOptions& parse) {
    GroupReadOptions read;
    read.parse = parse;
    return taken_as_groups(read_grouped_text(text, read));
}

InputReading read_input(std::string_view text, const ParseOptions& parse, const ReadInputOptions& options) {
    InputReading out;
    if (options.groups == GroupsReading::always) {
        GroupReadOptions read = options.group;
        read.parse = parse;
        out.groups = read_grouped_text(text, read);
        out.status = out.groups.status;
        out.kind = out.status.ok ? InputKind::groups : InputKind::refused;
        return out;
    }
    std::vector<TableRow> rows;  // every row of the text, when the one-sample reader split them all
    out.sample = parse_input(text, parse, &rows);
    out.status = out.sample.status;
    if (out.status.ok) {
        out.kind = InputKind::sample;
        // The same text may also read as groups (a wide table of two categories): offered, not chosen.
        if (options.groups == GroupsReading::automatic && options.offer_groups && text.size() <= kMaxOfferedGroupsBytes) {
            const GroupReadOptions defaults;
            GroupedCounts offered = !rows.empty() && splits_alike(parse, defaults.parse)
                                        ? read_grouped_rows(std::move(rows), out.sample.separator, defaults)
                                        : read_grouped_text(text, defaults);
            out.groups_offered = offered.status.ok && offered.groups.size() >= 2;
            if (out.groups_offered) out.groups = std::move(offered);
        }
        return out;
    }
    // Not one sample, but perhaps many. Bins the user set keep their refusal: it belongs to them.
    if (options.groups == GroupsReading::never || out.sample.shape == InputShape::raw_bins) return out;
    GroupReadOptions read;
    read.parse = parse;
    GroupedCounts groups = taken_as_groups(!rows.empty() && splits_alike(parse, read.parse)
                                               ? read_grouped_rows(std::move(rows), out.sample.separator, read)
                                               : read_grouped_text(text, read));
    if (groups.status.ok) {
        out.kind = InputKind::groups;
        out.groups = std::move(groups);
    } else if (groups.group_problem) {
        // A table of groups refused for its groups (one group, an empty or missing group cell):
        // the groups reader's message, the one `tallyproof --by` gives, says what is wrong.
        out.status = groups.status;
    }
    return out;
}

bool mix_fits_new_counts(const Model& model, std::size_t categories) {
    const ModelKind kind = model.kind;
    if (model_is_digit_law(kind) || model_is_fitted(kind)) return false;
    if (kind == ModelKind::shares || kind == ModelKind::ratio || kind == ModelKind::counts ||
        kind == ModelKind::reference_sample)
        return model.values.size() == categories;
    return true;
}

namespace {
// A mix the user stated value by value, one value per category.
bool mix_is_per_category(ModelKind kind) {
    return kind == ModelKind::shares || kind == ModelKind::ratio || kind == ModelKind::counts ||
           kind == ModelKind::reference_sample;
}
}  // namespace

bool apply_input_mix(const ParsedInput& parsed, Analysis* a, std::vector<std::string>* notes) {
    const std::vector<std::string> before = a->categories;  // the counts being replaced
    const bool stated = apply_pasted_input(parsed, a, notes);
    if (stated) return true;
    // A mix stated value by value belongs to its categories: new counts with other categories
    // (other labels, or another number of them) start from equal shares, and the notice says so;
    // the same categories keep it, and the notice says that too.
    const bool per_category = mix_is_per_category(a->model.kind);
    const bool other_categories = !before.empty() && before != a->categories;
    if (!mix_fits_new_counts(a->model, a->categories.size()) || (per_category && other_categories)) {
        if (per_category && !before.empty() && notes)
            notes->push_back(std::string("The expected mix stated before (") + model_kind_name(a->model.kind) +
                             ") was for other categories, so the new counts are tested against equal shares: "
                             "state their own mix under Expected mix.");
        a->model = Model{};
    } else if (per_category && !before.empty() && notes) {
        notes->push_back(std::string("The expected mix stated before (") + model_kind_name(a->model.kind) +
                         ") is kept: the new counts have the same categories.");
    }
    a->model.edges = parsed.edges;  // bin edges go with the counts they made
    return false;
}

bool apply_groups_mix(const GroupedCounts& groups, Analysis* a) {
    ParsedInput shared;  // what the groups share: categories, order, digit law, bin edges
    shared.categories = groups.categories;
    shared.ordered = groups.ordered;
    shared.digit_test = groups.digit_test;
    shared.edges = groups.edges;
    return apply_input_mix(shared, a);
}

}  // namespace tallyproof
