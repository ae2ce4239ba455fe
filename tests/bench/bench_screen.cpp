// Screen speed and link size: prints how long a pasted table of many groups takes from text to the
// groups table (read_grouped_text, screen_groups, the rows ordered by q as the Groups view does),
// and how long the analysis document of a screen and its share link are (a program that prints
// figures, not a test). Counts come from a fixed LCG: 10 categories, 40 to 160 per group, as
// last digits of readings that follow the uniform law, with every 50th group preferring 0 and 5.
// Usage: bench_screen [GROUPS]   (default 100000; the link sizes are for 40 and 10,000 groups)
#include <algorithm>
#include <chrono>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <vector>

#include "analysis.hpp"
#include "screen_groups.hpp"
#include "grouped_table.hpp"
#include "screen_document.hpp"
#include "share_link.hpp"

using namespace tallyproof;

namespace {

std::uint64_t state = 2601;
std::uint32_t below(std::uint32_t n) {  // Knuth's MMIX LCG, top 32 bits
    state = state * 6364136223846793005ULL + 1442695040888963407ULL;
    return static_cast<std::uint32_t>(((state >> 32) * n) >> 32);
}

// A wide table: a header "collector,0,...,9", then one row per group.
std::string wide_table(std::size_t groups) {
    std::string s = "collector";
    for (int d = 0; d < 10; ++d) s += "\t" + std::to_string(d);
    s += "\n";
    for (std::size_t g = 0; g < groups; ++g) {
        s += "C" + std::to_string(100000 + g);
        const std::uint32_t n = 40 + below(121);
        std::uint32_t c[10] = {};
        for (std::uint32_t i = 0; i < n; ++i) {
            const std::uint32_t d = g % 50 == 7 && below(3) == 0 ? (below(2) ? 0 : 5) : below(10);
            ++c[d];
        }
        for (int d = 0; d < 10; ++d) s += "\t" + std::to_string(c[d]);
        s += "\n";
    }
    return s;
}

double seconds_since(std::chrono::steady_clock::time_point t0) {
    return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

Analysis last_digit_base() {
    Analysis a;
    a.model.kind = ModelKind::last_digit;
    return a;
}

void link_size(std::size_t groups) {
    state = 2601;
    const std::string text = wide_table(groups);
    const GroupedCounts counts = read_grouped_text(text, GroupReadOptions{});
    ScreenView view;
    view.sort = "q";
    const std::string doc = write_screen_document(last_digit_base(), counts, ScreenChoice{}, view);
    const std::string fragment = encode_share_fragment(doc);
    const std::size_t compressed = share_compress(doc).size();
    std::printf("share link, %6zu groups x 10: document %8zu bytes, compressed %7zu bytes, fragment %s\n", groups, doc.size(),
                compressed, fragment.empty() ? ("refused (base64 would be " + std::to_string(4 + (compressed * 4 + 2) / 3) +
                                                " characters > " + std::to_string(kShareMaxFragmentChars) + ")").c_str()
                                             : (std::to_string(fragment.size()) + " characters").c_str());
}

}  // namespace

int main(int argc, char** argv) {
    const std::size_t groups = argc > 1 ? static_cast<std::size_t>(std::strtoul(argv[1], nullptr, 10)) : 100000;
    state = 2601;
    const std::string text = wide_table(groups);
    std::printf("paste: %zu groups x 10 categories, %.1f MB\n", groups, text.size() / 1e6);
    for (int rep = 0; rep < 3; ++rep) {
        const auto t0 = std::chrono::steady_clock::now();
        const GroupedCounts counts = read_grouped_text(text, GroupReadOptions{});
        const double read = seconds_since(t0);
        const auto t1 = std::chrono::steady_clock::now();
        const ScreenResult s = screen_groups(last_digit_base(), counts, ScreenChoice{});
        const double screen = seconds_since(t1);
        const auto t2 = std::chrono::steady_clock::now();
        std::vector<std::size_t> order(s.groups.size());
        for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
        std::stable_sort(order.begin(), order.end(),
                         [&](std::size_t a, std::size_t b) { return s.groups[a].q.log10_p < s.groups[b].q.log10_p; });
        const double sort = seconds_since(t2);
        std::printf("run %d: read %.3f s, screen %.3f s, sort by q %.3f s, paste to table %.3f s (ok=%d, %zu flagged, %zu thin: exact p, of %zu)\n", rep + 1,
                    read, screen, sort, read + screen + sort, s.status.ok, s.flagged, s.thin, s.groups.size());
    }
    {  // The same screen in slices (ScreenJob), as the page runs it: the longest slice at 2,000 units.
        const GroupedCounts counts = read_grouped_text(text, GroupReadOptions{});
        ScreenJob job;
        const auto t0 = std::chrono::steady_clock::now();
        start_screen_job(last_digit_base(), counts, ScreenChoice{}, &job);
        double longest = seconds_since(t0);
        int slices = 0;
        while (!job.progress.done) {
            const auto t1 = std::chrono::steady_clock::now();
            step_screen_job(&job, 2000);
            longest = std::max(longest, seconds_since(t1));
            ++slices;
        }
        std::printf("in slices of 2,000 units: %d slices, longest %.1f ms (start included), total %.3f s, %zu flagged\n", slices,
                    1000 * longest, seconds_since(t0), job.result.flagged);
    }
    link_size(40);
    link_size(10000);
    // The most groups of this kind a link carries (bisection on the fragment's limit).
    std::size_t lo = 40, hi = 10000;
    while (hi - lo > 10) {
        const std::size_t mid = (lo + hi) / 2;
        state = 2601;
        const GroupedCounts c = read_grouped_text(wide_table(mid), GroupReadOptions{});
        (encode_share_fragment(write_screen_document(last_digit_base(), c, ScreenChoice{})).empty() ? hi : lo) = mid;
    }
    std::printf("share link: at most about %zu groups x 10 fit in %zu characters\n", lo, kShareMaxFragmentChars);
    return 0;
}
