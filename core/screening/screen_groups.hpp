// Screening many groups at once: each group's counts tested against the chosen model (fitted
// parameters estimated per group, by the one-sample engine of goodness_of_fit.hpp) or against
// the pooled counts of all other groups (Pearson's test of homogeneity of a 2 x k table, df
// k - 1, as SciPy's chi2_contingency without correction), then the p-values adjusted across
// groups: Benjamini-Hochberg (1995) q-values by default, Holm, Bonferroni or none
// (multiplicity.hpp). A flag is a reason to look closer, never proof.
#pragma once
#include <cstdint>
#include <string>
#include <vector>

#include "analysis.hpp"
#include "grouped_table.hpp"
#include "multiplicity.hpp"
#include "result.hpp"
#include "work_slice.hpp"

namespace tallyproof {

enum class ScreenAgainst { model, rest };
const char* screen_against_name(ScreenAgainst against);                           // "model", "rest"
bool screen_against_from_name(const std::string& name, ScreenAgainst* against);  // false if unknown

struct ScreenChoice {
    ScreenAgainst against = ScreenAgainst::model;
    MultiplicityMethod adjust = MultiplicityMethod::benjamini_hochberg;
    double q = 0.05;  // a group is flagged when its adjusted p (q-value) is at most q
};

struct GroupDriver {
    std::string category;
    std::string direction;      // "more than expected", "fewer than expected"
    double observed = 0, expected = 0;
    double adjusted_residual = 0;
};

struct GroupRow {
    std::string name;
    int line = 0;                    // where the group first appears in a paste (0 for documents)
    double n = 0;                    // the group's total count
    bool tested = false;             // false: `note` says why (no counts, a refused fit...)
    double statistic = 0, df = 0;
    TailProbability p;               // the p-value of the method below
    PValueMethod method = PValueMethod::asymptotic;
    TailProbability q;               // adjusted across the tested groups
    double w = 0;                    // w of this group corrected for chance, √(max(0, X² − df)/N) (as a single analysis reports it)
    double cohen_w = 0;              // Cohen's uncorrected √(X²/N), kept for reference
    bool digits = false;             // digit law: MAD and its band are set
    double mad = 0;
    std::string band;
    bool thin = false;               // expected counts too small for the asymptotic test
    bool flagged = false;            // q <= ScreenChoice::q
    std::vector<GroupDriver> drivers;  // flagged groups: the categories driving the departure
    std::string note;                // validity, p-value method or why not tested
};

struct ScreenResult {
    Status status;
    ScreenChoice choice;
    std::vector<std::string> categories;
    std::string model_description;   // "the stated mix", "Benford's first-digit law", "the other groups"
    std::string statistic_symbol;    // "χ²", "G²", ...
    std::vector<GroupRow> groups;    // in input order
    std::size_t tested = 0, flagged = 0, thin = 0;
    std::vector<std::string> notes;
    std::vector<std::string> cautions;
};

// The screen in slices, as the exact and Monte Carlo jobs run (work_slice.hpp): the page tests a
// few thousand groups a slice with progress and cancel. A step does about `budget` units (a group
// totalled: 1; tested by the short path or against the rest: 8; by the whole single analysis: 200);
// the finished job's result is bit-identical to screen_groups' (the same operations in the same order).
struct ScreenJob {
    Analysis base;
    GroupedCounts counts;            // the groups screened (the job's own copy)...
    const GroupedCounts* viewed = nullptr;  // ...or the caller's (start_screen_job_on)
    ScreenChoice choice;
    ScreenResult result;             // complete when progress.done (a refusal: result.status)
    WorkProgress progress;
    // The run's state.
    std::vector<double> pooled, shares;
    double total = 0, draws_left = 0;
    std::vector<unsigned char> quick;         // tested by the short path
    std::vector<std::size_t> flagged_quick;   // ...and flagged: their drivers come next
    std::size_t next = 0;
    int phase = 0;                   // -1 totalling groups, 0 testing them, 1 drivers of flagged groups, 2 done
    bool cancel_requested = false;
};
void start_screen_job(const Analysis& base, GroupedCounts counts, const ScreenChoice& choice, ScreenJob* job);
// The same on the caller's counts, not a copy (100,000 groups copied hold a page for a tenth of a
// second): they must outlive the job and stay unchanged while it runs.
void start_screen_job_on(const Analysis& base, const GroupedCounts& counts, const ScreenChoice& choice, ScreenJob* job);
WorkProgress step_screen_job(ScreenJob* job, std::uint64_t budget);
void cancel_screen_job(ScreenJob* job);   // the next step reports cancelled; no result

// Screens every group of `counts` with the settings of `base` (model, statistic, merging,
// p-value method; its categories and observed counts are ignored). A thin group (Cochran's rule
// fails) gets an exact p-value, or a Monte Carlo one when exact enumeration is too costly, when
// testing against the model; against the rest it is marked thin. Never throws.
ScreenResult screen_groups(const Analysis& base, const GroupedCounts& counts, const ScreenChoice& choice);

}  // namespace tallyproof
