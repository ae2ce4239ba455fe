// libFuzzer target for share links: any bytes, read as a fragment (first byte even) or as the
// payload behind "tp1." (first byte odd, so mutations reach the decompressor directly), must be
// refused or decode to a document that re-encodes and decodes to the same bytes, without crash,
// leak, undefined behaviour or hang. Build (from the repository root):
//   clang++-14 -g -O1 -fsanitize=fuzzer,address,undefined -fno-sanitize-recover=undefined -std=c++17 -I core \
//     tests/fuzz/fuzz_share_link.cpp core/output/share_link.cpp core/output/analysis_document.cpp core/text/json_reader.cpp \
//     core/text/json_writer.cpp core/model/analysis.cpp core/model/merge_categories.cpp core/statistics/validity.cpp core/text/number_format.cpp -o fuzz_share_link
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string>
#include <string_view>

#include "share_link.hpp"

using namespace tallyproof;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    if (size == 0) return 0;
    const std::string_view rest(reinterpret_cast<const char*>(data) + 1, size - 1);
    const std::string fragment = (data[0] & 1) ? "tp1." + base64url_encode(rest) : std::string(rest);

    std::string doc;
    const Status s = decode_share_fragment(fragment, &doc);
    if (!s.ok) {
        if (s.message.empty()) std::abort();  // every refusal says why
        std::string payload_doc;
        (void)share_decompress(rest, &payload_doc);  // the raw decompressor on the same bytes
        return 0;
    }
    if (doc.empty() || doc.size() > kShareMaxDocumentBytes) std::abort();
    const std::string again = encode_share_fragment(doc);
    if (again.empty()) std::abort();  // what decodes must be encodable (it came from a link within the limits)...
    std::string doc2;
    if (!decode_share_fragment(again, &doc2).ok || doc2 != doc) std::abort();  // ...and read back unchanged
    return 0;
}
