// tallyproof: command-line front end. Parses arguments, reads pasted text from a file or
// stdin, and prints what core/ returns (plain text, or JSON with --json).
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <fstream>
#include <iostream>
#include <iterator>
#include <sstream>
#include <string>

#include "goodness_of_fit.hpp"
#include "paste_parser.hpp"
#include "report.hpp"
#include "tallyproof_version.hpp"

namespace {

const char* kUsage =
    "usage: tallyproof [options] [FILE]\n"
    "Chi-square goodness-of-fit test of counts read from FILE (or standard input):\n"
    "lines of label<TAB>count as copied from a spreadsheet, or one count per line.\n"
    "\n"
    "options:\n"
    "  --json        print the result document as JSON\n"
    "  --alpha A     significance level of the decision (default 0.05)\n"
    "  --version     print the version and exit\n"
    "  --help        print this help and exit\n"
    "\n"
    "exit status: 0 analysed, 1 input refused, 2 usage error\n";

int usage_error(const std::string& msg) {
    std::fprintf(stderr, "tallyproof: %s\n%s", msg.c_str(), kUsage);
    return 2;
}

}  // namespace

int main(int argc, char** argv) {
    bool json = false;
    double alpha = 0.05;
    std::string path;
    for (int i = 1; i < argc; ++i) {
        const std::string arg = argv[i];
        if (arg == "--json") json = true;
        else if (arg == "--version") { std::printf("tallyproof %s\n", TALLYPROOF_VERSION); return 0; }
        else if (arg == "--help" || arg == "-h") { std::fputs(kUsage, stdout); return 0; }
        else if (arg == "--alpha") {
            if (i + 1 >= argc) return usage_error("--alpha needs a value");
            char* end = nullptr;
            alpha = std::strtod(argv[++i], &end);
            if (*end != '\0' || !(alpha > 0 && alpha < 1)) return usage_error("--alpha must be a number between 0 and 1");
        } else if (arg.size() > 1 && arg[0] == '-') return usage_error("unknown option " + arg);
        else if (path.empty()) path = arg;
        else return usage_error("only one input file can be given");
    }

    std::string text;
    if (path.empty() || path == "-") {
        text.assign(std::istreambuf_iterator<char>(std::cin), std::istreambuf_iterator<char>());
    } else {
        std::ifstream in(path, std::ios::binary);
        if (!in) return usage_error("cannot read " + path);
        std::ostringstream ss;
        ss << in.rdbuf();
        text = ss.str();
    }

    const tallyproof::ParsedCounts parsed = tallyproof::parse_counts(text);
    tallyproof::Analysis analysis;
    analysis.alpha = alpha;
    tallyproof::Result result;
    if (!parsed.status.ok) {
        result.status = parsed.status;
    } else {
        analysis.categories = parsed.categories;
        analysis.observed = parsed.observed;
        result = tallyproof::analyse(analysis);
    }
    if (json) std::printf("%s\n", tallyproof::report_json(analysis, result).c_str());
    else if (result.status.ok) std::fputs(tallyproof::report_text(analysis, result).c_str(), stdout);
    else std::fprintf(stderr, "tallyproof: %s\n", result.status.message.c_str());
    return result.status.ok ? 0 : 1;
}
