// ZIP archive writer after PKWARE's APPNOTE.TXT 6.3.x: for each entry a local file header (4.3.7)
// followed by its data, then one central directory header per entry (4.3.12) and the end of
// central directory record (4.3.16). Method 8 is raw deflate (zlib deflateInit2 with negative
// window bits, RFC 1951); an entry that would not shrink is stored (method 0). CRC-32 as ZIP
// defines it (4.4.7), computed by zlib's crc32(). DOS date 1980-01-01 (4.4.6): date word 0x0021.
#include "zip_writer.hpp"

#include <cstdint>
#include <limits>
#include <new>

#include <zlib.h>

namespace tallyproof {
namespace {

constexpr std::uint16_t kDosTime = 0;                         // 00:00:00
constexpr std::uint16_t kDosDate = (0u << 9) | (1u << 5) | 1u;  // 1980-01-01
constexpr std::uint16_t kVersionNeeded = 20;                  // 2.0: deflate (APPNOTE 4.4.3.2)
constexpr std::uint16_t kUtf8Names = 1u << 11;                // general purpose bit 11 (APPNOTE 4.4.4, appendix D)
constexpr std::uint64_t kMax32 = 0xFFFFFFFFu;

void put16(std::string& out, std::uint32_t v) {
    out.push_back(static_cast<char>(v & 0xFF));
    out.push_back(static_cast<char>((v >> 8) & 0xFF));
}
void put32(std::string& out, std::uint32_t v) {
    put16(out, v & 0xFFFF);
    put16(out, v >> 16);
}

// Raw deflate of `data` into `out`; false when zlib fails (the caller then stores the entry).
bool raw_deflate(const std::string& data, std::string* out) {
    z_stream z{};
    if (deflateInit2(&z, Z_BEST_COMPRESSION, Z_DEFLATED, -15, 8, Z_DEFAULT_STRATEGY) != Z_OK) return false;
    out->resize(deflateBound(&z, static_cast<uLong>(data.size())));
    z.next_in = reinterpret_cast<Bytef*>(const_cast<char*>(data.data()));
    z.avail_in = static_cast<uInt>(data.size());
    z.next_out = reinterpret_cast<Bytef*>(out->data());
    z.avail_out = static_cast<uInt>(out->size());
    const int rc = deflate(&z, Z_FINISH);
    const std::size_t written = z.total_out;
    deflateEnd(&z);
    if (rc != Z_STREAM_END) return false;
    out->resize(written);
    return true;
}

struct Written {
    std::uint32_t crc = 0, compressed = 0, size = 0, offset = 0;
    std::uint16_t method = 0, flags = 0;
};

// The fields a local header and its central directory header share (APPNOTE 4.3.7 / 4.3.12,
// from "version needed to extract" to "extra field length").
void common_fields(std::string& out, const ZipPart& e, const Written& w) {
    put16(out, kVersionNeeded);
    put16(out, w.flags);
    put16(out, w.method);
    put16(out, kDosTime);
    put16(out, kDosDate);
    put32(out, w.crc);
    put32(out, w.compressed);
    put32(out, w.size);
    put16(out, static_cast<std::uint32_t>(e.name.size()));
    put16(out, 0);  // no extra field
}

std::string archive(const std::vector<ZipPart>& entries) {
    if (entries.size() > 0xFFFF) return {};
    std::string out;
    std::vector<Written> written;
    written.reserve(entries.size());
    for (const ZipPart& e : entries) {
        if (e.data.size() > kMax32 || e.name.size() > 0xFFFF || out.size() > kMax32) return {};
        Written w;
        w.offset = static_cast<std::uint32_t>(out.size());
        w.size = static_cast<std::uint32_t>(e.data.size());
        w.crc = static_cast<std::uint32_t>(crc32(crc32(0L, Z_NULL, 0), reinterpret_cast<const Bytef*>(e.data.data()),
                                                 static_cast<uInt>(e.data.size())));
        for (unsigned char c : e.name) if (c >= 0x80) w.flags = kUtf8Names;
        std::string packed;
        const bool deflated = raw_deflate(e.data, &packed) && packed.size() < e.data.size();
        w.method = deflated ? 8 : 0;
        const std::string& body = deflated ? packed : e.data;
        w.compressed = static_cast<std::uint32_t>(body.size());
        put32(out, 0x04034b50);  // local file header signature
        common_fields(out, e, w);
        out += e.name;
        out += body;
        written.push_back(w);
    }
    if (out.size() > kMax32) return {};
    const std::size_t directory_at = out.size();
    for (std::size_t i = 0; i < entries.size(); ++i) {
        put32(out, 0x02014b50);  // central file header signature
        put16(out, kVersionNeeded);  // version made by: MS-DOS (0) attributes, spec 2.0
        common_fields(out, entries[i], written[i]);
        put16(out, 0);  // file comment length
        put16(out, 0);  // disk number start
        put16(out, 0);  // internal file attributes
        put32(out, 0);  // external file attributes
        put32(out, written[i].offset);
        out += entries[i].name;
    }
    const std::size_t directory_size = out.size() - directory_at;
    if (out.size() > kMax32) return {};
    put32(out, 0x06054b50);  // end of central directory signature
    put16(out, 0);           // number of this disk
    put16(out, 0);           // disk where the central directory starts
    put16(out, static_cast<std::uint32_t>(entries.size()));
    put16(out, static_cast<std::uint32_t>(entries.size()));
    put32(out, static_cast<std::uint32_t>(directory_size));
    put32(out, static_cast<std::uint32_t>(directory_at));
    put16(out, 0);  // comment length
    return out;
}

}  // namespace

std::string zip_archive(const std::vector<ZipPart>& entries) {
    try {
        return archive(entries);
    } catch (const std::bad_alloc&) {
        return {};
    }
}

}  // namespace tallyproof
