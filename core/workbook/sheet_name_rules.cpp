// Sheet-name rules: ECMA-376 Part 1, 18.2.19 (sheet@name, ST_Xstring) with the limits Excel
// enforces (31 characters, no : \ / ? * [ ], no leading or trailing apostrophe, "History"
// reserved, names compared without case). Lengths are counted in UTF-16 code units, as Excel
// counts them, so a character outside the Basic Multilingual Plane counts twice.
#include "sheet_name_rules.hpp"

#include <algorithm>
#include <cctype>

#include "xml_text_writing.hpp"

namespace tallyproof {
namespace {

constexpr std::size_t kMaxUnits = 31;

std::size_t sequence_length(unsigned char lead) { return lead < 0x80 ? 1 : lead < 0xE0 ? 2 : lead < 0xF0 ? 3 : 4; }

// `s` (valid UTF-8) cut to at most `units` UTF-16 code units, at a character boundary.
std::string cut_to_units(const std::string& s, std::size_t units) {
    std::size_t used = 0, i = 0;
    while (i < s.size()) {
        const std::size_t len = sequence_length(static_cast<unsigned char>(s[i]));
        const std::size_t need = len == 4 ? 2 : 1;
        if (used + need > units) break;
        used += need;
        i += len;
    }
    return s.substr(0, i);
}

std::string cleaned(const std::string& wanted, std::size_t number) {
    const std::string valid = valid_xml_text(wanted);  // valid UTF-8 from here on
    std::string s;
    for (char c : valid) {
        const unsigned char u = static_cast<unsigned char>(c);
        if (u < 0x20 || u == 0x7F) continue;
        if (std::string_view(":\\/?*[]").find(c) != std::string_view::npos) s.push_back('_');
        else s.push_back(c);
    }
    // Apostrophes and blanks at either end go (a leading apostrophe is refused; blanks at the
    // ends are invisible in a tab).
    const std::size_t first = s.find_first_not_of("' "), last = s.find_last_not_of("' ");
    s = first == std::string::npos ? std::string() : s.substr(first, last - first + 1);
    s = cut_to_units(s, kMaxUnits);
    while (!s.empty() && (s.back() == '\'' || s.back() == ' ')) s.pop_back();  // the cut may end on one
    if (s.empty()) s = "Sheet " + std::to_string(number);
    return s;
}

std::string folded(std::string s) {
    for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    return s;
}

}  // namespace

std::vector<std::string> valid_sheet_names(const std::vector<std::string>& wanted) {
    std::vector<std::string> names, taken;  // taken: case-folded
    for (std::size_t i = 0; i < wanted.size(); ++i) {
        std::string base = cleaned(wanted[i], i + 1);
        if (folded(base) == "history") base = cut_to_units(base + " sheet", kMaxUnits);
        std::string name = base;
        for (int n = 2; std::find(taken.begin(), taken.end(), folded(name)) != taken.end(); ++n) {
            const std::string suffix = " (" + std::to_string(n) + ")";
            std::string stem = cut_to_units(base, kMaxUnits - suffix.size());
            while (!stem.empty() && stem.back() == ' ') stem.pop_back();
            name = stem + suffix;
        }
        taken.push_back(folded(name));
        names.push_back(name);
    }
    return names;
}

}  // namespace tallyproof
