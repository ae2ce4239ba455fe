// Labels: NFC checked against the Unicode Character Database's own conformance file
// (NormalizationTest.txt 15.0.0, Debian package unicode-data: every NFC invariant of part 1, and
// X == NFC(X) for every other assigned code point listed in UnicodeData.txt, part 2); which
// characters draw nothing against DerivedCoreProperties.txt's Default_Ignorable_Code_Point list;
// look-alike labels, joining categories, and the points where labels enter an analysis.
#include <doctest/doctest.h>

#include <cstdio>
#include <fstream>
#include <memory>
#include <set>
#include <sstream>
#include <string>
#include <vector>

#include "analysis_document.hpp"
#include "goodness_of_fit.hpp"
#include "label_text.hpp"
#include "merge_categories.hpp"
#include "paste_parser.hpp"
#include "pasted_analysis.hpp"

using namespace tallyproof;

namespace {

const char* kUnicodeDir = "/usr/share/unicode";

std::string utf8(const std::vector<char32_t>& cps) {
    std::string s;
    for (char32_t c : cps) {
        if (c < 0x80) s += static_cast<char>(c);
        else if (c < 0x800) { s += static_cast<char>(0xC0 | (c >> 6)); s += static_cast<char>(0x80 | (c & 0x3F)); }
        else if (c < 0x10000) {
            s += static_cast<char>(0xE0 | (c >> 12)); s += static_cast<char>(0x80 | ((c >> 6) & 0x3F));
            s += static_cast<char>(0x80 | (c & 0x3F));
        } else {
            s += static_cast<char>(0xF0 | (c >> 18)); s += static_cast<char>(0x80 | ((c >> 12) & 0x3F));
            s += static_cast<char>(0x80 | ((c >> 6) & 0x3F)); s += static_cast<char>(0x80 | (c & 0x3F));
        }
    }
    return s;
}

std::vector<char32_t> code_points(const std::string& field) {
    std::vector<char32_t> cps;
    std::istringstream in(field);
    std::string hex;
    while (in >> hex) cps.push_back(static_cast<char32_t>(std::stoul(hex, nullptr, 16)));
    return cps;
}

// The whole of a UCD file, from the plain file or through bzcat from the .bz2 Debian ships.
std::string ucd_file(const std::string& name) {
    const std::string plain = std::string(kUnicodeDir) + "/" + name;
    std::ifstream in(plain, std::ios::binary);
    if (in) return std::string(std::istreambuf_iterator<char>(in), {});
    std::string text;
    std::unique_ptr<FILE, int (*)(FILE*)> pipe(popen(("bzcat '" + plain + ".bz2' 2>/dev/null").c_str(), "r"), pclose);
    if (!pipe) return text;
    char buf[65536];
    for (std::size_t n; (n = std::fread(buf, 1, sizeof buf, pipe.get())) > 0;) text.append(buf, n);
    return text;
}

std::vector<std::string> fields(const std::string& line) {
    std::vector<std::string> out;
    std::string f;
    for (char c : line) {
        if (c == ';') { out.push_back(f); f.clear(); }
        else f += c;
    }
    out.push_back(f);
    return out;
}

}  // namespace

TEST_CASE("NFC against NormalizationTest.txt (Unicode 15.0, unicode-data)") {
    const std::string text = ucd_file("NormalizationTest.txt");
    REQUIRE_MESSAGE(!text.empty(), "NormalizationTest.txt(.bz2) not found under /usr/share/unicode: install unicode-data (.ci/bootstrap)");
    std::istringstream in(text);
    std::string line;
    int part = -1, checked = 0, failures = 0;
    std::set<char32_t> part1;
    while (std::getline(in, line)) {
        if (line.rfind("@Part", 0) == 0) { part = line[5] - '0'; continue; }
        if (line.empty() || line[0] == '#' || line[0] == '@') continue;
        const auto f = fields(line);
        REQUIRE(f.size() >= 5);
        const auto c1 = utf8(code_points(f[0])), c2 = utf8(code_points(f[1])), c3 = utf8(code_points(f[2]));
        const auto c4 = utf8(code_points(f[3])), c5 = utf8(code_points(f[4]));
        if (part == 1) part1.insert(code_points(f[0]).front());
        // c2 == toNFC(c1) == toNFC(c2) == toNFC(c3);  c4 == toNFC(c4) == toNFC(c5)
        const bool ok = nfc_text(c1) == c2 && nfc_text(c2) == c2 && nfc_text(c3) == c2 && nfc_text(c4) == c4 && nfc_text(c5) == c4;
        if (!ok && ++failures <= 5) CHECK_MESSAGE(ok, "line: " << line);
        ++checked;
    }
    CHECK(failures == 0);
    CHECK(checked > 19000);  // 19,074 test lines in 15.0.0 (counted here)
    MESSAGE(checked << " NormalizationTest.txt lines checked");

    // Part 2: every other assigned code point is its own NFC (ranges "<..., First>"/"<..., Last>").
    const std::string data = ucd_file("UnicodeData.txt");
    REQUIRE(!data.empty());
    std::istringstream ud(data);
    int singles = 0, wrong = 0;
    char32_t range_start = 0;
    while (std::getline(ud, line)) {
        const auto f = fields(line);
        if (f.size() < 2) continue;
        const char32_t c = static_cast<char32_t>(std::stoul(f[0], nullptr, 16));
        std::vector<char32_t> todo;
        if (f[1].find(", First>") != std::string::npos) { range_start = c; continue; }
        if (f[1].find(", Last>") != std::string::npos)
            for (char32_t x = range_start; x <= c; x += 97) todo.push_back(x);  // a sample of every range
        else todo.push_back(c);
        for (char32_t x : todo) {
            if ((x >= 0xD800 && x <= 0xDFFF) || part1.count(x)) continue;
            const std::string s = utf8({x});
            if (nfc_text(s) != s && ++wrong <= 5) CHECK_MESSAGE(false, "code point " << static_cast<unsigned>(x));
            ++singles;
        }
    }
    CHECK(wrong == 0);
    CHECK(singles > 30000);
}

TEST_CASE("characters that draw nothing: Default_Ignorable_Code_Point (DerivedCoreProperties.txt) and controls") {
    const std::string text = ucd_file("DerivedCoreProperties.txt");
    REQUIRE(!text.empty());
    std::istringstream in(text);
    std::string line;
    int listed = 0;
    while (std::getline(in, line)) {
        if (line.find("; Default_Ignorable_Code_Point") == std::string::npos || line[0] == '#') continue;
        const std::string range = line.substr(0, line.find(' '));
        const auto dots = range.find("..");
        const char32_t lo = static_cast<char32_t>(std::stoul(range.substr(0, dots), nullptr, 16));
        const char32_t hi = dots == std::string::npos ? lo : static_cast<char32_t>(std::stoul(range.substr(dots + 2), nullptr, 16));
        for (char32_t c = lo; c <= hi; ++c) {
            if (!draws_nothing(c)) { CHECK_MESSAGE(false, "code point " << static_cast<unsigned>(c)); break; }
            ++listed;
        }
    }
    CHECK(listed > 4000);  // 4,174 in Unicode 15.0
    for (char32_t c : {0x00u, 0x07u, 0x1Bu, 0x7Fu, 0x85u, 0x2028u, 0x2029u}) CHECK(draws_nothing(c));
    // Drawn characters, including spaces other than U+0020 and a visible format character.
    for (char32_t c : {0x41u, 0xA0u, 0xE9u, 0x3C7u, 0x600u, 0x3000u, 0xFFFDu, 0x1F600u}) CHECK_FALSE(draws_nothing(c));
}

TEST_CASE("normalised labels: NFC, invisible and direction-control characters shown as codes") {
    CHECK(normalised_label("Extra") == "Extra");
    CHECK(normalised_label("e\xCC\x81") == "\xC3\xA9");                          // e + U+0301 -> U+00E9
    CHECK(normalised_label("A\xE2\x80\x8B") == "A<U+200B>");                     // zero-width space
    CHECK(normalised_label("\xE2\x80\xAE" "exe.txt") == "<U+202E>exe.txt");      // right-to-left override
    CHECK(normalised_label("\xE2\x81\xA6x\xE2\x81\xA9") == "<U+2066>x<U+2069>"); // isolates
    CHECK(normalised_label("\xEF\xBB\xBF" "A") == "<U+FEFF>A");                  // byte-order mark
    CHECK(normalised_label("a\x07" "b") == "a<U+0007>b");
    CHECK(normalised_label(std::string("a\0b", 3)) == "a<U+0000>b");
    CHECK(normalised_label("\xF3\xA0\x80\x81") == "<U+E0001>");                  // language tag: 5 digits
    CHECK(normalised_label("Zone\xC2\xA0" "A") == "Zone\xC2\xA0" "A");           // no-break space is drawn: kept
    CHECK(normalised_label("\xCF\x87\xC2\xB2") == "\xCF\x87\xC2\xB2");           // χ² unchanged
    CHECK(normalised_label("a\xFF" "b") == "a\xEF\xBF\xBD" "b");                 // not UTF-8 -> U+FFFD
    CHECK(normalised_label("\xED\xA0\x80") == "\xEF\xBF\xBD\xEF\xBF\xBD\xEF\xBF\xBD");  // an encoded surrogate
    // Idempotent: a label read back from a document or a share link does not change again.
    for (const char* raw : {"A\xE2\x80\x8B", "\xE2\x80\xAE" "exe", "e\xCC\x81\xE2\x80\x8D", "<U+200B>", "x"})
        CHECK(normalised_label(normalised_label(raw)) == normalised_label(raw));
}

TEST_CASE("look-alike labels: invisible characters, case, surrounding spaces, Unicode forms") {
    const std::vector<std::string> labels = {"A", "A<U+200B>", " a ", "B", "\xC3\xA9t\xC3\xA9", "\xC3\x89T\xC3\x89",
                                             "Zone\xC2\xA0" "B", "Zone B", "x\xC2\xB2", "x2", "<U+0041>", "<U+202E>B<U+202C>"};
    const auto groups = look_alike_groups(labels);
    REQUIRE(groups.size() == 4);
    CHECK(groups[0] == std::vector<std::size_t>{0, 1, 2});
    CHECK(groups[1] == std::vector<std::size_t>{3, 11});  // "B" inside a direction override
    CHECK(groups[2] == std::vector<std::size_t>{4, 5});   // été / ÉTÉ: case folded
    CHECK(groups[3] == std::vector<std::size_t>{6, 7});   // no-break space
    // "x²" and "x2" look different; "<U+0041>" is literal text, not a hidden character.
    CHECK(look_alike_key("x\xC2\xB2") != look_alike_key("x2"));
    CHECK(look_alike_key("<U+0041>") != look_alike_key("A"));
    CHECK(look_alike_name(" A<U+200B> ") == "A");
    CHECK(look_alike_groups({"Red", "Green", "Blue"}).empty());
    const std::string warning = look_alike_warning(labels, groups);
    CHECK(warning.find("\"A\", \"A<U+200B>\" and \" a \"") != std::string::npos);
    CHECK(warning.find("1 more groups") != std::string::npos);
}

TEST_CASE("normalise_labels: the same text in two Unicode forms becomes one group") {
    std::vector<std::string> labels = {"caf" "e\xCC\x81", "x", "caf\xC3\xA9", "A\xE2\x80\x8B"};
    const auto same = normalise_labels(&labels);
    REQUIRE(same.size() == 1);
    CHECK(same[0] == std::vector<std::size_t>{0, 2});
    CHECK(labels == std::vector<std::string>{"caf\xC3\xA9", "x", "caf\xC3\xA9", "A<U+200B>"});
    std::vector<std::string> plain = {"a", "b"};
    CHECK(normalise_labels(&plain).empty());
}

TEST_CASE("join_categories adds counts and the model's values, in the place of the first member") {
    Analysis a;
    a.categories = {"A", "B", "A<U+200B>", "C"};
    a.observed = {10, 20, 5, 7};
    a.model.kind = ModelKind::shares;
    a.model.values = {0.25, 0.25, 0.125, 0.375};
    REQUIRE(join_categories({{0, 2}}, {"A"}, &a).ok);
    CHECK(a.categories == std::vector<std::string>{"A", "B", "C"});
    CHECK(a.observed == std::vector<double>{15, 20, 7});
    CHECK(a.model.values == std::vector<double>{0.375, 0.25, 0.375});
    // Refusals leave the analysis as it was.
    const Analysis before = a;
    CHECK_FALSE(join_categories({{0, 5}}, {"A"}, &a).ok);
    CHECK_FALSE(join_categories({{0, 1}, {1, 2}}, {"A", "B"}, &a).ok);
    CHECK_FALSE(join_categories({{0}}, {"A"}, &a).ok);
    CHECK(a.observed == before.observed);
    Analysis bins;
    bins.categories = {"a", "b", "c"};
    bins.observed = {1, 2, 3};
    bins.model.kind = ModelKind::normal;
    bins.model.edges = {-1, 0, 1, 2};
    CHECK_FALSE(join_categories({{0, 2}}, {"a"}, &bins).ok);
}

TEST_CASE("labels entering an analysis: paste, document, share-link round trip, look-alike warning") {
    // Raw text values: é composed and decomposed are one value, counted together.
    ParseOptions raw;
    raw.raw = true;
    const ParsedInput parsed = parse_input("caf\xC3\xA9\ncaf" "e\xCC\x81\ntea\ntea\ntea\n", raw);
    REQUIRE(parsed.status.ok);
    REQUIRE(parsed.categories.size() == 3);  // the reader itself keeps the two forms apart
    Analysis a;
    std::vector<std::string> notes;
    apply_pasted_input(parsed, &a, &notes);
    CHECK(a.categories == std::vector<std::string>{"caf\xC3\xA9", "tea"});
    CHECK(a.observed == std::vector<double>{2, 3});
    REQUIRE(notes.size() == 1);
    CHECK(notes[0].find("more than one Unicode form") != std::string::npos);

    // A label-count paste: the zero-width space is shown, and the two labels are flagged.
    const ParsedInput table = parse_input("A\t30\nA\xE2\x80\x8B\t4\nB\t12\n");
    REQUIRE(table.status.ok);
    Analysis t;
    apply_pasted_input(table, &t);
    CHECK(t.categories == std::vector<std::string>{"A", "A<U+200B>", "B"});
    const Result r = analyse(t);
    REQUIRE(r.status.ok);
    REQUIRE(r.look_alike_labels.size() == 1);
    CHECK(r.look_alike_labels[0] == std::vector<std::size_t>{0, 1});
    bool warned = false;
    for (const auto& w : r.warnings) warned = warned || w.find("look the same") != std::string::npos;
    CHECK(warned);

    // Documents: labels are normalised on reading; two Unicode forms of one label are refused as
    // the same label twice; what is written reads back unchanged.
    Analysis d;
    REQUIRE(read_analysis_document(R"({"categories":["A\u200b","\u202eexe"],"observed":[1,2]})", &d).ok);
    CHECK(d.categories == std::vector<std::string>{"A<U+200B>", "<U+202E>exe"});
    Analysis again;
    REQUIRE(read_analysis_document(write_analysis_document(d), &again).ok);
    CHECK(again.categories == d.categories);
    const Status twice = read_analysis_document(R"({"categories":["e\u0301","\u00e9"],"observed":[1,2]})", &d);
    CHECK_FALSE(twice.ok);
    CHECK(twice.message.find("appears twice") != std::string::npos);
}
