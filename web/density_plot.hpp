// The density plot: the chi-square density of the result's df with the rejection region beyond
// the critical value shaded and the observed statistic marked with its tail area.
#pragma once
#include <imgui.h>

#include <string>

#include "chi_square_density_curve.hpp"
#include "result.hpp"
#include "theme.hpp"

namespace tallyproof::web {

// The test the curve shows: the result's statistic, df and critical value, or for survey data the
// design-corrected test the verdict rests on (second order where available, else first order).
struct CurveTest {
    double statistic = 0, df = 0, critical = 0;
    std::string symbol;      // "χ²", or "corrected χ²"
    std::string title_note;  // "" or " (design-corrected: ...)"
};
CurveTest curve_test(const Result& result);

void draw_density_plot(const DensityCurve& curve, const Result& result, ImVec2 size, const Theme& theme);

}  // namespace tallyproof::web
