// From a read paste to an analysis: the counts, their order, and the expected mix the paste
// itself states (an expected column, a previous sample's column, or the digit law of a digit tally).
#pragma once
#include "analysis.hpp"
#include "parsed_input.hpp"

namespace tallyproof {

// Puts the paste's categories, counts and order into `a`. An expected column sets a shares,
// ratio or counts model, a previous sample's column the reference-sample model (its counts as
// the values); a digit tally sets its digit law; bin edges go to the model, and
// equal-probability bins also set the model that placed them (kind, given parameters, edges).
// The rest of `a` (test settings) is kept. Returns true when the paste set the model.
// Labels are normalised (label_text.hpp); labels that are the same text in two Unicode forms
// become one category, said in a sentence added to `notes` when given.
bool apply_pasted_input(const ParsedInput& parsed, Analysis* a, std::vector<std::string>* notes = nullptr);

}  // namespace tallyproof
