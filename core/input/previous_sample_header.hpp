// Previous-sample headers: whether the header of a pasted table's third column (label,
// observed, third) names an earlier sample of the same categories, such as "Last month",
// "Baseline" or "Control", rather than expected values. The words are listed in
// previous_sample_header.cpp and in docs/analysis-document.md ("Comparison with a previous
// sample"); matching is by whole words, ASCII case-insensitive. Common practice for spreadsheet
// headers, not a standard.
#pragma once
#include <string>

namespace tallyproof {

// True when `third_head` names a previous sample. `count_head` (the observed column's header,
// may be empty) lets two headers that both name a period or a sample ("2024 survey", "2023
// survey") count as two samples. A header that also names expected values ("Expected",
// "Share", "%", "Model", ...) is never a previous sample.
bool names_previous_sample(const std::string& third_head, const std::string& count_head);

}  // namespace tallyproof
