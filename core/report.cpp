// Report wording follows common practice for significance tests: a result is "not consistent
// with" or shows "no evidence against" the stated mix; a test never proves a mix.
#include "report.hpp"

#include <algorithm>
#include <cstdio>

#include "json_writer.hpp"
#include "number_format.hpp"
#include "tallyproof_version.hpp"

namespace tallyproof {
namespace {

std::string model_phrase(const Analysis& a, std::size_t k) {
    switch (a.model.kind) {
        case ModelKind::equal: return "equal shares across " + std::to_string(k) + " categories";
        case ModelKind::shares: return "stated shares";
        case ModelKind::ratio: return "stated ratio";
        case ModelKind::counts: return "stated expected counts";
    }
    return "stated mix";
}

std::string pad(const std::string& s, std::size_t width) {
    // width in code points, so labels with accents or Greek line up
    std::size_t cps = 0;
    for (unsigned char c : s) cps += (c & 0xC0) != 0x80;
    return cps >= width ? s : s + std::string(width - cps, ' ');
}

}  // namespace

std::string verdict_sentence(const Result& r) {
    const std::string at = "at α = " + format_plain(r.alpha);
    if (r.reject) return "The counts are not consistent with the stated mix " + at + ".";
    return "No evidence against the stated mix " + at + ".";
}

std::string report_text(const Analysis& a, const Result& r) {
    if (!r.status.ok) return "Not analysed: " + r.status.message + "\n";
    const std::size_t k = r.observed.size();
    std::string s;
    s += "Chi-square goodness of fit (Pearson), " + model_phrase(a, k) + "\n";
    s += "N = " + format_count(r.n) + ", k = " + std::to_string(k) + "\n";
    s += "χ² = " + format_fixed(r.statistic, 2) + ", df = " + format_count(r.df) +
         ", p = " + format_probability(r.upper) + "\n";
    s += "Critical value at α = " + format_plain(r.alpha) + ": " + format_fixed(r.critical_value, 3) + "\n";
    s += verdict_sentence(r) + "\n";
    for (const auto& w : r.warnings) s += "Note: " + w + "\n";
    std::size_t wl = 8;
    for (const auto& c : r.categories) wl = std::max(wl, std::min<std::size_t>(c.size(), 28));
    s += "\n" + pad("Category", wl + 2) + pad("Observed", 11) + pad("Expected", 11) + "Contribution\n";
    for (std::size_t i = 0; i < k; ++i) {
        s += pad(r.categories[i], wl + 2) + pad(format_count(r.observed[i]), 11) +
             pad(format_fixed(r.expected_counts[i], 2), 11) + format_fixed(r.contributions[i], 3) + "\n";
    }
    return s;
}

std::string report_json(const Analysis& a, const Result& r) {
    JsonWriter j;
    j.begin_object();
    j.key("format").value("tallyproof/1");
    j.key("version").value(TALLYPROOF_VERSION);
    if (!r.status.ok) {
        j.key("error").value(r.status.message);
        if (r.status.line > 0) j.key("error_line").value(static_cast<double>(r.status.line));
        if (r.status.column > 0) j.key("error_column").value(static_cast<double>(r.status.column));
        j.end_object();
        return j.str();
    }
    j.key("categories").strings(r.categories);
    j.key("observed").numbers(r.observed);
    j.key("model").begin_object().key("kind").value(model_kind_name(a.model.kind)).end_object();
    j.key("alpha").value(r.alpha);
    j.key("n").value(r.n);
    j.key("statistic").value(r.statistic);
    j.key("df").value(r.df);
    j.key("p_value").value(r.upper.p);
    j.key("log10_p_value").value(r.upper.log10_p);
    j.key("critical_value").value(r.critical_value);
    j.key("reject").value(r.reject);
    j.key("expected_counts").numbers(r.expected_counts);
    j.key("contributions").numbers(r.contributions);
    j.key("pearson_residuals").numbers(r.pearson_residuals);
    j.key("min_expected").value(r.min_expected);
    j.key("warnings").strings(r.warnings);
    j.end_object();
    return j.str();
}

}  // namespace tallyproof
