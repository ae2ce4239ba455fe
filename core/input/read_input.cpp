// The reading policy of read_input.hpp: one sample first; a refused text tried as groups; a read
// one also tried as groups, to offer; the expected mix kept only while it fits the new counts.
#include "read_input.hpp"

#include <algorithm>

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

void start_input_read(std::string_view text, const ParseOptions& parse, const ReadInputOptions& options, InputReadJob* job) {
    { InputReadJob fresh; std::swap(*job, fresh); }
    job->text = text;
    job->parse = parse;
    job->options = options;
    if (options.groups == GroupsReading::always) {
        GroupReadOptions read = options.group;
        read.parse = parse;
        start_grouped_text(text, read, &job->groups);
        job->stage = InputReadStage::groups_only;
        return;
    }
    start_paste_reading(text, parse, &job->sample);
}

namespace {
// The groups reader started on the rows the one-sample reader split, when it split them all
// and the two split alike; else on the text.
void start_groups(InputReadJob& j, const GroupReadOptions& read, std::vector<TableRow> rows) {
    if (!rows.empty() && splits_alike(j.parse, read.parse)) start_grouped_rows(std::move(rows), j.result.sample.separator, read, &j.groups);
    else start_grouped_text(j.text, read, &j.groups);
}
}  // namespace

bool step_input_read(InputReadJob* job, std::size_t budget) {
    InputReadJob& j = *job;
    if (j.done) return true;
    InputReading& out = j.result;
    switch (j.stage) {
        case InputReadStage::sample: {
            if (!step_paste_reading(&j.sample, budget)) return false;
            out.sample = std::move(j.sample.out);
            std::vector<TableRow> rows = std::move(j.sample.rows);  // every row of the text, when the one-sample reader split them all
            { PasteReading spent; std::swap(j.sample, spent); }
            out.status = out.sample.status;
            if (out.status.ok) {
                out.kind = InputKind::sample;
                // The same text may also read as groups (a wide table of two categories): offered, not chosen.
                if (j.options.groups == GroupsReading::automatic && j.options.offer_groups && j.text.size() <= kMaxOfferedGroupsBytes) {
                    start_groups(j, GroupReadOptions{}, std::move(rows));
                    j.stage = InputReadStage::offered_groups;
                    return false;
                }
                j.done = true;
                return true;
            }
            // Not one sample, but perhaps many. Bins the user set keep their refusal: it belongs to them.
            if (j.options.groups == GroupsReading::never || out.sample.shape == InputShape::raw_bins) { j.done = true; return true; }
            GroupReadOptions read;
            read.parse = j.parse;
            start_groups(j, read, std::move(rows));
            j.stage = InputReadStage::refused_groups;
            return false;
        }
        case InputReadStage::offered_groups: {
            if (!step_grouped_rows(&j.groups, budget)) return false;
            GroupedCounts& offered = j.groups.out;
            out.groups_offered = offered.status.ok && offered.groups.size() >= 2;
            if (out.groups_offered) out.groups = std::move(offered);
            break;
        }
        case InputReadStage::refused_groups: {
            if (!step_grouped_rows(&j.groups, budget)) return false;
            GroupedCounts groups = taken_as_groups(std::move(j.groups.out));
            if (groups.status.ok) {
                out.kind = InputKind::groups;
                out.groups = std::move(groups);
            } else if (groups.group_problem) {
                // A table of groups refused for its groups (one group, an empty or missing group
                // cell): the groups reader's message, the one `tallyproof --by` gives, says what is wrong.
                out.status = groups.status;
            }
            break;
        }
        case InputReadStage::groups_only: {
            if (!step_grouped_rows(&j.groups, budget)) return false;
            out.groups = std::move(j.groups.out);
            out.status = out.groups.status;
            out.kind = out.status.ok ? InputKind::groups : InputKind::refused;
            break;
        }
    }
    { GroupedRowsJob spent; std::swap(j.groups, spent); }
    j.done = true;
    return true;
}

double input_read_fraction(const InputReadJob& j) {
    if (j.done) return 1.0;
    // The one-sample reading's split is most of the work when it splits the whole table; the
    // groups' reading follows it.
    if (j.stage == InputReadStage::sample) {
        const std::size_t size = j.sample.text.size();
        return size == 0 ? 0.0 : 0.3 * static_cast<double>(paste_reading_offset(j.sample)) / static_cast<double>(size);
    }
    if (j.stage == InputReadStage::groups_only) return grouped_rows_fraction(j.groups);
    return std::min(0.99, 0.3 + 0.7 * grouped_rows_fraction(j.groups));
}

InputReading read_input(std::string_view text, const ParseOptions& parse, const ReadInputOptions& options) {
    InputReadJob job;
    start_input_read(text, parse, options, &job);
    while (!step_input_read(&job, 0)) {}
    return std::move(job.result);
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
