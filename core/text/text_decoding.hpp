// Text decoding: the bytes of a file or a paste turned into UTF-8 text, or refused as not text.
// UTF-8 with or without a byte-order mark; UTF-16 LE/BE with a mark, or without one when the
// zero bytes fall on every other byte; otherwise Windows-1252 with a notice. Binary files are
// told apart by their published signatures (PNG, JPEG, GIF, PDF, zip and the workbooks inside
// zip, OLE compound files, ...) or by NUL bytes, and refused saying what they look like.
// Byte-order marks and signatures are common practice (Unicode 15 §23.8; each format's spec).
#pragma once
#include <string>

#include "status.hpp"

namespace tallyproof {

enum class TextEncoding { utf8, utf8_with_mark, utf16le, utf16be, windows1252 };
const char* text_encoding_name(TextEncoding encoding);  // "UTF-8", "UTF-16 little-endian", ...

struct TextDecoding {
    Status status;                             // !ok: not text; the message says what it looks like
    TextEncoding encoding = TextEncoding::utf8;
    std::string notice;                        // a plain sentence when the text was not plain UTF-8
};

// Decodes `bytes` in place: on success it holds UTF-8 text without a byte-order mark (bytes that
// are not UTF-8 in mostly-UTF-8 text or in a JSON document are left for the readers, which show
// them as U+FFFD or refuse them, located).
TextDecoding decode_text(std::string* bytes);

}  // namespace tallyproof
