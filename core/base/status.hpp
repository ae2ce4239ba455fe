// Status: how core/ reports a refused input without exceptions. A message always names the
// offending input; line and column are 1-based positions in pasted text (0 when not applicable).
#pragma once
#include <string>

namespace tallyproof {

struct Status {
    bool ok = true;
    std::string message;  // empty when ok
    int line = 0;         // 1-based line of pasted text the message refers to, or 0
    int column = 0;       // 1-based column (cell index) the message refers to, or 0

    static Status success() { return {}; }
    static Status failure(std::string msg, int line = 0, int column = 0) {
        return Status{false, std::move(msg), line, column};
    }
};

}  // namespace tallyproof
