// Reading a text as a whole: whether it is one sample, the counts of many groups, or refused, and
// which expected mix goes with the counts read. The one policy of the page and the command-line
// tool; the readers it calls are parse_input (one sample, paste_parser.hpp) and
// read_grouped_text (groups, grouped_table.hpp). Common practice for pasted tables; every rule
// is stated in a comment where it is applied.
#pragma once
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include "analysis.hpp"
#include "grouped_table.hpp"
#include "parsed_input.hpp"
#include "paste_parser.hpp"

namespace tallyproof {

enum class GroupsReading {
    never,      // one sample only (the tool without --groups)
    automatic,  // one sample; refused as one sample but read as a long or wide table of two or more
                // groups: groups (raw values with a group column are never chosen, only offered:
                // a typo in a count column would otherwise read as text to tally)
    always,     // groups only (the tool's --groups)
};

constexpr std::size_t kMaxOfferedGroupsBytes = 1u << 20;  // larger texts are not also tried as groups

struct ReadInputOptions {
    GroupsReading groups = GroupsReading::automatic;
    GroupReadOptions group;  // how groups are read (GroupsReading::always); its `parse` is ignored
    bool offer_groups = true;  // a text read as one sample is also tried as groups, with default options
};

enum class InputKind { sample, groups, refused };

struct InputReading {
    InputKind kind = InputKind::refused;
    ParsedInput sample;           // the one-sample reading (its status: why it was refused), unless GroupsReading::always
    GroupedCounts groups;         // InputKind::groups: the groups read; or, with groups_offered, the groups offered
    bool groups_offered = false;  // read as one sample, and the same text also reads as two or more groups
    Status status;                // !ok when refused: the one-sample refusal, or the groups' own when the text is a table of
                                  // groups refused for its groups (group_problem; GroupsReading::always: always the groups')
};

// Reads `text` (decoded, UTF-8) as the policy above says, with `parse` for one sample (and for raw
// values of groups). The text is split into rows once: the groups offered beside a one-sample
// reading are read from the rows the one-sample reader split, when it split them all.
InputReading read_input(std::string_view text, const ParseOptions& parse, const ReadInputOptions& options = {});

// read_input in steps, for a caller that must stay responsive (the page reading a long table of
// 100,000 groups): the text split and read a budget of rows per step (PasteReading, then
// GroupedRowsJob). The same operations in the same order as read_input, which runs it to the end,
// so the same reading. `text` must outlive the job.
enum class InputReadStage {
    sample,         // read as one sample
    offered_groups, // ...read, and tried as groups to offer beside it
    refused_groups, // ...refused, and tried as groups
    groups_only,    // GroupsReading::always
};

struct InputReadJob {
    InputReading result;  // complete when `done`
    bool done = false;
    // The run's state.
    std::string_view text;
    ParseOptions parse;
    ReadInputOptions options;
    InputReadStage stage = InputReadStage::sample;
    PasteReading sample;
    GroupedRowsJob groups;
};
void start_input_read(std::string_view text, const ParseOptions& parse, const ReadInputOptions& options, InputReadJob* job);
// About `budget` rows split or read (0: all); true when done (then job->result is the reading).
bool step_input_read(InputReadJob* job, std::size_t budget);
// Share of the reading done, in [0, 1): for progress.
double input_read_fraction(const InputReadJob& job);

// The groups tried when a text is refused as one sample (GroupsReading::automatic): status ok
// only when it reads as a long or wide table of two or more groups. `parse` as for read_input.
// For a caller that refuses a one-sample reading itself after read_input accepted it.
GroupedCounts read_refused_as_groups(std::string_view text, const ParseOptions& parse);

// Whether `model` can be the expected mix of `categories` new categories whose paste states no
// mix: equal shares always; shares, ratios, counts and a previous sample with one value per
// category; never a digit law or a fitted distribution (they belong to the counts they were
// chosen for).
bool mix_fits_new_counts(const Model& model, std::size_t categories);

// Puts a reading into `a`: its categories, counts and order (apply_pasted_input, labels
// normalised, notes added to `notes`). The expected mix: the one the paste states (an expected
// or previous-sample column, a digit tally's law, the model of equal-probability bins); else the
// mix already in `a` when it still fits (mix_fits_new_counts); else equal shares. Bin edges go
// with the counts they made; other readings leave none. The rest of `a` is kept. Returns true
// when the paste stated the mix.
bool apply_input_mix(const ParsedInput& parsed, Analysis* a, std::vector<std::string>* notes = nullptr);

// The same for groups: the categories, order, digit law and bin edges every group shares (no counts).
bool apply_groups_mix(const GroupedCounts& groups, Analysis* a);

}  // namespace tallyproof
