// DigitStreamTally (core/input/stream_tally.hpp): a digit tally fed in pieces cut at line ends
// must equal read_input's reading of the whole text (two paths, one answer): the same counts,
// the same notes (the lines of values left out counted across pieces), the same refusals. The
// texts are generated here; the reference is the whole-text reader, not a stored number.
#include <doctest/doctest.h>

#include <cstdint>
#include <string>
#include <vector>

#include "read_input.hpp"
#include "stream_tally.hpp"

using namespace tallyproof;

namespace {

// Amounts from a fixed linear congruential sequence, with a header, a zero, a word and a blank line.
std::string amounts(int n) {
    std::string t = "Amount\n";
    std::uint64_t x = 12345;
    for (int i = 0; i < n; ++i) {
        x = x * 6364136223846793005ULL + 1442695040888963407ULL;
        if (i == 17) t += "0\n";
        else if (i == 400) t += "n/a\n";
        else if (i == 901) t += "\n";
        else t += std::to_string((x >> 33) % 1000000) + "." + std::to_string((x >> 20) % 100) + "\n";
    }
    return t;
}

ParsedInput whole(const std::string& text, DigitTest test) {
    ParseOptions o;
    o.digits = test;
    ReadInputOptions how;
    how.groups = GroupsReading::never;
    return read_input(text, o, how).sample;
}

// Feeds `text` in pieces of about `size` bytes, each cut after a line end; the shape from the first.
ParsedInput streamed(const std::string& text, DigitTest test, std::size_t size, std::size_t* first_bytes) {
    std::size_t cut = text.rfind('\n', size);
    const std::string first = text.substr(0, cut + 1);
    *first_bytes = first.size();
    const ParsedInput head = whole(first, test);
    REQUIRE(DigitStreamTally::continues(head));
    DigitStreamTally tally(head);
    CHECK(tally.feed(first));
    for (std::size_t at = first.size(); at < text.size();) {
        std::size_t end = text.rfind('\n', at + size);
        end = end == std::string::npos || end < at ? text.size() : end + 1;
        CHECK(tally.feed(std::string_view(text).substr(at, end - at)));
        at = end;
    }
    return tally.finish(first.size(), text.size());
}

}  // namespace

TEST_CASE("a digit tally streamed in pieces equals the whole text read at once") {
    const std::string text = amounts(3000);
    for (DigitTest test : {DigitTest::first, DigitTest::second, DigitTest::first_two, DigitTest::last}) {
        for (std::size_t size : {std::size_t(64), std::size_t(1000), std::size_t(7777)}) {
            CAPTURE(size);
            const ParsedInput a = whole(text, test);
            std::size_t first_bytes = 0;
            ParsedInput b = streamed(text, test, size, &first_bytes);
            REQUIRE(a.status.ok);
            REQUIRE(b.status.ok);
            CHECK(a.categories == b.categories);
            CHECK(a.observed == b.observed);
            CHECK(a.decimal == b.decimal);
            CHECK(a.column_names == b.column_names);
            // The streamed reading says so in one last note; every other note is the same.
            REQUIRE(!b.notes.empty());
            CHECK(b.notes.back().find("was streamed") != std::string::npos);
            b.notes.pop_back();
            CHECK(a.notes == b.notes);
        }
    }
}

TEST_CASE("a value left out in a later piece is reported at its line in the whole text") {
    // Line 1 is the header, so value i (from 0) is on line i + 2: the zero (i = 17) on line 19,
    // "n/a" (i = 400) on line 402, counted by hand from amounts().
    const std::string text = amounts(3000);
    std::size_t first_bytes = 0;
    const ParsedInput b = streamed(text, DigitTest::first, 200, &first_bytes);
    bool zero = false, word = false;
    for (const auto& n : b.notes) {
        zero = zero || n.find("(first at line 19, column 1)") != std::string::npos;
        word = word || n.find("(first at line 402, column 1)") != std::string::npos;
    }
    CHECK(zero);
    CHECK(word);
}

TEST_CASE("a later piece that is not UTF-8 text is refused, with the line reached") {
    const std::string text = amounts(50);
    const ParsedInput head = whole(text, DigitTest::first);
    DigitStreamTally tally(head);
    CHECK(tally.feed(text));
    CHECK_FALSE(tally.feed("12\n\xFF\xFE\n"));
    const ParsedInput r = tally.finish(text.size(), text.size() + 6);
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("after line 51") != std::string::npos);
}

namespace {
// `text` pushed to core's DigitStreamReader (the tool's and the page's rule) in pieces of `size` bytes, cut anywhere.
ParsedInput pushed(const std::string& text, DigitTest test, std::size_t size, DigitStreamReader::State* state) {
    ParseOptions o;
    o.digits = test;
    DigitStreamReader reader(o);
    for (std::size_t at = 0; at < text.size(); at += size) reader.push(std::string_view(text).substr(at, size));
    *state = reader.end();
    CHECK(reader.bytes() == text.size());
    return *state == DigitStreamReader::State::whole ? ParsedInput{} : reader.finish();
}
}  // namespace

TEST_CASE("the stream reader decides from the first MiB and, pushed pieces cut anywhere, equals the whole text") {
    const std::string text = amounts(170000);  // about 1.6 MB: longer than the head
    REQUIRE(text.size() > kStreamHeadBytes);
    const ParsedInput a = whole(text, DigitTest::first);
    REQUIRE(a.status.ok);
    for (std::size_t size : {std::size_t(997), std::size_t(4093), std::size_t(1u << 20), std::size_t(3u << 20)}) {
        CAPTURE(size);
        DigitStreamReader::State state{};
        ParsedInput b = pushed(text, DigitTest::first, size, &state);
        REQUIRE(state == DigitStreamReader::State::streaming);
        REQUIRE(b.status.ok);
        CHECK(a.observed == b.observed);
        REQUIRE(!b.notes.empty());
        // The last note gives the bytes of the whole text, which the reader counted itself.
        CHECK(b.notes.back().find(std::to_string(text.size() - text.substr(0, kStreamHeadBytes).rfind('\n') - 1) + " bytes") !=
              std::string::npos);
        b.notes.pop_back();
        CHECK(a.notes == b.notes);
    }
    // Shorter than the head, not numbers, or a document: read whole, with every byte handed back.
    for (const std::string& t : {amounts(100), std::string(kStreamHeadBytes + 10, 'x') + "\n", "{\n" + text}) {
        ParseOptions o;
        o.digits = DigitTest::first;
        DigitStreamReader reader(o);
        reader.push(t);
        CHECK(reader.end() == DigitStreamReader::State::whole);
        CHECK(reader.take_held() == t);
    }
}
