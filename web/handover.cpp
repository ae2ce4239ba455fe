// Handing the result over: the write-up and table copied, the analysis file and the table
// downloaded, chart images queued for export and print.
#include "app_state.hpp"
#include "result_workbook.hpp"
#include "app_state_internal.hpp"

#include <algorithm>

#include "page_bridge.hpp"
#include "table_export.hpp"
#include "writeup.hpp"

namespace tallyproof::web {

void copy_writeup(AppState& s, bool sentence_only) {
    WriteupOptions o;
    o.style = static_cast<WriteupStyle>(s.handover.writeup_style);
    o.decimal_comma = s.handover.decimal_comma;
    copy_text(sentence_only ? writeup_sentence(s.analysis, s.result, o) : writeup(s.analysis, s.result, o));
}

void copy_table(AppState& s) {
    copy_text(category_table(s.result, TableExportOptions{TableFormat::tsv, s.handover.decimal_comma, false}));
}

void download_document(AppState& s) {
    download_text("tallyproof-analysis.json", "application/json", analysis_document(s));
    set_notice(s, "Analysis file downloaded.");
}

void download_workbook(AppState& s) {
    const std::string bytes = result_workbook(s.analysis, s.result);
    if (bytes.empty()) return;
    download_bytes("tallyproof-categories.xlsx", "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet", bytes);
    set_notice(s, "Workbook downloaded (.xlsx): the per-category table and the write-up's numbers.");
}

void download_table(AppState& s) {
    download_text("tallyproof-categories.csv", "text/csv", category_table(s.result, TableExportOptions{TableFormat::csv, s.handover.decimal_comma, false}));
    set_notice(s, "Per-category table downloaded (CSV).");
}

void queue_chart_export(AppState& s, ResultTab chart, int purpose) {
    s.handover.exports.push_back(ChartExport{chart, purpose});
    s.view.frames_to_draw = std::max(s.view.frames_to_draw, 3);
}

void request_print(AppState& s) {
    if (s.groups.open && s.groups.opened < 0) {  // a screen: its funnel chart (main.cpp prints_screen)
        queue_chart_export(s, ResultTab::funnel, static_cast<int>(ImagePurpose::print));
    } else {
        queue_chart_export(s, ResultTab::curve, static_cast<int>(ImagePurpose::print));
        queue_chart_export(s, ResultTab::bars, static_cast<int>(ImagePurpose::print));
    }
    s.handover.print_pending = true;
}

}  // namespace tallyproof::web
