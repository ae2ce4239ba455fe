// The analysis document (format "tallyproof/1", docs/analysis-document.md): reading one into an
// Analysis, and writing an Analysis back out (for saving and share links).
#pragma once
#include <string>
#include <string_view>

#include "analysis.hpp"
#include "json_writer.hpp"
#include "status.hpp"

namespace tallyproof {

inline constexpr const char* kDocumentFormat = "tallyproof/1";

// Reads the input side of a document. Unknown members are ignored (so documents carrying extra
// members, such as a demo's title, still open); wrong types, bad values and newer formats are
// refused with a message naming the member. Open bin edges are written "-inf" / "inf".
Status read_analysis_document(std::string_view json, Analysis* out);

std::string write_analysis_document(const Analysis& a);  // one line of JSON

// The settings members (ordered, model, statistic, alpha, pvalue, merge, extra_estimated_parameters,
// plan, conformity) into an open object: write_analysis_document's, shared by the screen's documents.
// A non-empty `model_description` is added to "model" (result documents).
void write_analysis_settings(JsonWriter& j, const Analysis& a, const std::string& model_description = "");

}  // namespace tallyproof
