// AppState: everything the page knows, apart from how it is drawn. Inputs change through the
// functions below; results are recomputed in one place (recompute) and only read by drawing.
#pragma once
#include <string>
#include <string_view>

#include "analysis.hpp"
#include "density_curve.hpp"
#include "result.hpp"

namespace tallyproof::web {

struct AppState {
    // Inputs
    Analysis analysis;             // the analysis on screen (last valid input)
    std::string source_name;       // where the counts came from ("example", "pasted text")

    // Outputs, recomputed by recompute()
    Result result;
    DensityCurve curve;
    std::string report;            // plain-text results block (also mirrored into the page)

    // The last input that was refused: shown with its message while the previous analysis stays
    std::string rejected_text;
    std::string rejected_message;
    int rejected_line = 0;

    int frames_to_draw = 2;        // redraw budget: the page draws only on input or work
};

void load_example(AppState& s);                          // an invented starting example
void apply_paste(AppState& s, std::string_view text);    // parse; keep the old data if refused
void recompute(AppState& s);                             // result, curve and report from inputs

}  // namespace tallyproof::web
