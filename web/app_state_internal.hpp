// The transitions the feature files of AppState share (app_state.cpp, session_state.cpp,
// handover.cpp, groups_state.cpp); the page's drawing code uses app_state.hpp only.
#pragma once
#include <emscripten.h>

#include <algorithm>
#include <cstdint>
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

// One work task of a sliced job (a p-value, a reading, a screen): `step(units)` runs until about
// `budget_ms` have passed, a first slice of `first` units, then slices sized from the measured
// rate to fill what is left, each at most twice the one before (units differ in cost between a
// job's phases). `step` returns true when the job is over (done or cancelled).
template <class Step>
void run_slices(double budget_ms, std::uint64_t first, std::uint64_t largest, Step step) {
    const double until = emscripten_get_now() + budget_ms;
    double slice = static_cast<double>(first);
    for (;;) {
        const double t0 = emscripten_get_now();
        if (step(static_cast<std::uint64_t>(slice))) return;
        const double now = emscripten_get_now(), left = until - now, took = now - t0;
        if (left <= 0.5) return;
        const double rate = slice / std::max(took, 0.05);  // units per ms
        slice = std::clamp(std::min(rate * left * 0.8, 2.0 * slice), std::min(100.0, static_cast<double>(first)),
                           static_cast<double>(largest));
    }
}

}  // namespace tallyproof::web
