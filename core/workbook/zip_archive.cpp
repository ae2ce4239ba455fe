// ZIP archives (PKWARE APPNOTE.TXT 6.3.10: 4.3.7 local file header, 4.3.12 central directory file
// header, 4.3.14-4.3.16 ZIP64 and end of central directory records, 4.4.4 general purpose bit
// flag, 4.4.5 compression method) with zlib's raw inflate (RFC 1951) and CRC-32.
#include "zip_archive.hpp"

#include <new>

#include <zlib.h>

namespace tallyproof {
namespace {

std::uint32_t le16(std::string_view b, std::size_t at) {
    return static_cast<std::uint32_t>(static_cast<unsigned char>(b[at])) |
           static_cast<std::uint32_t>(static_cast<unsigned char>(b[at + 1])) << 8;
}
std::uint32_t le32(std::string_view b, std::size_t at) { return le16(b, at) | le16(b, at + 2) << 16; }

constexpr std::uint32_t kLocalHeader = 0x04034b50, kCentralHeader = 0x02014b50, kEndRecord = 0x06054b50,
                        kZip64Locator = 0x07064b50;
constexpr std::size_t kEndRecordSize = 22, kCentralSize = 46, kLocalSize = 30;

Status corrupt(const std::string& why) {
    return Status::failure("The workbook is damaged or incomplete (" + why +
                           "). Open it in the spreadsheet program and save it again, or copy the cells.");
}

// The end of central directory record: the last signature whose comment reaches the end exactly.
bool find_end_record(std::string_view b, std::size_t* at) {
    if (b.size() < kEndRecordSize) return false;
    const std::size_t lowest = b.size() > kEndRecordSize + 65535 ? b.size() - kEndRecordSize - 65535 : 0;
    for (std::size_t i = b.size() - kEndRecordSize + 1; i-- > lowest;) {
        if (le32(b, i) == kEndRecord && i + kEndRecordSize + le16(b, i + 20) == b.size()) {
            *at = i;
            return true;
        }
    }
    for (std::size_t i = b.size() - kEndRecordSize + 1; i-- > lowest;)  // a comment cut short
        if (le32(b, i) == kEndRecord) { *at = i; return true; }
    return false;
}

Status check_entry(const ZipEntry& e, const ZipBudget& budget) {
    if (e.flags & 1u) return Status::failure("The workbook's part " + e.name + " is encrypted (a password-protected ZIP entry). "
                                             "Remove the password in the spreadsheet program and save again, or copy the cells.");
    if (e.method != 0 && e.method != 8)
        return Status::failure("The workbook's part " + e.name + " is compressed with method " + std::to_string(e.method) +
                               ", which is not read (only stored and deflated parts). Save it again in the spreadsheet program, or copy the cells.");
    if (e.method == 0 && e.stored_size != e.inflated_size) return corrupt("a stored part's two sizes differ: " + e.name);
    if (e.inflated_size > (1u << 20) && static_cast<double>(e.inflated_size) > budget.max_ratio * static_cast<double>(e.stored_size))
        return Status::failure("The workbook's part " + e.name + " would inflate " + std::to_string(e.inflated_size) + " bytes from " +
                               std::to_string(e.stored_size) + ", more than " + std::to_string(static_cast<long>(budget.max_ratio)) +
                               " times: refused as a decompression bomb.");
    return Status::success();
}

}  // namespace

bool looks_like_zip(std::string_view b) {
    return b.size() >= 4 && (le32(b, 0) == kLocalHeader || le32(b, 0) == kEndRecord);
}

ZipArchive read_zip_directory(std::string_view b, const ZipBudget& budget) {
    ZipArchive zip;
    std::size_t end = 0;
    if (!find_end_record(b, &end)) { zip.status = corrupt("no end of central directory record: the file is cut short"); return zip; }
    if (end >= 20 && le32(b, end - 20) == kZip64Locator) {
        zip.status = Status::failure("The workbook is a ZIP64 archive (over 4 GB or 65,535 parts), which is not read. Copy the cells instead.");
        return zip;
    }
    const std::size_t count = le16(b, end + 10), size = le32(b, end + 12), offset = le32(b, end + 16);
    if (count == 0xFFFF || size == 0xFFFFFFFFu || offset == 0xFFFFFFFFu) {
        zip.status = Status::failure("The workbook is a ZIP64 archive (over 4 GB or 65,535 parts), which is not read. Copy the cells instead.");
        return zip;
    }
    if (count > budget.max_entries) {
        zip.status = Status::failure("The workbook holds " + std::to_string(count) + " parts, more than " + std::to_string(budget.max_entries) +
                                     ": refused as a decompression bomb.");
        return zip;
    }
    if (offset > end || size > end - offset) { zip.status = corrupt("the central directory lies outside the file"); return zip; }
    std::size_t at = offset, declared = 0;
    zip.entries.reserve(count);
    for (std::size_t i = 0; i < count; ++i) {
        if (at + kCentralSize > offset + size || le32(b, at) != kCentralHeader) { zip.status = corrupt("a broken central directory"); return zip; }
        ZipEntry e;
        e.flags = static_cast<std::uint16_t>(le16(b, at + 8));
        e.method = static_cast<std::uint16_t>(le16(b, at + 10));
        e.crc = le32(b, at + 16);
        e.stored_size = le32(b, at + 20);
        e.inflated_size = le32(b, at + 24);
        e.local_offset = le32(b, at + 42);
        const std::size_t name_len = le16(b, at + 28), extra_len = le16(b, at + 30), comment_len = le16(b, at + 32);
        if (at + kCentralSize + name_len + extra_len + comment_len > offset + size) { zip.status = corrupt("a broken central directory"); return zip; }
        e.name.assign(b.substr(at + kCentralSize, name_len));
        if (e.stored_size == 0xFFFFFFFFu || e.inflated_size == 0xFFFFFFFFu || e.local_offset == 0xFFFFFFFFu) {
            zip.status = Status::failure("The workbook's part " + e.name + " uses ZIP64 sizes, which are not read. Copy the cells instead.");
            return zip;
        }
        if (e.local_offset >= end || e.stored_size > end - e.local_offset) { zip.status = corrupt("the part " + e.name + " lies outside the file"); return zip; }
        if (Status s = check_entry(e, budget); !s.ok) { zip.status = s; return zip; }
        if (e.inflated_size > budget.max_inflated_bytes - declared) {  // declared <= the budget: no overflow
            zip.status = Status::failure("The workbook's parts would inflate to more than " + std::to_string(budget.max_inflated_bytes >> 20) +
                                         " MB: refused as a decompression bomb (or a workbook too large to read here).");
            return zip;
        }
        declared += e.inflated_size;
        zip.entries.push_back(std::move(e));
        at += kCentralSize + name_len + extra_len + comment_len;
    }
    return zip;
}

const ZipEntry* find_zip_entry(const ZipArchive& zip, std::string_view name) {
    for (const auto& e : zip.entries)
        if (e.name == name) return &e;
    const auto lower = [](char c) { return c >= 'A' && c <= 'Z' ? static_cast<char>(c - 'A' + 'a') : c; };
    for (const auto& e : zip.entries) {
        if (e.name.size() != name.size()) continue;
        bool same = true;
        for (std::size_t i = 0; same && i < name.size(); ++i) same = lower(e.name[i]) == lower(name[i]);
        if (same) return &e;
    }
    return nullptr;
}

Status read_zip_entry(std::string_view b, const ZipEntry& e, const ZipBudget& budget, ZipArchive* zip, std::string* out) {
    out->clear();
    const std::size_t at = e.local_offset;
    if (at + kLocalSize > b.size() || le32(b, at) != kLocalHeader) return corrupt("the part " + e.name + " has no local header");
    const std::size_t data = at + kLocalSize + le16(b, at + 26) + le16(b, at + 28);
    if (data > b.size() || e.stored_size > b.size() - data) return corrupt("the part " + e.name + " is cut short");
    if (e.inflated_size > budget.max_inflated_bytes - zip->inflated_so_far)
        return Status::failure("The workbook's parts inflate to more than " + std::to_string(budget.max_inflated_bytes >> 20) +
                               " MB: refused as a decompression bomb.");
    const std::string_view stored = b.substr(data, e.stored_size);
    try {
        if (e.method == 0) {
            out->assign(stored);
        } else {
            out->resize(e.inflated_size + 1);  // one byte more: an entry longer than it declared shows
            z_stream z{};
            if (inflateInit2(&z, -MAX_WBITS) != Z_OK) return corrupt("zlib could not start");
            z.next_in = reinterpret_cast<Bytef*>(const_cast<char*>(stored.data()));
            z.avail_in = static_cast<uInt>(stored.size());
            z.next_out = reinterpret_cast<Bytef*>(out->data());
            z.avail_out = static_cast<uInt>(out->size());
            const int r = inflate(&z, Z_FINISH);
            const std::size_t produced = out->size() - z.avail_out;
            inflateEnd(&z);
            if (produced > e.inflated_size)
                return Status::failure("The workbook's part " + e.name + " inflates to more than the " + std::to_string(e.inflated_size) +
                                       " bytes it declares: refused (a damaged file or a decompression bomb).");
            if (r != Z_STREAM_END || produced != e.inflated_size) return corrupt("the part " + e.name + " does not inflate");
            out->resize(produced);
        }
    } catch (const std::bad_alloc&) {
        out->clear();
        return Status::failure("The workbook's part " + e.name + " is too large to read in the memory available.");
    }
    zip->inflated_so_far += out->size();
    if (crc32(0L, reinterpret_cast<const Bytef*>(out->data()), static_cast<uInt>(out->size())) != e.crc)
        return corrupt("the part " + e.name + " fails its CRC-32 check");
    return Status::success();
}

}  // namespace tallyproof
