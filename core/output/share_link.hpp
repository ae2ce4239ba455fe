// Share links: the analysis document compressed into the URL fragment ("#tp1.<data>"), so nothing
// reaches a server. <data> is base64url without padding (RFC 4648 section 5) of a small LZ77 stream
// (Ziv and Lempel 1977, IEEE Trans. Inf. Theory 23:337-343) in LZ4's block token format, primed with
// a fixed dictionary of common document text (as Brotli, RFC 7932, primes its window). Lossless:
// the decoded document is byte-identical; a CRC-32 (ISO-HDLC, as in zlib) guards against damage.
//
// Payload of format tp1 (bytes, before base64url):
//   size     LEB128 unsigned varint, the document's length in bytes (1 .. kShareMaxDocumentBytes)
//   crc      CRC-32 of the document, 4 bytes little-endian
//   block    sequences, each: token (high nibble literal length, low nibble match length - 4; a
//            nibble of 15 continues in following bytes of 255 ... ending with one below 255),
//            literals, then a 2-byte little-endian distance 1..65535 and the match. The block
//            ends with the byte that completes the document: after the last match, or after a
//            last sequence of literals only (unlike LZ4, no final literals are required). Distances may reach back into the
//            dictionary (kShareDictionary, which is part of the format and never changes for tp1).
#pragma once
#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>

#include "status.hpp"

namespace tallyproof {

inline constexpr std::size_t kShareMaxFragmentChars = 64 * 1024;        // longest fragment decoded
inline constexpr std::size_t kShareMaxDocumentBytes = 2 * 1024 * 1024;  // largest document decoded

// Fragment ("tp1." + base64url) for a document; "" when the document is empty, larger than
// kShareMaxDocumentBytes, or its fragment would exceed kShareMaxFragmentChars (save a file instead).
std::string encode_share_fragment(const std::string& document_json);

// Reads a fragment (a leading '#' is allowed) back into the document JSON, refusing malformed,
// damaged, truncated, oversized or newer-version links, and documents that
// read_analysis_document() refuses, with a message for the person who opened the link.
Status decode_share_fragment(std::string_view fragment, std::string* document_json);

// The parts, exposed for tests and the fuzzer.
std::string base64url_encode(std::string_view bytes);                    // no padding
Status base64url_decode(std::string_view text, std::string* bytes);     // strict: no padding, zero pad bits
std::uint32_t crc32_iso_hdlc(std::string_view bytes);                   // CRC-32 as in zlib and PNG
std::string share_compress(std::string_view document);                  // size, crc and block
Status share_decompress(std::string_view payload, std::string* document);  // bounded, checked inverse

}  // namespace tallyproof
