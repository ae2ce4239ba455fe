// XML 1.0 character rules (W3C XML 1.0 5th ed., production [2]: #x9 | #xA | #xD | [#x20-#xD7FF] |
// [#xE000-#xFFFD] | [#x10000-#x10FFFF]) applied to UTF-8 decoded after RFC 3629 section 4 (no
// overlong forms, no surrogates, nothing above U+10FFFF); the predefined entities of section 4.6;
// Office Open XML's "_xHHHH_" escape (ECMA-376 Part 1, 22.9.2.19 ST_Xstring).
#include "xml_text_writing.hpp"

#include <cstdint>

namespace tallyproof {
namespace {

constexpr const char* kReplacement = "\xEF\xBF\xBD";  // U+FFFD

// The length of the valid UTF-8 sequence at `i` and its code point, or 0 when it is not one.
std::size_t utf8_sequence(std::string_view s, std::size_t i, std::uint32_t* cp) {
    const unsigned char b = static_cast<unsigned char>(s[i]);
    std::size_t len = 0;
    std::uint32_t v = 0, least = 0;
    if (b < 0x80) { *cp = b; return 1; }
    if ((b & 0xE0) == 0xC0) { len = 2; v = b & 0x1F; least = 0x80; }
    else if ((b & 0xF0) == 0xE0) { len = 3; v = b & 0x0F; least = 0x800; }
    else if ((b & 0xF8) == 0xF0) { len = 4; v = b & 0x07; least = 0x10000; }
    else return 0;
    if (i + len > s.size()) return 0;
    for (std::size_t k = 1; k < len; ++k) {
        const unsigned char c = static_cast<unsigned char>(s[i + k]);
        if ((c & 0xC0) != 0x80) return 0;
        v = (v << 6) | (c & 0x3F);
    }
    if (v < least || v > 0x10FFFF || (v >= 0xD800 && v <= 0xDFFF)) return 0;
    *cp = v;
    return len;
}

bool xml_char(std::uint32_t c) {
    return c == 0x9 || c == 0xA || c == 0xD || (c >= 0x20 && c <= 0xD7FF) || (c >= 0xE000 && c <= 0xFFFD) ||
           (c >= 0x10000 && c <= 0x10FFFF);
}

bool hex_digit(char c) { return (c >= '0' && c <= '9') || (c >= 'a' && c <= 'f') || (c >= 'A' && c <= 'F'); }

// "_xHHHH_" starting at i.
bool xstring_escape_at(std::string_view s, std::size_t i) {
    if (i + 7 > s.size() || s[i] != '_' || (s[i + 1] != 'x' && s[i + 1] != 'X') || s[i + 6] != '_') return false;
    for (std::size_t k = 2; k < 6; ++k) if (!hex_digit(s[i + k])) return false;
    return true;
}

enum class Escape { none, xml, xstring };

std::string escaped(std::string_view s, Escape how) {
    const bool xml = how != Escape::none, xstring = how == Escape::xstring;
    std::string out;
    out.reserve(s.size() + s.size() / 8);
    for (std::size_t i = 0; i < s.size();) {
        std::uint32_t cp = 0;
        const std::size_t len = utf8_sequence(s, i, &cp);
        if (len == 0) { out += kReplacement; ++i; continue; }
        if (!xml_char(cp)) out += kReplacement;
        else if (!xml) out.append(s.substr(i, len));
        else if (cp == '&') out += "&amp;";
        else if (cp == '<') out += "&lt;";
        else if (cp == '>') out += "&gt;";
        else if (cp == '"') out += "&quot;";
        else if (cp == '\r') out += "&#13;";
        else if (xstring && xstring_escape_at(s, i)) out += "_x005F_";
        else out.append(s.substr(i, len));
        i += len;
    }
    return out;
}

}  // namespace

std::string valid_xml_text(std::string_view text) { return escaped(text, Escape::none); }
std::string xml_escaped(std::string_view text) { return escaped(text, Escape::xml); }
std::string xml_escaped_xstring(std::string_view text) { return escaped(text, Escape::xstring); }

}  // namespace tallyproof
