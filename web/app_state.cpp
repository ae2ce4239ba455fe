// AppState transitions. Nothing here draws; the page bridge is told about each new result.
#include "app_state.hpp"

#include "goodness_of_fit.hpp"
#include "page_bridge.hpp"
#include "paste_parser.hpp"
#include "report.hpp"

namespace tallyproof::web {

void load_example(AppState& s) {
    // Invented example: help-desk tickets opened on each weekday of one month.
    s.analysis = Analysis{};
    s.analysis.categories = {"Monday", "Tuesday", "Wednesday", "Thursday", "Friday"};
    s.analysis.observed = {58, 44, 47, 39, 52};
    s.source_name = "example: help-desk tickets by weekday";
    s.rejected_text.clear();
    s.rejected_message.clear();
    recompute(s);
}

void apply_paste(AppState& s, std::string_view text) {
    const ParsedCounts parsed = parse_counts(text);
    if (!parsed.status.ok) {
        s.rejected_text = std::string(text.substr(0, 4000));
        s.rejected_message = parsed.status.message;
        s.rejected_line = parsed.status.line;
        publish_error(s.rejected_message);
        s.frames_to_draw = 3;
        return;
    }
    Analysis next = s.analysis;
    next.categories = parsed.categories;
    next.observed = parsed.observed;
    const Result trial = analyse(next);
    if (!trial.status.ok) {
        s.rejected_text = std::string(text.substr(0, 4000));
        s.rejected_message = trial.status.message;
        s.rejected_line = trial.status.line;
        publish_error(s.rejected_message);
        s.frames_to_draw = 3;
        return;
    }
    s.analysis = std::move(next);
    s.source_name = "pasted text";
    s.rejected_text.clear();
    s.rejected_message.clear();
    s.rejected_line = 0;
    recompute(s);
}

void recompute(AppState& s) {
    s.result = analyse(s.analysis);
    if (s.result.status.ok)
        s.curve = density_curve(s.result.df, s.result.critical_value, s.result.statistic);
    else
        s.curve = DensityCurve{};
    s.report = report_text(s.analysis, s.result);
    publish_result(s.report, report_json(s.analysis, s.result));
    s.frames_to_draw = 3;
}

}  // namespace tallyproof::web
