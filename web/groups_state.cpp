// The Groups view's transitions: a screen read from a paste or a document, its settings, the
// table's order, and opening one group as a single analysis with the screen kept behind it.
#include "groups_state.hpp"

#include <algorithm>
#include <cmath>

#include "analysis_document.hpp"
#include "app_state.hpp"
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

}  // namespace

void show_groups_place(const AppState& s) {
    const GroupsView& v = s.groups;
    std::string order = "[";
    for (std::size_t i = 0; v.open && i < v.order.size(); ++i) order += (i ? "," : "") + std::to_string(v.order[i]);
    publish_groups_view(v.open && v.opened < 0, order + "]", group_banner(s));
}

namespace {

void publish_screen(AppState& s) {
    GroupsView& v = s.groups;
    v.report = v.result.status.ok ? screen_report_text(v.result) : "Not screened: " + v.result.status.message + "\n";
    publish_result(v.report, screen_json(v.base, v.counts, v.result), write_analysis_document(s.analysis));
}

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
    s.demo_index = -1;
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
    s.source_name = "pasted groups";
    s.analysis_id.clear();  // a new entry in the recent list, not the analysis before it
    start(s, std::move(counts), s.groups.open ? s.groups.choice : ScreenChoice{});
    return true;
}

bool open_groups_document(AppState& s, const GroupedCounts& counts, const ScreenChoice& choice) {
    if (!counts.status.ok || counts.groups.size() < 2) return false;
    s.groups.text.clear();
    s.groups.read = GroupReadOptions{};
    s.source_name = "opened document";
    start(s, counts, choice);
    return true;
}

void recompute_groups(AppState& s) {
    GroupsView& v = s.groups;
    if (!v.open) return;
    v.base = s.analysis;  // its model, statistic, merging and p-value settings; counts are each group's own
    v.result = screen_groups(v.base, v.counts, v.choice);
    v.funnel = screen_funnel(v.result);
    order_rows(v);
    if (v.opened < 0) publish_screen(s);
    show_groups_place(s);
    s.frames_to_draw = 3;
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

void sort_groups(AppState& s, GroupColumn column, bool ascending) {
    s.groups.sort = column;
    s.groups.ascending = ascending;
    order_rows(s.groups);
    show_groups_place(s);
    s.frames_to_draw = 3;
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
    s.source_name = "group " + v.counts.groups[static_cast<std::size_t>(group)];
    sync_editor_from_model(s);
    s.tab = ResultTab::categories;  // where it differs: the first question about a flagged group
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
    s.source_name = "pasted groups";
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
    copy_text(group_table(s.groups.result, TableExportOptions{TableFormat::tsv, s.decimal_comma, false}));
    publish_notice("Groups table copied (TSV).");
}

void download_groups_table(AppState& s) {
    if (!s.groups.result.status.ok) return;
    download_text("tallyproof-groups.csv", "text/csv", group_table(s.groups.result, TableExportOptions{TableFormat::csv, s.decimal_comma, false}));
    publish_notice("Groups table downloaded (CSV).");
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
