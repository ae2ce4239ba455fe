// Reports of a Result: the plain-text block shown beside the chart and mirrored into the page's
// live region, the one-line verdict, and the JSON result document.
#pragma once
#include <string>

#include "analysis.hpp"
#include "json_writer.hpp"
#include "result.hpp"

namespace tallyproof {

std::string verdict_sentence(const Result& r);                 // decision at alpha, in words
// The conformity test's verdict: "The counts conform to the stated mix within w < 0.10 (p = 0.0003)." or
// "Conformity within w < 0.10 is not shown; with N = 120 the data allow only w < 0.26." ("" when not asked).
std::string conformity_verdict(const Result& r);
// What the goal asks, first: the conformity verdict when conformity was asked for and tested,
// else verdict_sentence. The page's headline, the write-up and JSON "answer" lead with it.
std::string headline_verdict(const Result& r);
std::string method_phrase(const Result& r);                    // "asymptotic", "exact", "Monte Carlo, B = ..."
std::string report_text(const Analysis& a, const Result& r);   // multi-line plain text
std::string design_report_text(const Result& r);               // the survey design's lines ("" without one)
std::string report_json(const Analysis& a, const Result& r);   // result document (one line)
// Opens a result document: format, version and, for a refusal, its error, line and column.
// Returns false for a refusal (the caller adds what it wants and closes the object).
bool begin_result_document(JsonWriter& j, const Status& status);

}  // namespace tallyproof
