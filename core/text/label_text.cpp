// Label normalisation and look-alike labels. NFC and case folding are utf8proc's (MIT,
// https://juliastrings.github.io/utf8proc/, from Debian's source package), checked against the
// Unicode Character Database's NormalizationTest.txt (tests/unit/test_label_text.cpp). Which
// characters draw nothing follows UAX #44's Default_Ignorable_Code_Point, as utf8proc records it.
#include "label_text.hpp"

#include <cstdio>
#include <cstdlib>
#include <map>

#include <utf8proc.h>

#include "delimited_text.hpp"  // utf8_or_replacement

namespace tallyproof {
namespace {

const auto* bytes(std::string_view s) { return reinterpret_cast<const utf8proc_uint8_t*>(s.data()); }

// utf8proc_map over valid UTF-8 with `options`; the input unchanged if utf8proc refuses it.
std::string mapped(std::string_view valid, int options) {
    utf8proc_uint8_t* out = nullptr;
    const utf8proc_ssize_t n = utf8proc_map(bytes(valid), static_cast<utf8proc_ssize_t>(valid.size()), &out,
                                            static_cast<utf8proc_option_t>(options));
    std::string result = n >= 0 ? std::string(reinterpret_cast<const char*>(out), static_cast<std::size_t>(n)) : std::string(valid);
    std::free(out);
    return result;
}

bool plain_ascii(std::string_view s) {
    for (unsigned char c : s)
        if (c < 0x20 || c > 0x7E) return false;
    return true;
}

std::string visible_code(char32_t c) {
    char buf[16];
    std::snprintf(buf, sizeof buf, "<U+%04X>", static_cast<unsigned>(c));
    return buf;
}

int hex_digit(char c) {
    if (c >= '0' && c <= '9') return c - '0';
    if (c >= 'A' && c <= 'F') return c - 'A' + 10;
    return -1;
}

// Length of a "<U+XXXX>" code for a character that draws nothing at s[i] (4 to 6 hex digits), or 0.
std::size_t invisible_code_at(std::string_view s, std::size_t i) {
    if (s.compare(i, 3, "<U+") != 0) return 0;
    char32_t c = 0;
    std::size_t j = i + 3;
    for (; j < s.size() && j < i + 9 && hex_digit(s[j]) >= 0; ++j) c = c * 16 + static_cast<char32_t>(hex_digit(s[j]));
    const std::size_t digits = j - i - 3;
    if (digits < 4 || j >= s.size() || s[j] != '>' || !draws_nothing(c)) return 0;
    return j + 1 - i;
}

bool is_space(utf8proc_int32_t c) { return c == ' ' || utf8proc_category(c) == UTF8PROC_CATEGORY_ZS; }

// The label without characters that draw nothing (raw or as codes), every space character as
// U+0020, and without spaces at either end.
std::string visible_part(std::string_view label) {
    const std::string valid = utf8_or_replacement(label);
    std::string out;
    for (std::size_t i = 0; i < valid.size();) {
        if (const std::size_t code = invisible_code_at(valid, i)) { i += code; continue; }
        utf8proc_int32_t c = 0;
        const utf8proc_ssize_t n = utf8proc_iterate(bytes(valid) + i, static_cast<utf8proc_ssize_t>(valid.size() - i), &c);
        if (n <= 0) { ++i; continue; }  // not reached: the text is valid UTF-8
        if (is_space(c)) out += ' ';
        else if (!draws_nothing(static_cast<char32_t>(c))) out.append(valid, i, static_cast<std::size_t>(n));
        i += static_cast<std::size_t>(n);
    }
    const std::size_t b = out.find_first_not_of(' '), e = out.find_last_not_of(' ');
    return b == std::string::npos ? std::string() : out.substr(b, e - b + 1);
}

}  // namespace

bool draws_nothing(char32_t c) {
    if (c < 0x20 || (c >= 0x7F && c < 0xA0) || c == 0x2028 || c == 0x2029) return true;
    if (c > 0x10FFFF) return false;
    // Reserved code points that Unicode already counts as default ignorable (Other_Default_Ignorable_Code_Point);
    // utf8proc records the property only for assigned ones.
    if (c == 0x2065 || (c >= 0xFFF0 && c <= 0xFFF8) || (c >= 0xE0000 && c <= 0xE0FFF)) return true;
    return utf8proc_get_property(static_cast<utf8proc_int32_t>(c))->ignorable;
}

std::string nfc_text(std::string_view utf8) {
    if (plain_ascii(utf8)) return std::string(utf8);
    return mapped(utf8_or_replacement(utf8), UTF8PROC_STABLE | UTF8PROC_COMPOSE);
}

std::string normalised_label(std::string_view raw) {
    if (plain_ascii(raw)) return std::string(raw);
    const std::string nfc = nfc_text(raw);
    std::string out;
    for (std::size_t i = 0; i < nfc.size();) {
        utf8proc_int32_t c = 0;
        const utf8proc_ssize_t n = utf8proc_iterate(bytes(nfc) + i, static_cast<utf8proc_ssize_t>(nfc.size() - i), &c);
        if (n <= 0) { out += "\xEF\xBF\xBD"; ++i; continue; }  // not reached: nfc_text is valid UTF-8
        if (draws_nothing(static_cast<char32_t>(c))) out += visible_code(static_cast<char32_t>(c));
        else out.append(nfc, i, static_cast<std::size_t>(n));
        i += static_cast<std::size_t>(n);
    }
    return out;
}

std::string look_alike_name(std::string_view label) { return visible_part(label); }

std::string look_alike_key(std::string_view label) {
    if (plain_ascii(label) && label.find('<') == std::string_view::npos) {  // the common case, without utf8proc
        const std::size_t b = label.find_first_not_of(' '), e = label.find_last_not_of(' ');
        std::string key = b == std::string_view::npos ? std::string() : std::string(label.substr(b, e - b + 1));
        for (char& c : key)
            if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
        return key;
    }
    return mapped(visible_part(label), UTF8PROC_STABLE | UTF8PROC_COMPOSE | UTF8PROC_CASEFOLD);
}

std::vector<std::vector<std::size_t>> equal_groups(const std::vector<std::string>& keys) {
    std::map<std::string_view, std::size_t> group_of;  // key -> index into `all`
    std::vector<std::vector<std::size_t>> all;
    for (std::size_t i = 0; i < keys.size(); ++i) {
        const auto [it, fresh] = group_of.emplace(keys[i], all.size());
        if (fresh) all.push_back({i});
        else all[it->second].push_back(i);
    }
    std::vector<std::vector<std::size_t>> groups;
    for (auto& g : all)
        if (g.size() > 1) groups.push_back(std::move(g));
    return groups;
}

std::vector<std::vector<std::size_t>> look_alike_groups(const std::vector<std::string>& labels) {
    std::vector<std::string> keys;
    keys.reserve(labels.size());
    for (const auto& l : labels) keys.push_back(look_alike_key(l));
    return equal_groups(keys);
}

std::string quoted_labels(const std::vector<std::string>& labels, const std::vector<std::size_t>& group) {
    std::string names;
    for (std::size_t j = 0; j < group.size(); ++j) {
        if (group[j] >= labels.size()) break;
        names += std::string(j == 0 ? "" : j + 1 == group.size() ? " and " : ", ") + "\"" + labels[group[j]].substr(0, 40) + "\"";
    }
    return names;
}

std::string look_alike_warning(const std::vector<std::string>& labels, const std::vector<std::vector<std::size_t>>& groups) {
    if (groups.empty()) return "";
    std::string s;
    for (std::size_t g = 0; g < groups.size() && g < 3; ++g) s += (g ? "; " : "") + quoted_labels(labels, groups[g]);
    if (groups.size() > 3) s += "; and " + std::to_string(groups.size() - 3) + " more groups";
    return "Labels that look the same (they differ only by invisible characters, case or surrounding spaces): " + s +
           ". If they are one category, merge them: their counts are then added.";
}

std::vector<std::vector<std::size_t>> normalise_labels(std::vector<std::string>* labels) {
    bool changed = false;
    for (auto& l : *labels)
        if (!plain_ascii(l)) {
            std::string n = normalised_label(l);
            changed = changed || n != l;
            l = std::move(n);
        }
    if (!changed) return {};  // the labels were distinct before (the readers refuse duplicates) or are as given
    return equal_groups(*labels);
}

}  // namespace tallyproof
