// Text made safe for XML 1.0 character data and attribute values (W3C XML 1.0 5th ed., 2.2
// "Characters" production [2] Char, 2.4 and 3.3.3), and for the string type of Office Open XML,
// where "_xHHHH_" stands for a character (ECMA-376 Part 1, 22.9.2.19 ST_Xstring): the underscore of
// such a literal sequence is itself escaped as "_x005F_" so it reads back as typed.
#pragma once
#include <string>
#include <string_view>

namespace tallyproof {

// Valid UTF-8 kept; a byte that does not start a valid UTF-8 sequence (overlong forms and
// surrogates included) becomes U+FFFD; characters XML 1.0 does not allow (controls other than
// tab, line feed and carriage return, U+FFFE, U+FFFF) become U+FFFD. Then & < > " escaped, and a
// carriage return written as &#13; so it is not folded into a line feed by the reader.
std::string xml_escaped(std::string_view text);
// Only the replacements of xml_escaped (U+FFFD for what is not valid UTF-8 or not an XML
// character), nothing escaped: text that is safe to escape later and to count in characters.
std::string valid_xml_text(std::string_view text);
// As xml_escaped, and every literal "_xHHHH_" protected (ST_Xstring): for a cell's text.
std::string xml_escaped_xstring(std::string_view text);

}  // namespace tallyproof
