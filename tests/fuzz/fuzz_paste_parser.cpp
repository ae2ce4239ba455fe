// libFuzzer target for the paste parser: any bytes, with options taken from the first byte,
// must give either a located refusal or counts that satisfy the documented invariants, without
// crash, leak, undefined behaviour or hang. Build and run: tests/fuzz/run_fuzzer.sh paste_parser 300
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "paste_parser.hpp"

using namespace tallyproof;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    ParseOptions o;
    std::string_view text(reinterpret_cast<const char*>(data), size);
    if (size > 0 && data[0] < 0x20 && data[0] != '\t' && data[0] != '\n' && data[0] != '\r') {
        const unsigned b = data[0];  // a control byte selects options; printable pastes use defaults
        switch (b & 7) {
            case 1: o.digits = static_cast<DigitTest>((b >> 3) % 5); break;
            case 2: o.bins.kind = BinChoice::Kind::equal_width; o.bins.bins = 1 + static_cast<int>(b % 7); break;
            case 3: o.bins.kind = BinChoice::Kind::edges; o.bins.edges = {-HUGE_VAL, 0, 10, 100, HUGE_VAL}; break;
            case 4: o.raw = true; o.case_fold = b & 8; o.sorted = b & 16; break;
            case 5: o.decimal = (b & 8) ? DecimalMark::comma : DecimalMark::point; break;
            case 6: o.shape = static_cast<InputShape>(b % 8); o.third_column = static_cast<ThirdColumn>((b >> 3) % 3); break;
            case 7: o.separator = static_cast<Separator>(b % 4); break;
            default:  // 0x08, 0x10, 0x18: equal-probability bins under the normal, lognormal, exponential
                if (b) {
                    const ModelKind kinds[] = {ModelKind::normal, ModelKind::lognormal, ModelKind::exponential};
                    o.bins.kind = BinChoice::Kind::equal_probability;
                    o.bins.bins = 2 + static_cast<int>(b % 5);
                    o.bins.model = kinds[(b >> 3) - 1];
                }
                break;
        }
        text.remove_prefix(1);
    }
    const ParsedInput p = parse_input(text, o);
    if (!p.status.ok) {
        if (p.status.message.empty()) __builtin_trap();
        return 0;
    }
    if (p.categories.size() != p.observed.size()) __builtin_trap();
    if (!p.expected.empty() && p.expected.size() != p.observed.size()) __builtin_trap();
    if (p.categories.size() > kMaxCategories || p.problems.size() > kMaxProblems) __builtin_trap();
    for (double v : p.observed)
        if (!(v >= 0) || v != std::floor(v) || !std::isfinite(v)) __builtin_trap();
    for (double v : p.expected)
        if (!(v >= 0) || !std::isfinite(v)) __builtin_trap();
    if (p.shape == InputShape::raw_bins && p.edges.size() != p.observed.size() + 1) __builtin_trap();
    const ParsedCounts c = parse_counts(text);  // the simple entry point must agree with the default options
    (void)c;
    return 0;
}
