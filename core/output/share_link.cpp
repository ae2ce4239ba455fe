// Share-link codec: LZ77 in the LZ4 block token format (Collet, "LZ4 Block Format Description",
// https://github.com/lz4/lz4/blob/dev/doc/lz4_Block_format.md) primed with a fixed dictionary,
// base64url (RFC 4648 section 5) and CRC-32 (ISO 3309 / ITU-T V.42, reflected 0xEDB88320).
// The decoder treats every byte as hostile: each length is checked against the declared size
// before it is used, so it never reads or writes out of bounds and never allocates beyond 2 MB.
#include "share_link.hpp"

#include <algorithm>
#include <vector>

#include "analysis_document.hpp"

namespace tallyproof {
namespace {

// Part of format tp1: changing one byte of this breaks every tp1 link (a new dictionary needs
// "tp2."). Text that documents written by write_analysis_document() commonly contain, with the
// most common whole tail in one run so that a default analysis costs a single back-reference.
constexpr std::string_view kShareDictionary =
    R"TP({"format":"tallyproof/1","categories":["0","1","2","3","4","5","6","7","8","9","10","11","12",)TP"
    R"TP("5 or more","6 or more","Other","Yes","No","Male","Female","Red","Green","Blue","Yellow",)TP"
    R"TP("Monday","Tuesday","Wednesday","Thursday","Friday","Saturday","Sunday","January","February",)TP"
    R"TP("March","April","May","June","July","August","September","October","November","December",)TP"
    R"TP("Category 1","Category 2","Category 3","Category 4","Category 5","Category 6","A","B","C","D","E","F"],)TP"
    R"TP("model":{"kind":"shares","values":[0.1,0.2,0.25,0.3,0.5],"kind":"ratio","values":[9,3,3,1],)TP"
    R"TP("kind":"counts","values":[],"kind":"binomial","parameters":{"trials":10,"p":0.5},)TP"
    R"TP("kind":"geometric","kind":"negative-binomial","parameters":{"size":1,"mean":)TP"
    R"TP("kind":"uniform","kind":"lognormal","parameters":{"meanlog":0,"sdlog":1},)TP"
    R"TP("kind":"exponential","parameters":{"rate":1},"kind":"normal","parameters":{"mean":0,"sd":1},"edges":[-1e+308,)TP"
    R"TP("kind":"benford-first-two","kind":"benford-second","kind":"last-digit-even","kind":"last-digit","kind":"poisson"},)TP"
    R"TP("statistic":{"lambda":0,"williams":true},"statistic":{"lambda":0.66666666666666663,"williams":false},)TP"
    R"TP("lambda":-0.5,"lambda":-1,"lambda":-2,"alpha":0.01,"alpha":0.10000000000000001,"alpha":0.001,)TP"
    R"TP("pvalue":{"method":"exact","ordering":"probability","replicates":1000000,"seed":12345},)TP"
    R"TP("pvalue":{"method":"monte-carlo","ordering":"statistic","replicates":10000,"seed":42},)TP"
    R"TP("merge":{"rule":"all-5","minimum":5},"merge":{"rule":"cochran","minimum":5},"merge":{"rule":"minimum","minimum":1},)TP"
    R"TP("extra_estimated_parameters":1,"plan":{"w":0.10000000000000001,"w":0.29999999999999999,"w":0.5,)TP"
    R"TP("n":100,"alpha":0.05,"df":1,"target_power":0.80000000000000004,"target_power":0.90000000000000002}})TP"
    R"TP(,"categories":["1","2","3","4","5","6","7","8","9"],"observed":[)TP"
    R"TP(],"ordered":true,"model":{"kind":"benford-first"},)TP"
    R"TP(],"ordered":false,"model":{"kind":"equal"},"statistic":{"lambda":1,"williams":false},"alpha":0.05,)TP"
    R"TP("pvalue":{"method":"asymptotic","ordering":"statistic","replicates":100000,"seed":1},)TP"
    R"TP("merge":{"rule":"none","minimum":5},"extra_estimated_parameters":0})TP";

constexpr std::size_t kMinMatch = 4;         // as LZ4: a shorter match costs more than its literals
constexpr std::size_t kMaxDistance = 65535;  // two-byte distance
constexpr const char* kPrefix = "tp1.";

const char kAlphabet[] = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_";

int alphabet_value(unsigned char c) {
    if (c >= 'A' && c <= 'Z') return c - 'A';
    if (c >= 'a' && c <= 'z') return c - 'a' + 26;
    if (c >= '0' && c <= '9') return c - '0' + 52;
    if (c == '-') return 62;
    if (c == '_') return 63;
    return -1;
}

std::string shown_character(unsigned char c) {  // a byte as it may be quoted in a message
    if (c >= 0x21 && c < 0x7F) return std::string("'") + static_cast<char>(c) + "'";
    static const char hex[] = "0123456789ABCDEF";
    return std::string("byte 0x") + hex[c >> 4] + hex[c & 15];
}

void put_length(std::string* out, std::size_t extra) {  // LZ4 length continuation: 255, 255, ..., < 255
    while (extra >= 255) { out->push_back(static_cast<char>(255)); extra -= 255; }
    out->push_back(static_cast<char>(extra));
}

void put_sequence(std::string* out, std::string_view literals, std::size_t match_length, std::size_t distance) {
    const std::size_t lit = literals.size();
    const std::size_t ml = match_length ? match_length - kMinMatch : 0;
    out->push_back(static_cast<char>((std::min<std::size_t>(lit, 15) << 4) | std::min<std::size_t>(ml, 15)));
    if (lit >= 15) put_length(out, lit - 15);
    out->append(literals.data(), lit);
    if (!match_length) return;
    out->push_back(static_cast<char>(distance & 0xFF));
    out->push_back(static_cast<char>(distance >> 8));
    if (ml >= 15) put_length(out, ml - 15);
}

// Greedy LZ77 with hash chains over dictionary + document; searches are capped, so the cost is
// linear in the document size (a 2 MB document compresses in well under a second).
std::string compress_block(std::string_view doc) {
    std::string buf;
    buf.reserve(kShareDictionary.size() + doc.size());
    buf.append(kShareDictionary.data(), kShareDictionary.size());
    buf.append(doc.data(), doc.size());
    const std::size_t start = kShareDictionary.size(), end = buf.size();
    constexpr std::size_t kHashBits = 15, kChainDepth = 64;
    std::vector<std::int32_t> head(std::size_t{1} << kHashBits, -1), prev(end, -1);  // end < 2^22
    auto hash4 = [&](std::size_t i) {
        std::uint32_t v = static_cast<unsigned char>(buf[i]) | static_cast<unsigned char>(buf[i + 1]) << 8 |
                          static_cast<unsigned char>(buf[i + 2]) << 16 | static_cast<std::uint32_t>(static_cast<unsigned char>(buf[i + 3])) << 24;
        return (v * 2654435761u) >> (32 - kHashBits);  // Knuth's multiplicative hash
    };
    auto insert = [&](std::size_t i) {
        if (i + kMinMatch > end) return;
        const auto h = hash4(i);
        prev[i] = head[h];
        head[h] = static_cast<std::int32_t>(i);
    };
    for (std::size_t i = 0; i < start; ++i) insert(i);

    std::string out;
    std::size_t anchor = start, i = start;
    while (i + kMinMatch <= end) {
        std::size_t best_len = 0, best_dist = 0, depth = 0;
        for (std::int32_t c = head[hash4(i)]; c >= 0 && depth < kChainDepth; c = prev[static_cast<std::size_t>(c)], ++depth) {
            const std::size_t cand = static_cast<std::size_t>(c);
            if (i - cand > kMaxDistance) break;
            std::size_t len = 0;
            while (i + len < end && buf[cand + len] == buf[i + len]) ++len;
            if (len > best_len) { best_len = len; best_dist = i - cand; }
        }
        if (best_len >= kMinMatch) {
            put_sequence(&out, std::string_view(buf).substr(anchor, i - anchor), best_len, best_dist);
            for (std::size_t j = 0; j < best_len; ++j) insert(i + j);
            i += best_len;
            anchor = i;
        } else {
            insert(i);
            ++i;
        }
    }
    if (anchor < end) put_sequence(&out, std::string_view(buf).substr(anchor, end - anchor), 0, 0);
    return out;
}

Status damaged(const std::string& what) { return Status::failure("The share link is damaged: " + what + "."); }
Status cut_short(const std::string& what) { return Status::failure("The share link is cut short: " + what + "."); }

// Reads a continued length starting from `base`, refusing it once it passes `limit`.
bool read_length(std::string_view in, std::size_t* pos, std::size_t base, std::size_t limit, std::size_t* out, bool* ended) {
    std::size_t v = base;
    for (;;) {
        if (*pos >= in.size()) { *ended = true; return false; }
        const unsigned char b = static_cast<unsigned char>(in[(*pos)++]);
        v += b;
        if (v > limit) { *ended = false; return false; }
        if (b < 255) break;
    }
    *out = v;
    return true;
}

}  // namespace

std::string base64url_encode(std::string_view bytes) {
    std::string out;
    out.reserve((bytes.size() * 4 + 2) / 3);
    std::size_t i = 0;
    for (; i + 3 <= bytes.size(); i += 3) {
        const std::uint32_t v = static_cast<unsigned char>(bytes[i]) << 16 | static_cast<unsigned char>(bytes[i + 1]) << 8 |
                                static_cast<unsigned char>(bytes[i + 2]);
        for (int s = 18; s >= 0; s -= 6) out.push_back(kAlphabet[(v >> s) & 63]);
    }
    const std::size_t rest = bytes.size() - i;
    if (rest == 1) {
        const std::uint32_t v = static_cast<unsigned char>(bytes[i]) << 16;
        out.push_back(kAlphabet[(v >> 18) & 63]);
        out.push_back(kAlphabet[(v >> 12) & 63]);
    } else if (rest == 2) {
        const std::uint32_t v = static_cast<unsigned char>(bytes[i]) << 16 | static_cast<unsigned char>(bytes[i + 1]) << 8;
        out.push_back(kAlphabet[(v >> 18) & 63]);
        out.push_back(kAlphabet[(v >> 12) & 63]);
        out.push_back(kAlphabet[(v >> 6) & 63]);
    }
    return out;
}

Status base64url_decode(std::string_view text, std::string* bytes) {
    for (std::size_t i = 0; i < text.size(); ++i) {
        if (alphabet_value(static_cast<unsigned char>(text[i])) < 0)
            return damaged("character " + std::to_string(i + 1) + " of its data (" +
                           shown_character(static_cast<unsigned char>(text[i])) + ") cannot appear in a share link");
    }
    if (text.size() % 4 == 1) return cut_short("its data has an impossible length (" + std::to_string(text.size()) + " characters)");
    std::string out;
    out.reserve(text.size() / 4 * 3 + 2);
    std::uint32_t acc = 0;
    int bits = 0;
    for (char ch : text) {
        acc = (acc << 6) | static_cast<std::uint32_t>(alphabet_value(static_cast<unsigned char>(ch)));
        bits += 6;
        if (bits >= 8) {
            bits -= 8;
            out.push_back(static_cast<char>((acc >> bits) & 0xFF));
        }
    }
    // RFC 4648 section 3.5: the bits left over must be zero, so each byte string has one spelling.
    if (bits > 0 && (acc & ((1u << bits) - 1)) != 0) return damaged("its last character is not a possible ending");
    *bytes = std::move(out);
    return Status::success();
}

std::uint32_t crc32_iso_hdlc(std::string_view bytes) {
    std::uint32_t crc = 0xFFFFFFFFu;
    for (unsigned char b : bytes) {
        crc ^= b;
        for (int k = 0; k < 8; ++k) crc = (crc >> 1) ^ (0xEDB88320u & (0u - (crc & 1u)));
    }
    return crc ^ 0xFFFFFFFFu;
}

std::string share_compress(std::string_view document) {
    std::string out;
    std::size_t n = document.size();
    do {  // LEB128
        unsigned char b = n & 0x7F;
        n >>= 7;
        if (n) b |= 0x80;
        out.push_back(static_cast<char>(b));
    } while (n);
    const std::uint32_t crc = crc32_iso_hdlc(document);
    for (int s = 0; s < 32; s += 8) out.push_back(static_cast<char>((crc >> s) & 0xFF));
    out += compress_block(document);
    return out;
}

Status share_decompress(std::string_view in, std::string* document) {
    std::size_t pos = 0, declared = 0;
    for (int shift = 0;; shift += 7) {
        if (pos >= in.size()) return cut_short("it ends inside its header");
        if (shift > 21) return damaged("its declared size is not a valid number");  // 4 bytes hold 2^28 > the limit
        const unsigned char b = static_cast<unsigned char>(in[pos++]);
        declared |= static_cast<std::size_t>(b & 0x7F) << shift;
        if (!(b & 0x80)) {
            if (b == 0 && shift > 0) return damaged("its declared size is not a valid number");  // over-long spelling
            break;
        }
    }
    if (declared == 0) return damaged("it declares an empty analysis");
    if (declared > kShareMaxDocumentBytes)
        return Status::failure("The share link declares an analysis of " + std::to_string(declared) +
                               " bytes; at most " + std::to_string(kShareMaxDocumentBytes) + " are accepted.");
    if (in.size() - pos < 4) return cut_short("it ends inside its header");
    std::uint32_t crc = 0;
    for (int s = 0; s < 32; s += 8) crc |= static_cast<std::uint32_t>(static_cast<unsigned char>(in[pos++])) << s;
    if (pos == in.size()) return cut_short("it has a header but no data");

    std::string buf;
    buf.reserve(kShareDictionary.size() + declared);
    buf.append(kShareDictionary.data(), kShareDictionary.size());
    const std::size_t start = buf.size(), limit = start + declared;
    const std::string longer = "its data is longer than the declared " + std::to_string(declared) + " bytes";
    while (pos < in.size()) {
        if (buf.size() == limit)  // the block ends with the byte that completes the document
            return damaged("it has " + std::to_string(in.size() - pos) + " bytes of data after its end");
        const unsigned char token = static_cast<unsigned char>(in[pos++]);
        std::size_t lit = token >> 4;
        bool ended = false;
        if (lit == 15 && !read_length(in, &pos, 15, declared, &lit, &ended))
            return ended ? cut_short("it ends inside a length") : damaged(longer);
        if (lit > in.size() - pos) return cut_short("it ends inside literal text that starts at byte " + std::to_string(pos + 1));
        if (lit > limit - buf.size()) return damaged(longer);
        buf.append(in.data() + pos, lit);
        pos += lit;
        if (pos == in.size()) break;  // the last sequence: literals only
        if (buf.size() == limit) return damaged("it has " + std::to_string(in.size() - pos) + " bytes of data after its end");
        if (in.size() - pos < 2) return cut_short("it ends inside a back-reference at byte " + std::to_string(pos + 1));
        const std::size_t distance = static_cast<unsigned char>(in[pos]) | static_cast<std::size_t>(static_cast<unsigned char>(in[pos + 1])) << 8;
        pos += 2;
        if (distance == 0) return damaged("the back-reference at byte " + std::to_string(pos - 1) + " has distance 0");
        if (distance > buf.size())
            return damaged("the back-reference at byte " + std::to_string(pos - 1) + " points before the start of the data");
        std::size_t ml = (token & 15) + kMinMatch;
        if ((token & 15) == 15 && !read_length(in, &pos, ml, declared, &ml, &ended))
            return ended ? cut_short("it ends inside a length") : damaged(longer);
        if (ml > limit - buf.size()) return damaged(longer);
        const std::size_t from = buf.size() - distance;
        for (std::size_t j = 0; j < ml; ++j) buf.push_back(buf[from + j]);  // byte by byte: overlaps repeat
    }
    const std::size_t got = buf.size() - start;
    if (got < declared)
        return cut_short("it holds " + std::to_string(got) + " of the declared " + std::to_string(declared) + " bytes");
    std::string doc = buf.substr(start);
    if (crc32_iso_hdlc(doc) != crc) return damaged("its checksum does not match its contents");
    *document = std::move(doc);
    return Status::success();
}

std::string encode_share_fragment(const std::string& document_json) {
    if (document_json.empty() || document_json.size() > kShareMaxDocumentBytes) return "";
    std::string f = kPrefix + base64url_encode(share_compress(document_json));
    if (f.size() > kShareMaxFragmentChars) return "";
    return f;
}

Status decode_share_fragment(std::string_view fragment, std::string* document_json) {
    if (!fragment.empty() && fragment[0] == '#') fragment.remove_prefix(1);
    if (fragment.empty()) return Status::failure("The share link is empty: it holds no analysis.");
    if (fragment.size() > kShareMaxFragmentChars)
        return Status::failure("The share link is too long (" + std::to_string(fragment.size()) + " characters; at most " +
                               std::to_string(kShareMaxFragmentChars) + " are read).");
    // "tp<version>." with version a whole number without leading zeros
    std::size_t v_end = 2;
    while (v_end < fragment.size() && v_end < 12 && fragment[v_end] >= '0' && fragment[v_end] <= '9') ++v_end;
    const bool shaped = fragment.size() > 2 && fragment.substr(0, 2) == "tp" && v_end > 2 && v_end < fragment.size() &&
                        fragment[v_end] == '.' && fragment[2] != '0';
    if (!shaped) return Status::failure("This is not a Tallyproof share link (it should start with \"tp1.\").");
    if (fragment.substr(0, v_end) != "tp1")
        return Status::failure("This link was made by a newer version of Tallyproof (link format " +
                               std::string(fragment.substr(0, v_end)) + "); this version opens tp1 links.");
    std::string payload, doc;
    Status s = base64url_decode(fragment.substr(v_end + 1), &payload);
    if (!s.ok) return s;
    if (payload.empty()) return cut_short("it has no data after \"tp1.\"");
    s = share_decompress(payload, &doc);
    if (!s.ok) return s;
    Analysis a;
    s = read_analysis_document(doc, &a);
    if (!s.ok) return Status::failure("The share link does not hold an analysis this version can open: " + s.message);
    *document_json = std::move(doc);
    return Status::success();
}

}  // namespace tallyproof
