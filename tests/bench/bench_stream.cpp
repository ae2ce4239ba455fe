// Streamed digit tally speed and memory (issue #28; a program that prints figures, not a test):
// writes N raw amounts to a temporary file (the fixed LCG and log-uniform amounts of
// bench_parse.cpp, two decimals), then reads the file in 1 MiB pieces cut at line ends through
// core's DigitStreamTally, as the tool does, timing CPU (getrusage user + system). Beside it,
// the machine's memory-copy bandwidth (memcpy of a 256 MB buffer, best of 3): the physical
// limit of any byte scan. Peak RSS is getrusage's ru_maxrss (Linux: KiB), of this process so far
// (the generator writes line by line, so the peak is that of the tally; memcpy runs last).
// Usage: bench_stream [N ...]   (default 1000000 10000000)
#include <sys/resource.h>

#include <chrono>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <string>
#include <vector>

#include "read_input.hpp"
#include "stream_tally.hpp"

using namespace tallyproof;

namespace {

std::uint64_t state = 12345;
double uniform() {  // Knuth's MMIX LCG, top 53 bits (as bench_parse.cpp)
    state = state * 6364136223846793005ULL + 1442695040888963407ULL;
    return static_cast<double>(state >> 11) * 0x1.0p-53;
}

double cpu_seconds() {
    rusage u{};
    getrusage(RUSAGE_SELF, &u);
    return static_cast<double>(u.ru_utime.tv_sec + u.ru_stime.tv_sec) + 1e-6 * static_cast<double>(u.ru_utime.tv_usec + u.ru_stime.tv_usec);
}

double peak_mb() {
    rusage u{};
    getrusage(RUSAGE_SELF, &u);
    return static_cast<double>(u.ru_maxrss) / 1024.0;
}

std::size_t read_chunk(std::FILE* in, char* buf, std::size_t size) {
    std::size_t got = 0;
    for (std::size_t n; got < size && (n = std::fread(buf + got, 1, size - got, in)) > 0;) got += n;
    return got;
}

}  // namespace

int main(int argc, char** argv) {
    std::vector<double> sizes;
    for (int i = 1; i < argc; ++i) sizes.push_back(std::atof(argv[i]));
    if (sizes.empty()) sizes = {1e6, 1e7};

    std::printf("%12s %10s %10s %10s %10s %12s\n", "amounts", "MB", "cpu_s", "MB/s", "peak_MB", "first_digit_1");
    for (double nd : sizes) {
        const std::size_t n = static_cast<std::size_t>(nd);
        char path[] = "/tmp/bench_stream_XXXXXX";
        const int fd = mkstemp(path);
        if (fd < 0) return 1;
        std::FILE* out = fdopen(fd, "wb");
        char line[32];
        for (std::size_t i = 0; i < n; ++i) {
            const int len = std::snprintf(line, sizeof line, "%.2f\n", std::pow(10.0, 5 * uniform()));
            std::fwrite(line, 1, static_cast<std::size_t>(len), out);
        }
        std::fclose(out);

        const double t0 = cpu_seconds();
        std::FILE* in = std::fopen(path, "rb");
        const std::size_t chunk = 1u << 20;
        std::string buf(chunk, '\0');
        std::size_t got = read_chunk(in, buf.data(), chunk);
        buf.resize(got);
        const std::string first = buf.substr(0, buf.find_last_of('\n') + 1);
        ParseOptions o;
        o.digits = DigitTest::first;
        ReadInputOptions how;
        how.groups = GroupsReading::never;
        DigitStreamTally tally(read_input(first, o, how).sample);
        tally.feed(first);
        std::string carry = buf.substr(first.size());
        std::size_t total = first.size();
        for (bool at_end = false; !at_end;) {
            buf.assign(carry);
            buf.resize(carry.size() + chunk);
            got = read_chunk(in, buf.data() + carry.size(), chunk);
            at_end = got < chunk;
            buf.resize(carry.size() + got);
            const std::size_t end = at_end ? buf.size() : buf.find_last_of('\n') + 1;
            tally.feed(std::string_view(buf).substr(0, end));
            total += got;
            carry = buf.substr(end);
        }
        std::fclose(in);
        const ParsedInput r = tally.finish(first.size(), total);
        const double cpu = cpu_seconds() - t0;
        std::remove(path);
        std::printf("%12zu %10.1f %10.3f %10.0f %10.1f %12.0f\n", n, static_cast<double>(total) / 1e6, cpu,
                    static_cast<double>(total) / 1e6 / cpu, peak_mb(), r.observed.empty() ? -1.0 : r.observed[0]);
        std::fflush(stdout);
    }
    {  // after the tallies, so that its buffers are not in their peak RSS. memcpy bandwidth, best of 3 over 256 MB (read + write counted once, as MB copied per second)
        const std::size_t n = 256u << 20;
        std::vector<char> a(n, 1), b(n, 0);
        double best = 1e9;
        for (int r = 0; r < 3; ++r) {
            const auto t0 = std::chrono::steady_clock::now();
            std::memcpy(b.data(), a.data(), n);
            best = std::min(best, std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count());
            a[static_cast<std::size_t>(r)] = b[n - 1 - static_cast<std::size_t>(r)];
        }
        std::printf("memcpy bandwidth: %.0f MB/s (256 MB, best of 3)\n", static_cast<double>(n) / 1e6 / best);
    }
    return 0;
}
