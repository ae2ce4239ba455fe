// A ZIP archive written from named byte strings (PKWARE APPNOTE.TXT 6.3.x: 4.3.7 local file
// header, 4.3.12 central directory header, 4.3.16 end of central directory record), each entry
// raw-deflated by zlib (RFC 1951) or stored, with zlib's CRC-32. No ZIP64: an archive that would
// need it (an entry or the whole past 4 GiB, more than 65535 entries) is refused. Every entry has
// the same DOS time, 1980-01-01 00:00, so the same entries give the same bytes.
#pragma once
#include <string>
#include <vector>

namespace tallyproof {

struct ZipPart {
    std::string name;  // path inside the archive, '/'-separated (UTF-8; flagged as such when not ASCII)
    std::string data;  // the entry's bytes
};

// The archive's bytes; empty when it cannot be written (too large for ZIP without ZIP64, no memory).
std::string zip_archive(const std::vector<ZipPart>& entries);

}  // namespace tallyproof
