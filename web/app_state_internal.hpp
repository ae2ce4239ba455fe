// The transitions the feature files of AppState share (app_state.cpp, session_state.cpp,
// handover.cpp, groups_state.cpp); the page's drawing code uses app_state.hpp only.
#pragma once
#include <string>

#include "app_state.hpp"

namespace tallyproof::web {

// session_state.cpp
void set_notice(AppState& s, const std::string& text);    // the notice line (storage refused said first)
void publish(AppState& s);                                 // the result is due for publishing and keeping
void remember(AppState& s, const std::string& document);   // autosave now: tab slot, latest, recent list
std::string new_analysis_id();

// app_state.cpp
void clear_refusal(AppState& s);                           // forget the refused paste and its message

}  // namespace tallyproof::web
