// Share links: base64url against RFC 4648 section 10's test vectors, CRC-32 against its standard
// check value, lossless round trips of 100 random analysis documents, compression of typical
// documents, and a catalogue of hostile fragments, each refused with its exact message.
#include <doctest/doctest.h>

#include <cstdio>
#include <random>
#include <string>
#include <vector>

#include "analysis_document.hpp"
#include "label_text.hpp"
#include "share_link.hpp"

using namespace tallyproof;

namespace {

std::string bytes(std::initializer_list<int> v) {
    std::string s;
    for (int b : v) s.push_back(static_cast<char>(b));
    return s;
}

// A payload by hand: one-byte varint size (< 128), CRC-32 of `doc_for_crc`, then `block`.
std::string payload(int declared, const std::string& doc_for_crc, const std::string& block) {
    std::string p = bytes({declared});
    const std::uint32_t c = crc32_iso_hdlc(doc_for_crc);
    for (int s = 0; s < 32; s += 8) p.push_back(static_cast<char>((c >> s) & 0xFF));
    return p + block;
}

std::string link(const std::string& raw_payload) { return "tp1." + base64url_encode(raw_payload); }

std::string literal_block(const std::string& text) {  // one literal-only sequence (text < 15 bytes)
    return bytes({static_cast<int>(text.size()) << 4}) + text;
}

std::string message_of(std::string_view fragment) {
    std::string doc = "untouched";
    const Status s = decode_share_fragment(fragment, &doc);
    if (s.ok) return "(decoded)";
    CHECK(doc == "untouched");  // nothing half-written on refusal
    return s.message;
}

std::string random_label(std::mt19937& g) {
    static const char* pieces[] = {"A", "b", "Z9", " ", "é", "Ω", "中", "\"", "\\", "\t", "\n", "=1+1", "<script>", "😀", "'", ",", ";", "\x01"};
    std::string s;
    const int n = 1 + static_cast<int>(g() % 4);
    for (int i = 0; i < n; ++i) s += pieces[g() % (sizeof pieces / sizeof *pieces)];
    return s;
}

double random_number(std::mt19937& g) {
    switch (g() % 4) {
        case 0: return static_cast<double>(g() % 1000);
        case 1: return std::uniform_real_distribution<double>(0, 1)(g);
        case 2: return std::uniform_real_distribution<double>(-1e6, 1e6)(g);
        default: return std::ldexp(static_cast<double>(g() % 100000 + 1), -static_cast<int>(g() % 60));
    }
}

Analysis random_analysis(std::mt19937& g) {
    static const ModelKind kinds[] = {ModelKind::equal, ModelKind::shares, ModelKind::ratio, ModelKind::counts, ModelKind::poisson,
                                      ModelKind::binomial, ModelKind::geometric, ModelKind::negative_binomial, ModelKind::uniform,
                                      ModelKind::normal, ModelKind::lognormal, ModelKind::exponential, ModelKind::benford_first,
                                      ModelKind::benford_second, ModelKind::benford_first_two, ModelKind::last_digit,
                                      ModelKind::last_digit_even};
    static const MergeRule rules[] = {MergeRule::none, MergeRule::all_at_least_5, MergeRule::cochran, MergeRule::custom_minimum};
    Analysis a;
    const int k = 2 + static_cast<int>(g() % (g() % 5 == 0 ? 200 : 12));
    for (int i = 0; i < k; ++i) {
        // labels must differ (documents refuse a label twice): the index keeps them apart
        a.categories.push_back(g() % 2 ? std::to_string(i) : random_label(g) + " #" + std::to_string(i));
        a.observed.push_back(static_cast<double>(g() % (g() % 3 ? 100 : 100000)));
    }
    a.ordered = g() % 2;
    a.model.kind = kinds[g() % (sizeof kinds / sizeof *kinds)];
    if (g() % 2) for (int i = 0; i < k; ++i) a.model.values.push_back(random_number(g));
    if (g() % 2) {
        const char* names[] = {"mean", "sd", "p", "size", "trials", "rate", "meanlog", "sdlog"};
        for (int i = 0, m = static_cast<int>(g() % 3); i < m; ++i) a.model.parameters.emplace_back(names[(g() % 4) * 2 + i % 2], random_number(g));
    }
    if (g() % 3 == 0) for (int i = 0; i <= k; ++i) a.model.edges.push_back(random_number(g));
    const double lambdas[] = {1, 0, 2.0 / 3, -0.5, -1, -2, 0.37};
    a.statistic.lambda = lambdas[g() % 7];
    a.statistic.williams = g() % 4 == 0;
    a.alpha = g() % 2 ? 0.05 : std::uniform_real_distribution<double>(0.001, 0.2)(g);
    a.pvalue.method = static_cast<PValueMethod>(g() % 3);
    a.pvalue.ordering = g() % 2 ? ExactOrdering::statistic : ExactOrdering::probability;
    a.pvalue.replicates = 1 + g() % 1000000;
    a.pvalue.seed = (static_cast<std::uint64_t>(g()) << 21) ^ g();  // below 2^53
    a.merge.rule = rules[g() % 4];
    a.merge.minimum = 1 + g() % 10;
    a.extra_estimated_parameters = static_cast<int>(g() % 3);
    if (g() % 3 == 0) {
        a.plan.requested = true;
        if (g() % 2) a.plan.w = 0.3;
        if (g() % 2) a.plan.n = 1 + g() % 1000;
        if (g() % 2) a.plan.target_power = 0.8;
    }
    return a;
}

}  // namespace

TEST_CASE("base64url: RFC 4648 section 10 test vectors (padding dropped, section 3.2)") {
    CHECK(base64url_encode("") == "");              // RFC 4648 s.10
    CHECK(base64url_encode("f") == "Zg");           // RFC 4648 s.10: "Zg=="
    CHECK(base64url_encode("fo") == "Zm8");         // RFC 4648 s.10: "Zm8="
    CHECK(base64url_encode("foo") == "Zm9v");       // RFC 4648 s.10
    CHECK(base64url_encode("foob") == "Zm9vYg");    // RFC 4648 s.10
    CHECK(base64url_encode("fooba") == "Zm9vYmE");  // RFC 4648 s.10
    CHECK(base64url_encode("foobar") == "Zm9vYmFy");  // RFC 4648 s.10
    // The URL-safe alphabet (RFC 4648 s.5): 0xFB 0xFF is "+/8=" in base64, "-_8" in base64url.
    CHECK(base64url_encode(bytes({0xFB, 0xFF})) == "-_8");
    std::string out;
    REQUIRE(base64url_decode("Zm9vYmE", &out).ok);
    CHECK(out == "fooba");
    REQUIRE(base64url_decode("-_8", &out).ok);
    CHECK(out == bytes({0xFB, 0xFF}));
    CHECK_FALSE(base64url_decode("Zm9vYmE=", &out).ok);  // padding is refused: links carry none
    CHECK_FALSE(base64url_decode("Zh", &out).ok);        // non-zero pad bits (RFC 4648 s.3.5)
    CHECK_FALSE(base64url_decode("Zm9vY", &out).ok);     // 5 characters cannot end base64
    CHECK_FALSE(base64url_decode("Zm+v", &out).ok);      // '+' belongs to base64, not base64url
}

TEST_CASE("CRC-32 check value") {
    CHECK(crc32_iso_hdlc("123456789") == 0xCBF43926u);  // standard check value of CRC-32/ISO-HDLC (zlib crc32)
    CHECK(crc32_iso_hdlc("") == 0u);                    // closed form: initial and final XOR cancel
}

TEST_CASE("100 random analysis documents round-trip through share links") {
    std::mt19937 g(20240611u);  // fixed seed: the same documents on every run
    std::size_t total_doc = 0, total_fragment = 0;
    for (int t = 0; t < 100; ++t) {
        // Labels as they enter an analysis (label_text.hpp: control characters shown as <U+XXXX>),
        // so what the page writes is what it reads back.
        Analysis original = random_analysis(g);
        normalise_labels(&original.categories);
        const std::string doc = write_analysis_document(original);
        const std::string fragment = encode_share_fragment(doc);
        REQUIRE(fragment.rfind("tp1.", 0) == 0);
        std::string back;
        const Status s = decode_share_fragment(fragment, &back);
        REQUIRE_MESSAGE(s.ok, s.message);
        CHECK(back == doc);
        Analysis a;
        REQUIRE(read_analysis_document(back, &a).ok);
        CHECK(write_analysis_document(a) == doc);
        std::string with_hash;
        REQUIRE(decode_share_fragment("#" + fragment, &with_hash).ok);
        CHECK(with_hash == doc);
        total_doc += doc.size();
        total_fragment += fragment.size();
    }
    MESSAGE("100 random documents: " << total_doc << " bytes as JSON, " << total_fragment << " characters as fragments");
}

TEST_CASE("compression shrinks typical documents") {
    Analysis a;  // a die rolled 600 times, equal shares: the commonest kind of analysis
    a.categories = {"1", "2", "3", "4", "5", "6"};
    a.observed = {95, 108, 99, 102, 91, 105};
    const std::string die = write_analysis_document(a);
    const std::string f1 = encode_share_fragment(die);
    CHECK(f1.size() * 3 < die.size());  // far below the JSON (measured: see MESSAGE)

    Analysis b;  // first digits against Benford's law
    b.categories = {"1", "2", "3", "4", "5", "6", "7", "8", "9"};
    b.observed = {301, 176, 125, 97, 79, 67, 58, 51, 46};
    b.ordered = true;
    b.model.kind = ModelKind::benford_first;
    const std::string benford = write_analysis_document(b);
    const std::string f2 = encode_share_fragment(benford);
    CHECK(f2.size() * 3 < benford.size());

    Analysis c;  // a Poisson fit with Monte Carlo p and planning: less common members
    c.categories = {"0", "1", "2", "3", "4", "5 or more"};
    c.observed = {109, 65, 22, 3, 1, 0};
    c.ordered = true;
    c.model.kind = ModelKind::poisson;
    c.pvalue.method = PValueMethod::monte_carlo;
    c.pvalue.seed = 7;
    c.merge.rule = MergeRule::all_at_least_5;
    c.plan.requested = true;
    c.plan.w = 0.3;
    const std::string poisson = write_analysis_document(c);
    const std::string f3 = encode_share_fragment(poisson);
    CHECK(f3.size() * 2 < poisson.size());

    Analysis d;  // 300 months of counts: long, repetitive labels
    for (int i = 0; i < 300; ++i) {
        d.categories.push_back("Month " + std::to_string(i + 1));
        d.observed.push_back(100 + (i * 37) % 50);
    }
    const std::string months = write_analysis_document(d);
    const std::string f4 = encode_share_fragment(months);
    CHECK(f4.size() < months.size());
    MESSAGE("die " << die.size() << " -> " << f1.size() << ", Benford " << benford.size() << " -> " << f2.size()
                   << ", Poisson " << poisson.size() << " -> " << f3.size() << ", 300 months " << months.size() << " -> " << f4.size());
    for (const auto* p : {&f1, &f2, &f3, &f4}) {
        std::string back;
        CHECK(decode_share_fragment(*p, &back).ok);
    }
}

TEST_CASE("encoding refuses what decoding would refuse") {
    CHECK(encode_share_fragment("") == "");
    CHECK(encode_share_fragment(std::string(kShareMaxDocumentBytes + 1, ' ')) == "");
    std::mt19937 g(5);
    std::string noise;  // incompressible: its fragment would pass the 64 KB limit
    for (int i = 0; i < 60000; ++i) noise.push_back(static_cast<char>('a' + g() % 26));
    CHECK(encode_share_fragment(noise) == "");
    // A long but repetitive document fits: 2 MB of one byte compresses to a few KB.
    std::string big = "{\"observed\":[1";
    while (big.size() + 4 <= kShareMaxDocumentBytes) big += ",1";
    big += "]}";
    REQUIRE(big.size() <= kShareMaxDocumentBytes);
    const std::string f = encode_share_fragment(big);
    REQUIRE_FALSE(f.empty());
    REQUIRE(f.compare(0, 4, "tp1.") == 0);
    std::string payload, back;
    REQUIRE(base64url_decode(std::string_view(f).substr(4), &payload).ok);
    const Status s = share_decompress(payload, &back);  // the codec itself carries it back whole
    CHECK_MESSAGE(s.ok, s.message);
    CHECK(static_cast<bool>(back == big));  // (not printed: 2 MB)
    // As a link it is refused by the document reader: a million categories is more than it analyses.
    const Status opened = decode_share_fragment(f, &back);
    CHECK_FALSE(opened.ok);
    CHECK(opened.message.find("at most 100000 can be analysed") != std::string::npos);
    MESSAGE("2 MB document -> " << f.size() << " characters");
}

TEST_CASE("hostile fragments: each refused with its exact message") {
    const std::string ok_doc = R"({"observed":[1,2]})";
    struct Case { const char* name; std::string fragment; std::string message; };
    const std::vector<Case> cases = {
        {"empty", "", "The share link is empty: it holds no analysis."},
        {"only a hash", "#", "The share link is empty: it holds no analysis."},
        {"bad prefix", "xy1.Zm9v", "This is not a Tallyproof share link (it should start with \"tp1.\")."},
        {"no dot", "tp1", "This is not a Tallyproof share link (it should start with \"tp1.\")."},
        {"leading zero version", "tp01.Zm9v", "This is not a Tallyproof share link (it should start with \"tp1.\")."},
        {"newer version", "tp2.Zm9v", "This link was made by a newer version of Tallyproof (link format tp2); this version opens tp1 links."},
        {"much newer version", "tp10.anything*at*all", "This link was made by a newer version of Tallyproof (link format tp10); this version opens tp1 links."},
        {"too long", "tp1." + std::string(70000, 'A'), "The share link is too long (70004 characters; at most 65536 are read)."},
        {"no data", "tp1.", "The share link is cut short: it has no data after \"tp1.\"."},
        {"bad base64 character", "tp1.ab*c", "The share link is damaged: character 3 of its data ('*') cannot appear in a share link."},
        {"padding", "tp1.Zm8=", "The share link is damaged: character 4 of its data ('=') cannot appear in a share link."},
        {"non-ASCII", "tp1.Zm\xC3\xA9", "The share link is damaged: character 3 of its data (byte 0xC3) cannot appear in a share link."},
        {"impossible length", "tp1.Zm9vY", "The share link is cut short: its data has an impossible length (5 characters)."},
        {"non-zero pad bits", "tp1.Zh", "The share link is damaged: its last character is not a possible ending."},
        {"truncated header", link(bytes({0x80})), "The share link is cut short: it ends inside its header."},
        {"truncated checksum", link(bytes({18, 1, 2})), "The share link is cut short: it ends inside its header."},
        {"over-long size", link(bytes({0x80, 0x80, 0x80, 0x80, 0x01, 0, 0, 0, 0, 0})), "The share link is damaged: its declared size is not a valid number."},
        {"padded size", link(bytes({0x92, 0x00, 0, 0, 0, 0, 0})), "The share link is damaged: its declared size is not a valid number."},
        {"declared empty", link(bytes({0, 0, 0, 0, 0, 0})), "The share link is damaged: it declares an empty analysis."},
        // 3,000,000 = 0xC0 0x8D 0xB7 0x01 in LEB128 (0x40 + 0x0D*128 + 0x37*128^2 + 1*128^3)
        {"huge declared size", link(bytes({0xC0, 0x8D, 0xB7, 0x01, 0, 0, 0, 0, 0})), "The share link declares an analysis of 3000000 bytes; at most 2097152 are accepted."},
        {"header only", link(payload(18, ok_doc, "")), "The share link is cut short: it has a header but no data."},
        {"truncated literals", link(payload(18, ok_doc, bytes({0x50}) + "{\"")), "The share link is cut short: it ends inside literal text that starts at byte 7."},
        {"truncated literal length", link(payload(18, ok_doc, bytes({0xF0}))), "The share link is cut short: it ends inside a length."},
        {"truncated back-reference", link(payload(18, ok_doc, bytes({0x10, '{', 0x01}))), "The share link is cut short: it ends inside a back-reference at byte 8."},
        {"distance zero", link(payload(18, ok_doc, bytes({0x10, '{', 0, 0, 0x00}))), "The share link is damaged: the back-reference at byte 8 has distance 0."},
        {"back-reference before start", link(payload(18, ok_doc, bytes({0x10, '{', 0xFF, 0xFF, 0x00}))), "The share link is damaged: the back-reference at byte 8 points before the start of the data."},
        {"literal length overflow", link(payload(18, ok_doc, bytes({0xF0, 255, 255, 255, 255, 255, 255, 255, 255}))), "The share link is damaged: its data is longer than the declared 18 bytes."},
        {"match length overflow", link(payload(18, ok_doc, bytes({0x1F, '{', 1, 0, 200}))), "The share link is damaged: its data is longer than the declared 18 bytes."},
        {"trailing junk", link(share_compress(ok_doc) + bytes({0x10, 'x'})), "The share link is damaged: it has 2 bytes of data after its end."},
        {"literals past the declared size", link(payload(2, "{}", literal_block("{}x"))), "The share link is damaged: its data is longer than the declared 2 bytes."},
        {"short of declared size", link(payload(18, ok_doc, literal_block("{\"obs"))), "The share link is cut short: it holds 5 of the declared 18 bytes."},
        {"checksum mismatch", link(payload(5, "hellO", literal_block("hello"))), "The share link is damaged: its checksum does not match its contents."},
        {"valid compression of non-JSON", link(share_compress("hello")), "The share link does not hold an analysis this version can open: Not a valid document: unexpected character at byte 1."},
        {"JSON that is not an object", link(share_compress("[1,2]")), "The share link does not hold an analysis this version can open: The document must be a JSON object."},
        {"JSON that is not a document", link(share_compress("{\"a\":1}")), "The share link does not hold an analysis this version can open: The document has no \"observed\" counts."},
        {"document of a newer format", link(share_compress("{\"format\":\"tallyproof/2\",\"observed\":[1]}")),
         "The share link does not hold an analysis this version can open: This document has format \"tallyproof/2\", written by a newer version of Tallyproof; this version reads \"tallyproof/1\"."},
    };
    for (const auto& c : cases) {
        INFO(c.name);
        CHECK(message_of(c.fragment) == c.message);
    }
    // The hand-made payload helper is itself right: the same bytes with a good block decode.
    std::string doc;
    REQUIRE(decode_share_fragment(link(payload(18, ok_doc, bytes({0xF0, 3}) + ok_doc)), &doc).ok);
    CHECK(doc == ok_doc);
}

TEST_CASE("back-references into the dictionary and overlapping copies") {
    // Distance 1 with a long match repeats the last byte (overlapping copy, as LZ4 allows).
    const std::string doc = "{\"observed\":[1" + std::string(40, '1') + "]}";
    const std::string block = bytes({0xEF}) + "{\"observed\":[1" + bytes({1, 0, 40 - 4 - 15}) + bytes({0x20}) + "]}";
    std::string back;
    const Status s = decode_share_fragment(link(payload(static_cast<int>(doc.size()), doc, block)), &back);
    REQUIRE_MESSAGE(s.ok, s.message);
    CHECK(back == doc);
    // The dictionary starts with {"format":"tallyproof/1", so a document starting the same way
    // compresses to a back-reference as its first sequence (token with no literals).
    const std::string c = share_compress(R"({"format":"tallyproof/1","observed":[3,4]})");
    CHECK((static_cast<unsigned char>(c[5]) >> 4) == 0);
}
