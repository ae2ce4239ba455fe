// Parse speed: prints how long parse_input takes on generated pastes (a program that prints
// figures, not a test). The main figure: one million raw invoice-like amounts (~7 MB) read and
// tallied by first digit. Amounts come from a fixed LCG, log-uniform over 1..100000 (so their
// first digits follow Benford's law), written with two decimals.
// Build: g++ -std=c++17 -O2 -I core tests/bench/bench_parse.cpp core/{paste_parser,number_reading,
//        delimited_text,table_shape,raw_observations,binning,digit_extraction,digit_laws}.cpp
// Usage: bench_parse [FILE]   (FILE: time that file instead, read as raw numbers for a first-digit test)
#include <chrono>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <fstream>
#include <sstream>
#include <string>

#include "paste_parser.hpp"

using namespace tallyproof;

namespace {

std::uint64_t state = 12345;
double uniform() {  // Knuth's MMIX LCG, top 53 bits
    state = state * 6364136223846793005ULL + 1442695040888963407ULL;
    return static_cast<double>(state >> 11) * 0x1.0p-53;
}

std::string amounts(std::size_t n) {
    std::string s;
    s.reserve(n * 10);
    char buf[32];
    for (std::size_t i = 0; i < n; ++i) {
        const double v = std::pow(10.0, 5 * uniform());
        std::snprintf(buf, sizeof buf, "%.2f\n", v);
        s += buf;
    }
    return s;
}

template <class F>
double best_of(int reps, F&& f) {
    double best = 1e300;
    for (int r = 0; r < reps; ++r) {
        const auto t0 = std::chrono::steady_clock::now();
        f();
        const auto t1 = std::chrono::steady_clock::now();
        best = std::min(best, std::chrono::duration<double>(t1 - t0).count());
    }
    return best;
}

void report(const char* what, const std::string& text, const ParseOptions& o, int reps) {
    ParsedInput p;
    const double t = best_of(reps, [&] { p = parse_input(text, o); });
    std::printf("%-44s %9.1f KB %9.4f s %8.1f MB/s  ok=%d categories=%zu\n", what, text.size() / 1024.0, t,
                text.size() / 1e6 / t, p.status.ok, p.categories.size());
}

}  // namespace

int main(int argc, char** argv) {
    ParseOptions digits;
    digits.digits = DigitTest::first;
    if (argc > 1) {
        std::ifstream in(argv[1], std::ios::binary);
        std::ostringstream ss;
        ss << in.rdbuf();
        report(argv[1], ss.str(), digits, 5);
        return 0;
    }
    const std::string million = amounts(1000000);
    report("1e6 raw amounts, first-digit tally", million, digits, 5);
    ParseOptions second;
    second.digits = DigitTest::second;
    report("1e6 raw amounts, second-digit tally", million, second, 3);
    ParseOptions bins;
    bins.bins.kind = BinChoice::Kind::equal_width;
    bins.bins.bins = 20;
    report("1e6 raw amounts, 20 equal-width bins", million, bins, 3);
    std::string whole;
    for (int i = 0; i < 1000000; ++i) whole += std::to_string(static_cast<int>(uniform() * 8)) + "\n";
    report("1e6 raw whole numbers 0-7", whole, {}, 3);
    std::string text;
    const char* colours[] = {"red", "green", "blue", "yellow", "black"};
    for (int i = 0; i < 1000000; ++i) text += std::string(colours[static_cast<int>(uniform() * 5)]) + "\n";
    report("1e6 raw text values (5 kinds)", text, {}, 3);
    std::string table;
    for (int i = 0; i < 50000; ++i) table += "Category " + std::to_string(i) + "\t" + std::to_string(i % 97) + "\n";
    report("50000-row label<TAB>count table", table, {}, 3);
    std::string huge(10000000, '\n');
    for (std::size_t i = 0; i < huge.size(); i += 2) huge[i] = static_cast<char>('0' + (i / 2) % 10);
    report("10e6 lines of one digit (guard check)", huge, {}, 1);
    std::string distinct;
    for (int i = 0; i < 10000000; ++i) distinct += "v" + std::to_string(i) + "\n";
    report("10e6 distinct text lines (refused)", distinct, {}, 1);
    return 0;
}
