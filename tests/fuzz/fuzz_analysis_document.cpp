// libFuzzer target for the analysis-document reader: arbitrary bytes through
// read_analysis_document(); a refusal must carry a message, and a document that is read must
// analyse (at a low p-value budget) into a Result meeting every invariant of fuzz_engine.cpp,
// and must survive a write_analysis_document() round trip. Any violation aborts.
// Build and run: tests/fuzz/run_quality_fuzzers.sh analysis_document 600
#define TALLYPROOF_FUZZ_INVARIANTS_ONLY
#include "fuzz_engine.cpp"

#include <string_view>

#include "analysis_document.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace tallyproof;
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    Analysis a;
    const Status s = read_analysis_document(text, &a);
    if (!s.ok) {
        if (s.message.empty()) tallyproof_fuzz::violated("a refused document without a message");
        return 0;
    }
    // Documents may ask for up to 1e9 replicates or a costly exact run: keep each input fast.
    if (a.pvalue.replicates > 2000) a.pvalue.replicates = 2000;
    // Totals above 1e8 reach the known slow effect-size interval (docs/robustness.md); without
    // this guard every run ends at the first such mutation with a timeout.
    double n = 0;
    for (double o : a.observed) n += o;
    if (!(n <= 1e8)) return 0;
    const Result r = analyse(a);
    tallyproof_fuzz::check_result(a, r);
    if (r.status.ok && a.pvalue.method != PValueMethod::asymptotic && r.n <= 5000)
        tallyproof_fuzz::run_job_and_check(a, r, 4096, 8);

    // What was read can be written and read back to the same analysis.
    const std::string again = write_analysis_document(a);
    Analysis b;
    const Status s2 = read_analysis_document(again, &b);
    if (!s2.ok) {
        std::fprintf(stderr, "re-read refused: %s\n%s\n", s2.message.c_str(), again.c_str());
        tallyproof_fuzz::violated("a written document does not read back");
    }
    if (b.observed != a.observed || b.categories != a.categories || b.model.kind != a.model.kind)
        tallyproof_fuzz::violated("round trip changed the counts, labels or model");
    return 0;
}
