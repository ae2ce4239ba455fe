// The Groups view's transitions: a screen read from a paste or a document, its settings, the
// table's order, and opening one group as a single analysis with the screen kept behind it.
#include "groups_state.hpp"
#include "screen_workbook.hpp"

#include <emscripten.h>

#include <algorithm>
#include <cmath>

#include "analysis_document.hpp"
#include "app_state.hpp"
#include "app_state_internal.hpp"
#include "number_format.hpp"
#include "page_bridge.hpp"
#include "read_input.hpp"
#include "screen_report.hpp"
#include "table_export.hpp"

namespace tallyproof::web {
namespace {

// What every group shares (categories, order, digit law, bin edges) set on the analysis the
// groups are tested with; a stated mix that no longer fits the categories gives way to equal
// shares (apply_groups_mix, the rule of a one-sample paste too).
void share_categories(const GroupedCounts& counts, Analysis* a) {
    apply_groups_mix(counts, a);
    a->conformity = ConformityChoice{};  // a screen finds departures; conformity is a question for one sample
}

// The pooled counts of every group: the single analysis shown beside the screen.
std::vector<double> pooled(const GroupedCounts& c) {
    std::vector<double> total(c.categories.size(), 0.0);
    for (std::size_t g = 0; g < c.groups.size(); ++g)
        for (std::size_t j = 0; j < total.size(); ++j) total[j] += c.count(g, j);
    return total;
}

double sort_key(const GroupRow& g, GroupColumn column) {
    switch (column) {
        case GroupColumn::n: return g.n;
        case GroupColumn::statistic: return g.statistic;
        case GroupColumn::df: return g.df;
        case GroupColumn::p: return g.p.log10_p;
        case GroupColumn::q: return g.q.log10_p;
        case GroupColumn::w: return g.w;
        case GroupColumn::flag: return g.flagged ? 0 : 1;  // flagged first when ascending
        case GroupColumn::name: break;
    }
    return 0;
}

void order_rows(GroupsView& v) {
    const auto& rows = v.result.groups;
    v.order.resize(rows.size());
    for (std::size_t i = 0; i < rows.size(); ++i) v.order[i] = static_cast<int>(i);
    std::stable_sort(v.order.begin(), v.order.end(), [&](int a, int b) {
        const GroupRow& x = rows[static_cast<std::size_t>(a)];
        const GroupRow& y = rows[static_cast<std::size_t>(b)];
        if (x.tested != y.tested) return x.tested;  // groups not tested stay last either way
        if (v.sort == GroupColumn::name) return v.ascending ? x.name < y.name : y.name < x.name;
        const double kx = sort_key(x, v.sort), ky = sort_key(y, v.sort);
        return v.ascending ? kx < ky : ky < kx;
    });
}

const char* const kColumnNames[] = {"name", "n", "statistic", "df", "p", "q", "w", "flag"};  // GroupColumn's order

}  // namespace

std::string screen_document(const AppState& s) {
    const GroupsView& v = s.groups;
    ScreenView view;
    view.sort = kColumnNames[static_cast<int>(v.sort)];
    view.ascending = v.ascending;
    if (v.opened >= 0 && static_cast<std::size_t>(v.opened) < v.counts.groups.size())
        view.opened = v.counts.groups[static_cast<std::size_t>(v.opened)];
    // The analysis on the page carries the settings (changed while a group is open, they apply to
    // every group on the way back); the groups carry the counts.
    return write_screen_document(s.analysis, v.counts, v.choice, view);
}

std::string screen_title(const AppState& s) {
    const GroupsView& v = s.groups;
    std::string t = format_count(static_cast<double>(v.counts.groups.size())) + " groups";
    if (!v.result.model_description.empty()) t += " · " + v.result.model_description;
    if (v.result.status.ok) t += " · " + format_count(static_cast<double>(v.result.flagged)) + " flagged";
    if (v.opened >= 0 && static_cast<std::size_t>(v.opened) < v.counts.groups.size())
        t += " · group " + v.counts.groups[static_cast<std::size_t>(v.opened)] + " open";
    return t;
}

void apply_screen_view(AppState& s, const ScreenView& view) {
    GroupsView& v = s.groups;
    if (!v.open) return;
    bool ascending = view.ascending;
    GroupColumn column = GroupColumn::q;
    bool known = false;
    for (int i = 0; i < 8; ++i)
        if (view.sort == kColumnNames[i]) { column = static_cast<GroupColumn>(i); known = true; }
    if (!known) ascending = true;  // input order: q ascending is the table's own first order
    sort_groups(s, column, ascending);
    if (view.opened.empty()) return;
    for (std::size_t g = 0; g < v.counts.groups.size(); ++g)
        if (v.counts.groups[g] == view.opened) { open_group(s, static_cast<int>(g)); return; }
}

void show_groups_place(const AppState& s) {
    const GroupsView& v = s.groups;
    std::string order = "[";
    for (std::size_t i = 0; v.open && i < v.order.size(); ++i) order += (i ? "," : "") + std::to_string(v.order[i]);
    publish_groups_view(v.open && v.opened < 0, order + "]", group_banner(s));
}

namespace {

constexpr std::size_t kSpokenRows = 2000;

void publish_screen(AppState& s) { s.session.due_publish = Session::Publish::screen; }

}  // namespace

void publish_screen_now(AppState& s, const std::string& document) {
    GroupsView& v = s.groups;
    v.report = !v.result.status.ok ? "Not screened: " + v.result.status.message + "\n"
               : v.result.groups.size() <= kSpokenRows ? screen_report_text(v.result) : std::string();
    // The live region reads out the screen; above kSpokenRows groups its table of every group would
    // cost the page seconds of layout for text no one listens through: the write-up (summary,
    // flagged groups with their drivers, cautions) then, and the whole table by Copy or Download.
    std::string spoken = v.report;
    if (v.result.status.ok && v.result.groups.size() > kSpokenRows)  // (v.report is then left empty)
        spoken = screen_writeup(v.result) + "The table of all " + format_grouped(static_cast<std::uint64_t>(v.result.groups.size())) +
                 " groups: Copy table (TSV) or Download table (CSV).\n";
    publish_result(spoken, screen_json(v.base, v.counts, v.result, nullptr, screen_listed_whole(s)), document);
}

bool screen_listed_whole(const AppState& s) { return s.groups.counts.groups.size() <= kListedGroups; }

bool screen_kept_whole(const AppState& s) {
    return s.groups.counts.groups.size() * s.groups.counts.categories.size() <= kKeptScreenCells;
}

std::string screen_rows_json(const AppState& s, std::size_t start, std::size_t count) {
    const GroupsView& v = s.groups;
    std::vector<std::size_t> at;
    for (std::size_t i = start; i < v.order.size() && i < start + count; ++i) at.push_back(v.order[i]);
    return screen_group_rows_json(v.counts, v.result, at);
}

namespace {

// Opens the screen on `counts` (already read), testing with the analysis on screen's settings.
void start(AppState& s, GroupedCounts counts, const ScreenChoice& choice) {
    GroupsView& v = s.groups;
    v.counts = std::move(counts);
    v.choice = choice;
    v.open = true;
    v.opened = -1;
    v.offered = false;
    s.analysis.merge = MergeChoice{};
    // Each group by the asymptotic p-value (a thin group still gets an exact or simulated one,
    // screen_groups): an exact p for each of thousands of groups would hold the page for seconds.
    s.analysis.pvalue.method = PValueMethod::asymptotic;
    share_categories(v.counts, &s.analysis);
    s.analysis.observed = pooled(v.counts);
    s.view.demo_index = -1;
    s.merge_undo.clear();
    sync_editor_from_model(s);
    recompute(s);  // the pooled counts as one analysis, then the screen (recompute_groups)
}

}  // namespace

bool open_groups(AppState& s, const std::string& text, const GroupReadOptions& options, std::string* why) {
    GroupedCounts counts = read_grouped_text(text, options);
    if (!counts.status.ok || counts.groups.size() < 2) {
        if (why) *why = counts.status.ok ? "Only one group was found: a screen needs at least two." : counts.status.message;
        return false;
    }
    return open_groups_read(s, text, options, std::move(counts));
}

bool open_groups_read(AppState& s, const std::string& text, const GroupReadOptions& options, GroupedCounts counts) {
    if (!counts.status.ok || counts.groups.size() < 2) return false;
    s.groups.text = text;
    s.groups.read = options;
    s.reading.source_name = "pasted groups";
    s.session.analysis_id.clear();  // a new entry in the recent list, not the analysis before it
    start(s, std::move(counts), s.groups.open ? s.groups.choice : ScreenChoice{});
    return true;
}

bool open_groups_document(AppState& s, const GroupedCounts& counts, const ScreenChoice& choice) {
    if (!counts.status.ok || counts.groups.size() < 2) return false;
    s.groups.text.clear();
    s.groups.read = GroupReadOptions{};
    s.reading.source_name = "opened document";
    start(s, counts, choice);
    return true;
}

namespace {

constexpr std::uint64_t kFirstScreenSlice = 16000;  // work units (a group by the short path: 8)

// The finished job's screen shown, sorted, published and kept.
void finish_screen(AppState& s) {
    GroupsView& v = s.groups;
    v.screening = false;
    v.result = std::move(v.job.result);
    v.job = ScreenJob{};
    v.funnel = screen_funnel(v.result);
    order_rows(v);
    if (v.opened < 0) publish_screen(s);
    show_groups_place(s);
    keep_analysis(s);  // titled with the flags just found
    set_progress(1, false);
    s.view.frames_to_draw = 3;
}

}  // namespace

void drop_screen_job(AppState& s) {
    if (!s.groups.screening) return;
    cancel_screen_job(&s.groups.job);
    s.groups.job = ScreenJob{};
    s.groups.screening = false;
}

void recompute_groups(AppState& s) {
    GroupsView& v = s.groups;
    if (!v.open) return;
    drop_screen_job(s);
    v.base = s.analysis;  // its model, statistic, merging and p-value settings; counts are each group's own
    start_screen_job_on(v.base, v.counts, v.choice, &v.job);  // v.counts stays as it is while the job runs
    const WorkProgress p = step_screen_job(&v.job, kFirstScreenSlice);  // a small screen is done here
    if (p.done) { finish_screen(s); return; }
    // The rest in the page's work tasks (step_screen); the table waits for the whole screen, as
    // the q-values of every group depend on all p-values.
    v.screening = true;
    v.result = ScreenResult{};
    v.result.status = Status::failure("testing " + format_grouped(static_cast<std::uint64_t>(v.counts.groups.size())) + " groups…");
    v.funnel = ScreenFunnel{};
    v.order.clear();
    if (v.opened < 0) publish_screen(s);
    show_groups_place(s);
    set_progress(p.fraction, true);
    start_work_loop();
    s.view.frames_to_draw = 3;
}

void step_screen(AppState& s, double budget_ms) {
    GroupsView& v = s.groups;
    if (!v.screening) return;
    WorkProgress p;
    run_slices(budget_ms, kFirstScreenSlice, 1048576, [&](std::uint64_t units) {
        p = step_screen_job(&v.job, units);
        return p.done || p.cancelled;
    });
    if (p.done) { finish_screen(s); return; }
    set_progress(p.fraction, true);
}

void cancel_screen(AppState& s) {
    GroupsView& v = s.groups;
    if (!v.screening) return;
    const double fraction = v.job.progress.fraction;
    drop_screen_job(s);
    v.result = ScreenResult{};
    v.result.status = Status::failure("cancelled at " + std::to_string(static_cast<int>(100 * fraction)) + "% of " +
                                      format_grouped(static_cast<std::uint64_t>(v.counts.groups.size())) +
                                      " groups. Change a setting to screen them again, or read them as one sample.");
    if (v.opened < 0) publish_screen(s);
    show_groups_place(s);
    set_progress(fraction, false);
    publish_notice("Screen cancelled.");
    s.view.frames_to_draw = 3;
}

void set_screen_choice(AppState& s, const ScreenChoice& choice) {
    if (!(choice.q > 0 && choice.q < 1)) {
        s.input_error = "The false discovery level q must lie between 0 and 1, such as 0.05.";
        publish_error(s.input_error);
        return;
    }
    s.groups.choice = choice;
    recompute_groups(s);
}

void merge_look_alike_groups(AppState& s) {
    GroupsView& v = s.groups;
    if (!v.open || v.counts.look_alike_groups.empty()) return;
    const GroupedCounts& c = v.counts;
    const std::size_t k = c.categories.size();
    std::vector<int> into(c.groups.size(), -1);  // the group each joins (-1: itself)
    for (const auto& set : c.look_alike_groups)
        for (std::size_t i = 1; i < set.size(); ++i) into[set[i]] = static_cast<int>(set[0]);
    GroupedCounts joined = c;
    joined.groups.clear();
    joined.group_lines.clear();
    joined.counts.clear();
    joined.look_alike_groups.clear();
    std::vector<std::size_t> at(c.groups.size(), 0);  // index in `joined` of each kept group
    for (std::size_t g = 0; g < c.groups.size(); ++g) {
        if (into[g] >= 0) continue;
        at[g] = joined.groups.size();
        joined.groups.push_back(c.groups[g]);
        if (g < c.group_lines.size()) joined.group_lines.push_back(c.group_lines[g]);
        for (std::size_t j = 0; j < k; ++j) joined.counts.push_back(c.count(g, j));
    }
    std::size_t merged = 0;
    for (std::size_t g = 0; g < c.groups.size(); ++g) {
        if (into[g] < 0) continue;
        ++merged;
        const std::size_t to = at[static_cast<std::size_t>(into[g])];
        for (std::size_t j = 0; j < k; ++j) joined.counts[to * k + j] += c.count(g, j);
    }
    const std::string look = group_look_alike_note(c.groups, c.look_alike_groups);
    joined.notes.erase(std::remove(joined.notes.begin(), joined.notes.end(), look), joined.notes.end());
    if (joined.groups.size() < 2) {
        s.input_error = "Joining the look-alike groups would leave one group: a screen needs at least two.";
        publish_error(s.input_error);
        return;
    }
    const ScreenChoice choice = v.choice;
    v.counts = std::move(joined);
    v.text.clear();  // the groups no longer are the paste as read: a new reading would split them again
    v.opened = -1;
    set_screen_choice(s, choice);
    publish_notice(std::to_string(merged) + (merged == 1 ? " group joined" : " groups joined") +
                   " to the group its name looks like; their counts are added.");
}

void sort_groups(AppState& s, GroupColumn column, bool ascending) {
    s.groups.sort = column;
    s.groups.ascending = ascending;
    order_rows(s.groups);
    show_groups_place(s);
    keep_analysis(s);  // the order is part of the screen as saved
    s.view.frames_to_draw = 3;
}

void open_group(AppState& s, int group) {
    GroupsView& v = s.groups;
    if (!v.open || group < 0 || static_cast<std::size_t>(group) >= v.counts.groups.size()) return;
    const std::size_t k = v.counts.categories.size();
    Analysis a = v.base;
    a.categories = v.counts.categories;
    a.observed.assign(v.counts.counts.begin() + static_cast<std::ptrdiff_t>(group * k),
                      v.counts.counts.begin() + static_cast<std::ptrdiff_t>((group + 1) * k));
    v.opened = group;
    s.analysis = a;
    s.reading.source_name = "group " + v.counts.groups[static_cast<std::size_t>(group)];
    sync_editor_from_model(s);
    s.view.tab = ResultTab::categories;  // where it differs: the first question about a flagged group
    if (!recompute(s)) publish_error(s.input_error);
    show_groups_place(s);
}

void back_to_groups(AppState& s) {
    GroupsView& v = s.groups;
    if (!v.open || v.opened < 0) return;
    v.opened = -1;
    Analysis a = s.analysis;  // settings changed while the group was open apply to every group
    a.observed = pooled(v.counts);
    a.categories = v.counts.categories;
    s.analysis = a;
    s.reading.source_name = "pasted groups";
    recompute(s);
}

void leave_groups(AppState& s) {
    if (!s.groups.open) return;
    s.groups = GroupsView{};
    recompute(s);
    show_groups_place(s);
}

void copy_screen_summary(AppState& s) {
    if (!s.groups.result.status.ok) return;
    copy_text(screen_writeup(s.groups.result));
    publish_notice("Screen summary copied.");
}

void copy_groups_table(AppState& s) {
    if (!s.groups.result.status.ok) return;
    copy_text(group_table(s.groups.result, TableExportOptions{TableFormat::tsv, s.handover.decimal_comma, false}));
    publish_notice("Groups table copied (TSV).");
}

void download_groups_table(AppState& s) {
    if (!s.groups.result.status.ok) return;
    download_text("tallyproof-groups.csv", "text/csv", group_table(s.groups.result, TableExportOptions{TableFormat::csv, s.handover.decimal_comma, false}));
    publish_notice("Groups table downloaded (CSV).");
}

void download_groups_workbook(AppState& s) {
    if (!s.groups.result.status.ok) return;
    const std::string bytes = screen_workbook(s.groups.result);
    if (bytes.empty()) return;
    download_bytes("tallyproof-groups.xlsx", "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet", bytes);
    publish_notice("Groups workbook downloaded (.xlsx).");
}

std::string group_banner(const AppState& s) {
    const GroupsView& v = s.groups;
    if (!v.open || v.opened < 0 || static_cast<std::size_t>(v.opened) >= v.result.groups.size()) return "";
    const GroupRow& g = v.result.groups[static_cast<std::size_t>(v.opened)];
    std::string t = "Group " + g.name + " (" + std::to_string(v.opened + 1) + " of " + std::to_string(v.result.groups.size()) + " in the screen): ";
    if (!g.tested) return t + "not tested. " + g.note;
    t += g.flagged ? "flagged" : "not flagged";
    t += ", q = " + format_probability(g.q) + " (" + screen_level_phrase(v.result.choice) + ").";
    return t;
}

}  // namespace tallyproof::web
