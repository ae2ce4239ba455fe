// Decodes text files. Signatures from the formats' specifications (PNG: RFC 2083 §3.1; GIF89a;
// JFIF/JPEG SOI marker; PDF 1.7 §7.5.2; zip APPNOTE 4.3.7 local header "PK\3\4"; OLE compound
// files "D0 CF 11 E0 A1 B1 1A E1"; ISO base media "ftyp"); the workbook inside a zip is told by its
// member names (Office Open XML "xl/", OpenDocument "mimetype" first). Windows-1252 as mapped in
// the WHATWG Encoding Standard (0x81, 0x8D, 0x8F, 0x90, 0x9D to the C1 controls).
#include "text_decoding.hpp"

#include <cstdint>
#include <string_view>

#include "delimited_text.hpp"  // append_utf8

namespace tallyproof {
namespace {

bool starts_with(std::string_view s, std::string_view p) { return s.size() >= p.size() && s.substr(0, p.size()) == p; }
bool contains(std::string_view s, std::string_view p) { return s.find(p) != std::string_view::npos; }

const char* const kTextAdvice = " Paste the counts as text (a label and a count on each line), or give a CSV or text file.";
const char* const kWorkbookAdvice = " Save it as CSV (comma-separated values) or copy the cells and paste them as text.";

Status not_text(const std::string& looks_like, const char* advice) {
    return Status::failure("This is not text: it looks like " + looks_like + "." + advice);
}

// What a file's first bytes say it is, when they are a known binary signature.
bool binary_signature(std::string_view b, Status* refusal) {
    const std::string_view head = b.substr(0, 1u << 16);  // member names of a zip sit near its start
    struct Signature { std::string_view magic; const char* kind; };
    static const Signature kImages[] = {
        {"\x89PNG\r\n\x1A\n", "a PNG image"}, {"\xFF\xD8\xFF", "a JPEG image"}, {"GIF87a", "a GIF image"},
        {"GIF89a", "a GIF image"}, {std::string_view("II*\0", 4), "a TIFF image"}, {std::string_view("MM\0*", 4), "a TIFF image"},
    };
    for (const auto& s : kImages)
        if (starts_with(b, s.magic)) { *refusal = not_text(s.kind, kTextAdvice); return true; }
    if (starts_with(b, "RIFF") && b.size() >= 12 && b.substr(8, 4) == "WEBP") { *refusal = not_text("a WebP image", kTextAdvice); return true; }
    if (b.size() >= 12 && b.substr(4, 4) == "ftyp") { *refusal = not_text("a photo or video (MP4, MOV or HEIC)", kTextAdvice); return true; }
    if (starts_with(b, "%PDF-")) {
        *refusal = not_text("a PDF document", " Copy the table's cells from the document it was made in, or give a CSV or text file.");
        return true;
    }
    if (starts_with(b, "PK\x03\x04") || starts_with(b, "PK\x05\x06") || starts_with(b, "PK\x07\x08")) {
        if (contains(head, "mimetypeapplication/vnd.oasis.opendocument.spreadsheet")) *refusal = not_text("an OpenDocument spreadsheet workbook (.ods)", kWorkbookAdvice);
        else if (contains(head, "xl/")) *refusal = not_text("a spreadsheet workbook (.xlsx)", kWorkbookAdvice);
        else if (contains(head, "word/") || contains(head, "opendocument.text")) *refusal = not_text("a word-processor document (.docx or .odt)", kTextAdvice);
        else *refusal = not_text("a zip archive", " Unpack it and give the CSV or text file inside, or paste the counts as text.");
        return true;
    }
    if (starts_with(b, "\xD0\xCF\x11\xE0\xA1\xB1\x1A\xE1")) {
        const bool workbook = contains(head, std::string_view("W\0o\0r\0k\0b\0o\0o\0k\0", 16)) || contains(head, std::string_view("B\0o\0o\0k\0", 8));
        *refusal = workbook ? not_text("an older spreadsheet workbook (.xls)", kWorkbookAdvice)
                            : not_text("an older office document (an OLE compound file such as .xls or .doc)", kWorkbookAdvice);
        return true;
    }
    struct Archive { std::string_view magic; const char* kind; };
    static const Archive kArchives[] = {
        {"\x1F\x8B", "a gzip-compressed file"}, {std::string_view("\xFD" "7zXZ\0", 6), "an xz-compressed file"},
        {"7z\xBC\xAF\x27\x1C", "a 7-Zip archive"}, {"Rar!\x1A\x07", "a RAR archive"}, {"\x7F" "ELF", "a program (an ELF executable)"},
        {std::string_view("SQLite format 3\0", 16), "an SQLite database"},
    };
    for (const auto& s : kArchives)
        if (starts_with(b, s.magic)) { *refusal = not_text(s.kind, kTextAdvice); return true; }
    if (starts_with(b, "BZh") && b.size() >= 10 && b[3] >= '1' && b[3] <= '9' && b.substr(4, 6) == "1AY&SY") {
        *refusal = not_text("a bzip2-compressed file", kTextAdvice);
        return true;
    }
    return false;
}

// UTF-16 without a mark: ASCII-range text puts a zero in every other byte, on the odd bytes in
// little-endian order and on the even bytes in big-endian order; text does not otherwise.
bool utf16_by_zero_bytes(std::string_view b, bool* little_endian) {
    if (b.size() < 4 || b.size() % 2 != 0) return false;
    const std::size_t n = b.size() < (1u << 16) ? b.size() : (1u << 16);
    std::size_t even = 0, odd = 0;
    for (std::size_t i = 0; i + 1 < n; i += 2) { even += b[i] == '\0'; odd += b[i + 1] == '\0'; }
    const std::size_t pairs = n / 2;
    if (odd * 4 >= pairs && even * 20 <= odd) { *little_endian = true; return true; }
    if (even * 4 >= pairs && odd * 20 <= even) { *little_endian = false; return true; }
    return false;
}

// UTF-16 code units to UTF-8; unpaired surrogates become U+FFFD (counted in `bad`).
std::string from_utf16(std::string_view b, bool little_endian, std::size_t* bad) {
    std::string out;
    out.reserve(b.size() / 2 + b.size() / 8);
    auto unit = [&](std::size_t i) {
        const auto lo = static_cast<unsigned char>(b[little_endian ? i : i + 1]);
        const auto hi = static_cast<unsigned char>(b[little_endian ? i + 1 : i]);
        return static_cast<std::uint32_t>(hi << 8 | lo);
    };
    for (std::size_t i = 0; i + 1 < b.size(); i += 2) {
        std::uint32_t cp = unit(i);
        if (cp >= 0xD800 && cp <= 0xDBFF && i + 3 < b.size() && unit(i + 2) >= 0xDC00 && unit(i + 2) <= 0xDFFF) {
            cp = 0x10000 + ((cp - 0xD800) << 10) + (unit(i + 2) - 0xDC00);
            i += 2;
        } else if (cp >= 0xD800 && cp <= 0xDFFF) {
            cp = 0xFFFD;
            ++*bad;
        }
        append_utf8(&out, cp);
    }
    return out;
}

// Valid multi-byte UTF-8 sequences and bytes that belong to none (Unicode 15, table 3-7).
void utf8_census(std::string_view s, std::size_t* multibyte, std::size_t* invalid) {
    const auto byte = [&](std::size_t i) { return static_cast<unsigned char>(s[i]); };
    for (std::size_t i = 0; i < s.size();) {
        const unsigned char c = byte(i);
        if (c < 0x80) { ++i; continue; }
        std::size_t n = (c >= 0xC2 && c <= 0xDF) ? 2 : (c >= 0xE0 && c <= 0xEF) ? 3 : (c >= 0xF0 && c <= 0xF4) ? 4 : 0;
        bool ok = n > 0 && i + n <= s.size();
        for (std::size_t k = 1; ok && k < n; ++k) ok = (byte(i + k) & 0xC0) == 0x80;
        if (ok && n == 3) ok = !((c == 0xE0 && byte(i + 1) < 0xA0) || (c == 0xED && byte(i + 1) >= 0xA0));
        if (ok && n == 4) ok = !((c == 0xF0 && byte(i + 1) < 0x90) || (c == 0xF4 && byte(i + 1) >= 0x90));
        if (ok) { ++*multibyte; i += n; }
        else { ++*invalid; ++i; }
    }
}

std::string from_windows1252(std::string_view s) {
    static const std::uint16_t k80[32] = {0x20AC, 0x81, 0x201A, 0x0192, 0x201E, 0x2026, 0x2020, 0x2021, 0x02C6, 0x2030, 0x0160,
                                          0x2039, 0x0152, 0x8D, 0x017D, 0x8F, 0x90, 0x2018, 0x2019, 0x201C, 0x201D, 0x2022,
                                          0x2013, 0x2014, 0x02DC, 0x2122, 0x0161, 0x203A, 0x0153, 0x9D, 0x017E, 0x0178};
    std::string out;
    out.reserve(s.size() + s.size() / 4);
    for (char ch : s) {
        const auto c = static_cast<unsigned char>(ch);
        append_utf8(&out, c >= 0x80 && c < 0xA0 ? k80[c - 0x80] : c);
    }
    return out;
}

// Where the first NUL byte is, or npos.
std::size_t first_nul(std::string_view s) { return s.find('\0'); }

Status nul_refusal(std::size_t at) {
    return Status::failure("This is not text: it holds a NUL byte (byte " + std::to_string(at + 1) +
                           "), as binary files such as images, archives and programs do." + kTextAdvice);
}

}  // namespace

const char* text_encoding_name(TextEncoding encoding) {
    switch (encoding) {
        case TextEncoding::utf8: return "UTF-8";
        case TextEncoding::utf8_with_mark: return "UTF-8 with a byte-order mark";
        case TextEncoding::utf16le: return "UTF-16 little-endian";
        case TextEncoding::utf16be: return "UTF-16 big-endian";
        case TextEncoding::windows1252: return "Windows-1252";
    }
    return "UTF-8";
}

TextDecoding decode_text(std::string* bytes) {
    TextDecoding d;
    const std::string_view b(*bytes);
    if (starts_with(b, std::string_view("\xFF\xFE\0\0", 4)) || starts_with(b, std::string_view("\0\0\xFE\xFF", 4))) {
        d.status = not_text("UTF-32 text", " Save it as UTF-8 text (or CSV) and try again.");
        return d;
    }
    bool little = true;
    bool utf16 = false;
    std::size_t skip = 0;
    if ((starts_with(b, "\xFF\xFE") || starts_with(b, "\xFE\xFF")) && b.size() % 2 == 0) {
        utf16 = true;
        little = b[0] == '\xFF';
        skip = 2;
    } else if (binary_signature(b, &d.status)) {
        return d;
    } else if (utf16_by_zero_bytes(b, &little)) {
        utf16 = true;
    }
    if (utf16) {
        std::size_t bad = 0;
        std::string text = from_utf16(b.substr(skip), little, &bad);
        if (const std::size_t at = first_nul(text); at != std::string::npos) {
            d.status = nul_refusal(at);
            return d;
        }
        d.encoding = little ? TextEncoding::utf16le : TextEncoding::utf16be;
        d.notice = std::string("The text was read as ") + text_encoding_name(d.encoding) + (skip ? "" : " (it has no byte-order mark)") + ".";
        if (bad > 0) d.notice += " " + std::to_string(bad) + " unpaired surrogate code units are shown as \xEF\xBF\xBD.";
        *bytes = std::move(text);
        return d;
    }
    if (starts_with(b, "\xEF\xBB\xBF")) {
        d.encoding = TextEncoding::utf8_with_mark;
        bytes->erase(0, 3);
    }
    const std::string_view t(*bytes);
    if (const std::size_t at = first_nul(t); at != std::string::npos) {
        d.status = nul_refusal(at + (d.encoding == TextEncoding::utf8_with_mark ? 3 : 0));
        return d;
    }
    std::size_t multibyte = 0, invalid = 0;
    utf8_census(t, &multibyte, &invalid);
    if (invalid == 0) return d;
    // A JSON document must be UTF-8 (RFC 8259 §8.1): its reader refuses the bytes, located.
    const std::size_t first = t.find_first_not_of(" \t\r\n");
    if (first != std::string_view::npos && t[first] == '{') return d;
    if (multibyte > invalid || d.encoding == TextEncoding::utf8_with_mark) {
        d.notice = "The text is UTF-8 but " + std::to_string(invalid) + (invalid == 1 ? " byte is" : " bytes are") +
                   " not; they are shown as \xEF\xBF\xBD.";
        return d;
    }
    d.encoding = TextEncoding::windows1252;
    d.notice = "The text is not UTF-8: it was read as Windows-1252 (Western European). If labels look wrong, save the file as UTF-8 text.";
    *bytes = from_windows1252(t);
    return d;
}

}  // namespace tallyproof
