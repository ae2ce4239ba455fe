// Label text: how a category label is kept and compared. Labels are normalised to Unicode NFC
// (UAX #15, computed by utf8proc 2.8 for Unicode 15.0) and every character that draws nothing
// (Unicode's Default_Ignorable_Code_Point, such as U+200B zero-width space and the direction
// controls U+202A..U+202E, U+2066..U+2069; C0/C1 controls; U+2028, U+2029) is written visibly as
// "<U+XXXX>", so no label hides a character and every view and export shows the same text.
// Labels that look the same (equal once such characters are dropped, case folded and surrounding
// spaces trimmed) are found for the user to merge.
#pragma once
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace tallyproof {

std::string nfc_text(std::string_view utf8);             // Unicode NFC; bytes that are not UTF-8 become U+FFFD
std::string normalised_label(std::string_view raw);       // NFC, invisible characters as <U+XXXX>
bool draws_nothing(char32_t code_point);                   // shown as <U+XXXX> in a label
std::string look_alike_key(std::string_view label);       // equal for labels that look the same
std::string look_alike_name(std::string_view label);      // the label without invisible codes and surrounding spaces

// Groups (of two or more, indices ascending, in order of their first member) of `keys` that are equal.
std::vector<std::vector<std::size_t>> equal_groups(const std::vector<std::string>& keys);
// Groups of labels that look the same (equal look_alike_key).
std::vector<std::vector<std::size_t>> look_alike_groups(const std::vector<std::string>& labels);

// The labels of one group quoted and listed: "A", "a" and "A<U+200B>" (each cut to 40 bytes).
std::string quoted_labels(const std::vector<std::string>& labels, const std::vector<std::size_t>& group);
// One plain sentence naming up to three groups of look-alike labels (empty when there are none).
std::string look_alike_warning(const std::vector<std::string>& labels, const std::vector<std::vector<std::size_t>>& groups);

// Normalises every label in place; returns the groups of labels that became equal (the same text
// in different Unicode forms), to be joined into one category each.
std::vector<std::vector<std::size_t>> normalise_labels(std::vector<std::string>* labels);

}  // namespace tallyproof
