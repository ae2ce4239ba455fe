// tallyproof: command-line front end. Parses arguments, reads pasted text or an analysis
// document from a file or stdin, and prints what core/ returns (plain text, or JSON).
#include <algorithm>
#include <cerrno>
#include <cmath>
#include <csignal>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <string>
#include <utility>
#include <vector>

#include <signal.h>
#include <unistd.h>

#include "analysis_document.hpp"
#include "glossary.hpp"
#include "number_reading.hpp"
#include "screen_groups.hpp"
#include "survey_rows.hpp"
#include "grouped_table.hpp"
#include "input_text.hpp"
#include "read_input.hpp"
#include "stream_tally.hpp"
#include "pvalue_job.hpp"
#include "report.hpp"
#include "result_workbook.hpp"
#include "screen_document.hpp"
#include "screen_report.hpp"
#include "screen_workbook.hpp"
#include "table_export.hpp"
#include "text_decoding.hpp"
#include "workbook_member.hpp"
#include "writeup.hpp"
#include "tallyproof_version.hpp"

namespace {

const char* kUsage =
    "usage: tallyproof [options] [FILE]\n"
    "Chi-square goodness-of-fit test of counts read from FILE (or standard input): pasted\n"
    "text (lines of label<TAB>count, or one count per line), a workbook (.xlsx or .ods: its\n"
    "cells are read as pasted text) or an analysis document (JSON).\n"
    "\n"
    "input (pasted text; the shape, separator and number format are detected):\n"
    "  --digits D             tally a digit of raw numbers: first, second, first-two, last\n"
    "                         (the model defaults to the matching digit law)\n"
    "  --bins B               count raw numbers into bins: edges such as 0,10,20,inf, or\n"
    "                         equal:K (K equal-width bins), or equal-probability:K (K bins of\n"
    "                         probability 1/K under the --model normal (default), lognormal or\n"
    "                         exponential fitted to the values; --param values are used if given)\n"
    "  --raw                  the cells are raw observations, one per cell or line\n"
    "  --case-fold            raw text: upper and lower case are one category\n"
    "  --sorted               raw text: categories in sorted order (default: first seen)\n"
    "  --read-whole           with --digits: read the whole input before tallying (at most\n"
    "                         256 MB) instead of streaming it 1 MiB at a time\n"
    "  --decimal-comma        numbers use a decimal comma (1.234,5)\n"
    "  --decimal-point        numbers use a decimal point (1,234.5)\n"
    "  --shape S              override the detected shape: label-count, label-observed-expected,\n"
    "                         counts-column, counts-row, raw-text, raw-whole-numbers,\n"
    "                         raw-digits, raw-bins\n"
    "  --sheet NAME|NUMBER    workbook: the sheet to read, by name or 1-based number (default:\n"
    "                         the first visible sheet with values)\n"
    "  --range A1:D20         workbook: the cells to read (also B:D, 3:9 or C4; default: the\n"
    "                         sheet's used range); both are refused for an input that is text\n"
    "  --third-column C       what a third column (label, observed, third) holds: auto (default;\n"
    "                         a previous sample when its header names one, such as Last month,\n"
    "                         Baseline or Control; else expected values), expected, or previous\n"
    "                         (a previous sample's counts: test of homogeneity of the two samples)\n"
    "output:\n"
    "  --json                 print the result document as JSON\n"
    "  --table csv|tsv|xlsx   print the per-category table for a spreadsheet (formulas neutralised);\n"
    "                         xlsx: a workbook with sheets Categories and Numbers (the write-up's\n"
    "                         quantities), numbers in full precision, labels always text; it is\n"
    "                         binary, so redirect it to a file: --table xlsx data.txt > table.xlsx\n"
    "  --writeup plain|markdown|tsv\n"
    "                         print the results block to paste into a report\n"
    "  --output-decimal-comma write numbers with a decimal comma (CSV then uses ';')\n"
    "  --byte-order-mark      start --table output with a UTF-8 byte-order mark, for a file a\n"
    "                         spreadsheet program will open (standard output has none otherwise)\n"
    "model (options override the document):\n"
    "  --model KIND           equal, shares, ratio, counts, poisson, binomial, geometric,\n"
    "                         negative-binomial, uniform, normal, lognormal, exponential,\n"
    "                         benford-first, benford-second, benford-first-two, last-digit,\n"
    "                         last-digit-even, reference-sample (a previous sample's counts\n"
    "                         in --values: test of homogeneity of the two samples)\n"
    "  --values LIST          shares, ratio, expected counts or the previous sample's counts:\n"
    "                         9:3:3:1 or 0.5,0.3,0.2 or 140,390,230,40\n"
    "  --param NAME=VALUE     a given parameter (mean, trials, p, size, sd, meanlog, sdlog, rate);\n"
    "                         parameters not given are estimated from the counts\n"
    "  --edges LIST           bin edges for normal, lognormal, exponential: -inf,10,20,inf\n"
    "  --ordered              the categories have a natural order\n"
    "  --extra-params M       parameters estimated elsewhere from raw data (each costs one df)\n"
    "test:\n"
    "  --alpha A              significance level of the decision (default 0.05)\n"
    "  --lambda L             which statistic of the power-divergence family: 1 Pearson's\n"
    "                         chi-square, 0 likelihood ratio (G2), 0.6667 Cressie-Read,\n"
    "                         -0.5 Freeman-Tukey, -1 modified likelihood ratio, -2 Neyman\n"
    "  --williams             Williams' correction of the likelihood ratio (with --lambda 0)\n"
    "  --method M             asymptotic (default), exact or monte-carlo\n"
    "  --ordering O           exact and Monte Carlo: which outcomes count as at least as extreme:\n"
    "                         statistic (default; a statistic at least the observed one) or\n"
    "                         probability (outcomes no more probable than the observed counts)\n"
    "  --replicates N         Monte Carlo: how many samples to simulate (default 100000 replicates)\n"
    "  --seed S               Monte Carlo: the random generator's seed; the same seed repeats\n"
    "                         the same p-value (default 1)\n"
    "  --merge RULE           merge thin categories: none, all-5, cochran, minimum\n"
    "  --min-expected X       the minimum for --merge minimum\n"
    "planning:\n"
    "  --plan-w W             effect size to detect (default: the observed w)\n"
    "  --plan-n N             sample size for the power (default: the observed N)\n"
    "  --target-power P       power wanted for the required N (default 0.8)\n"
    "conformity (show the mix departs from the stated one by less than a margin):\n"
    "  --conformity W         margin w0 in (0, 1], e.g. 0.1 (Cohen's small); the contract decides\n"
    "  --conformity-true-w W  planning: the true w assumed (default 0)\n"
    "  --conformity-power P   planning: power wanted to show conformity (default 0.8)\n"
    "screening many groups (one test per group; see docs/analysis-document.md, Screening):\n"
    "  --by COLUMN            the group column: its header name or 1-based number; the table\n"
    "                         is long (group, category, count), wide (one row per group under\n"
    "                         a header naming the categories) or raw (group, value; tallied\n"
    "                         per group with --digits, --bins or as text)\n"
    "  --group-shape S        override the detected shape: long, wide, raw\n"
    "  --group-header H       yes: the first line is a header row; no: it is a group (default:\n"
    "                         detected, also when it numbers the categories: 0..9, years)\n"
    "  --against A            model (default: each group against --model) or rest (each group\n"
    "                         against the other groups pooled, a test of homogeneity)\n"
    "  --adjust M             across groups: bh (default, false discovery rate), holm,\n"
    "                         bonferroni, none\n"
    "  --q Q                  flag groups whose adjusted p is at most Q (default 0.05)\n"
    "                         (--table and --writeup then give the groups table and summary;\n"
    "                         --table xlsx a workbook with sheets Groups and Screen)\n"
    "survey data (design-corrected test, Rao and Scott 1981, 1984; see docs/methods.md):\n"
    "  --category COLUMN      respondent rows (one per respondent, under a header): the\n"
    "                         category column, by header name or 1-based number; categories\n"
    "                         in first-seen order, or --sorted\n"
    "  --weight COLUMN        the sampling weight column (weights > 0; default: every weight 1)\n"
    "  --stratum COLUMN       the stratum column (default: one stratum)\n"
    "  --cluster COLUMN       the cluster (PSU) column, nested in strata (default: each\n"
    "                         respondent its own PSU); a stratum with one PSU is refused\n"
    "  --design-effect D      one overall design effect: X2/D, the crude correction; D may be\n"
    "                         kish (1 + CV2 of the --weight column)\n"
    "  --design-effects LIST  one design effect per category (1.4,1.2,1.9): first-order\n"
    "                         Rao-Scott correction of the counts or weighted shares read\n"
    "other:\n"
    "  --glossary             print what each abbreviation and symbol on screen means\n"
    "  --version, --help\n"
    "\n"
    "exit status: 0 analysed, 1 input refused, 2 usage error or input that cannot be read,\n"
    "             3 output that could not be written (a full disk, a closed output),\n"
    "             4 analysed, but a streamed input ended in the middle of a line (it may have\n"
    "               been cut short; the result says so), 128 + N stopped by signal N while\n"
    "               a stream was read (no result)\n";

constexpr int kRefused = 1, kUsageError = 2, kCannotRead = 2, kCannotWrite = 3, kOpenEnd = 4;

bool g_json = false;  // --json anywhere on the command line: every refusal is also a result document

// With --json, the error form of the result document on standard output (docs/analysis-document.md),
// so a script reading standard output always has a document to parse.
void print_error_document(const std::string& message) {
    if (!g_json) return;
    tallyproof::JsonWriter j;
    tallyproof::begin_result_document(j, tallyproof::Status::failure(message));
    j.key("warnings").strings({});
    j.end_object();
    std::fputs((j.str() + "\n").c_str(), stdout);
    std::fflush(stdout);
}

int usage_error(const std::string& msg) {
    std::fprintf(stderr, "tallyproof: %s\n(see tallyproof --help)\n", msg.c_str());
    print_error_document(msg);
    return kUsageError;
}

int cannot_read(const std::string& what, int error) {
    const std::string msg = "cannot read " + what + ": " + std::strerror(error);
    std::fprintf(stderr, "tallyproof: %s\n", msg.c_str());
    print_error_document(msg);
    return kCannotRead;
}

// Writes `text` to standard output and makes sure it arrived: the stream's error state after
// the write, a flush and closing it (a full disk or a closed descriptor shows only there).
int write_output(const std::string& text, const char* what) {
    errno = 0;
    const bool written = std::fwrite(text.data(), 1, text.size(), stdout) == text.size();
    const bool flushed = written && std::fflush(stdout) == 0 && !std::ferror(stdout);
    const int error = errno;
    const bool closed = std::fclose(stdout) == 0;
    if (written && flushed && closed) return 0;
    std::fprintf(stderr, "tallyproof: could not write %s to standard output: %s\n", what,
                 std::strerror(error != 0 ? error : errno != 0 ? errno : EIO));
    return kCannotWrite;
}

// A workbook's bytes from core; empty ones mean core could not build it.
int write_workbook(const std::string& bytes, const char* what) {
    if (!bytes.empty()) return write_output(bytes, what);
    std::fprintf(stderr, "tallyproof: could not build %s (out of memory)\n", what);
    return kCannotWrite;
}

// --param NAME=VALUE as (NAME, VALUE); false when it is not of that form.
bool to_parameter(const std::string& s, std::pair<std::string, double>* out) {
    const auto eq = s.find('=');
    double v = 0;
    if (eq == std::string::npos || !tallyproof::read_typed_number(s.substr(eq + 1), &v)) return false;
    *out = {s.substr(0, eq), v};
    return true;
}

bool to_list(const std::string& s, std::vector<double>* out) {
    out->clear();
    std::string cell;
    for (std::size_t i = 0; i <= s.size(); ++i) {
        if (i == s.size() || s[i] == ',' || s[i] == ':' || s[i] == ';') {
            double v = 0;
            if (!tallyproof::read_typed_number(cell, &v)) return false;
            out->push_back(v);
            cell.clear();
        } else if (s[i] != ' ') {
            cell += s[i];
        }
    }
    return !out->empty();
}

// Reads the whole of `in` into `text`: straight into one buffer of the file's size when it has
// one, so a large paste is not copied through streams; in chunks from pipes. Returns 0, or the
// error number when the stream could not be read (a directory, a device, a vanished file).
int read_all(std::FILE* in, std::string* text) {
    errno = 0;
    const long at = std::ftell(in);  // -1 for pipes
    if (at >= 0 && std::fseek(in, 0, SEEK_END) == 0) {  // a directory may claim any size: only plausible ones
        const long size = std::ftell(in) - at;
        if (size > 0 && static_cast<unsigned long>(size) <= tallyproof::kMaxInputBytes + 1)
            text->resize(static_cast<std::size_t>(size));
        std::fseek(in, at, SEEK_SET);
        text->resize(std::fread(text->data(), 1, text->size(), in));
    }
    char chunk[65536];
    for (std::size_t got; (got = std::fread(chunk, 1, sizeof chunk, in)) > 0;) text->append(chunk, got);
    return std::ferror(in) ? (errno != 0 ? errno : EIO) : 0;
}

using namespace tallyproof;

constexpr int kGoOn = -1;  // a step went well: the next one follows

// What the command line asks for.
struct CommandLine {
    bool json = false;
    bool read_whole = false;  // --read-whole: --digits input read whole, not streamed
    std::string table_format, writeup_style;  // --table csv|tsv, --writeup plain|markdown|tsv
    bool out_decimal_comma = false;
    bool byte_order_mark = false;  // --byte-order-mark: --table output for a spreadsheet file
    std::string path;
    std::vector<std::pair<std::string, std::string>> opts;  // option, value: applied to the analysis read
    ParseOptions input;  // input options, used when the text is pasted text rather than a document
    // Screening many groups: on with --by, --group-shape, --against, --adjust or --q, or a document with "groups".
    bool screening = false;
    GroupReadOptions group_input;
    ScreenChoice screen;
    ScreenView screen_view;  // a document's sort and opened group, written back by --json
    // Survey data: --category and its companions read respondent rows; --design-effect(s) tiers 3 and 2.
    bool survey = false;
    SurveyColumns survey_columns;
    std::string design_effect;                 // --design-effect: a number or "kish"
    std::string design_effects;                // --design-effects LIST
    WorkbookChoice workbook;                   // --sheet, --range: which cells of a workbook are read
    InputText workbook_read;                   // what was read of a workbook (its text moved out): --json's "workbook"
};

const std::vector<std::string> kWithValue = {"--alpha", "--model", "--values", "--param", "--edges", "--extra-params",
                                             "--lambda", "--method", "--ordering", "--replicates", "--seed", "--merge",
                                             "--min-expected", "--plan-w", "--plan-n", "--target-power",
                                             "--conformity", "--conformity-points", "--conformity-true-w", "--conformity-power"};

// --by, --group-shape, --against, --adjust and --q with their value.
int read_screen_option(const std::string& arg, const std::string& val, CommandLine* c) {
    c->screening = true;
    if (arg == "--by") {
        if (val.empty()) return usage_error("--by needs a column name or number");
        c->group_input.by = val;
    } else if (arg == "--group-shape") {
        GroupShape shape;
        if (!group_shape_from_name(val, &shape)) return usage_error("--group-shape must be long, wide or raw");
        c->group_input.shape = shape;
    } else if (arg == "--group-header") {
        if (val != "yes" && val != "no") return usage_error("--group-header must be yes or no");
        c->group_input.header = val == "yes";
    } else if (arg == "--against") {
        if (!screen_against_from_name(val, &c->screen.against)) return usage_error("--against must be model or rest");
    } else if (arg == "--adjust") {
        if (!multiplicity_method_from_name(val == "bh" ? "BH" : val, &c->screen.adjust))
            return usage_error("--adjust must be bh, holm, bonferroni or none");
    } else {
        double q = 0;
        if (!tallyproof::read_typed_number(val, &q) || !(q > 0 && q < 1)) return usage_error("--q must be a number between 0 and 1");
        c->screen.q = q;
    }
    return kGoOn;
}

// --digits, --bins, --shape and --third-column with their value.
int read_input_option(const std::string& arg, const std::string& val, CommandLine* c) {
    if (arg == "--digits") {
        if (val == "first") c->input.digits = DigitTest::first;
        else if (val == "second") c->input.digits = DigitTest::second;
        else if (val == "first-two") c->input.digits = DigitTest::first_two;
        else if (val == "last") c->input.digits = DigitTest::last;
        else return usage_error("--digits must be first, second, first-two or last");
    } else if (arg == "--third-column") {
        if (!third_column_from_name(val, &c->input.third_column))
            return usage_error("--third-column must be auto, expected or previous");
    } else if (arg == "--shape") {
        InputShape shape;
        if (!input_shape_from_name(val, &shape)) return usage_error("unknown shape " + val);
        c->input.shape = shape;
    } else {
        const auto colon = val.find(':');
        const std::string kind = colon == std::string::npos ? "" : val.substr(0, colon);
        if (kind == "equal" || kind == "equal-probability") {
            const bool width = kind == "equal";
            const double most = width ? 10000 : 1000, least = width ? 1 : 2;
            double k = 0;
            if (!tallyproof::read_typed_number(val.substr(colon + 1), &k) || !(k >= least && k <= most) || k != std::floor(k))
                return usage_error("--bins " + kind + ":K needs a whole number of bins K from " +
                                   std::to_string(static_cast<int>(least)) + " to " + std::to_string(static_cast<int>(most)));
            c->input.bins.kind = kind == "equal" ? BinChoice::Kind::equal_width : BinChoice::Kind::equal_probability;
            c->input.bins.bins = static_cast<int>(k);
        } else {
            std::vector<double> edges;
            if (!to_list(val, &edges) || edges.size() < 2)
                return usage_error("--bins needs edges such as 0,10,20,inf, or equal:K");
            c->input.bins.kind = BinChoice::Kind::edges;
            c->input.bins.edges = edges;
        }
    }
    return kGoOn;
}

// Reads the arguments into `c`; kGoOn, or the exit status (a usage error, or --help, --version
// and --glossary written).
int read_command_line(int argc, char** argv, CommandLine* c) {
    for (int i = 1; i < argc; ++i) {
        const std::string arg = argv[i];
        if (arg == "--json") c->json = true;
        else if (arg == "--byte-order-mark") c->byte_order_mark = true;
        else if (arg == "--table" || arg == "--writeup") {
            if (i + 1 >= argc) return usage_error(arg + " needs a value");
            const std::string v = argv[++i];
            if (arg == "--table" && v != "csv" && v != "tsv" && v != "xlsx") return usage_error("--table must be csv, tsv or xlsx");
            if (arg == "--writeup" && v != "plain" && v != "markdown" && v != "tsv") return usage_error("--writeup must be plain, markdown or tsv");
            (arg == "--table" ? c->table_format : c->writeup_style) = v;
        } else if (arg == "--output-decimal-comma") c->out_decimal_comma = true;
        else if (arg == "--version") return write_output(std::string("tallyproof ") + TALLYPROOF_VERSION + "\n", "the version");
        else if (arg == "--help" || arg == "-h") return write_output(kUsage, "the help text");
        else if (arg == "--glossary") return write_output(tallyproof::glossary_markdown(), "the glossary");
        else if (arg == "--ordered" || arg == "--williams") c->opts.emplace_back(arg, "");
        else if (arg == "--raw") c->input.raw = true;
        else if (arg == "--case-fold") c->input.case_fold = true;
        else if (arg == "--sorted") c->input.sorted = true;
        else if (arg == "--read-whole") c->read_whole = true;
        else if (arg == "--decimal-comma") c->input.decimal = DecimalMark::comma;
        else if (arg == "--decimal-point") c->input.decimal = DecimalMark::point;
        else if (arg == "--category" || arg == "--weight" || arg == "--stratum" || arg == "--cluster" ||
                 arg == "--design-effect" || arg == "--design-effects") {
            if (i + 1 >= argc) return usage_error(arg + " needs a value");
            const std::string v = argv[++i];
            if (v.empty()) return usage_error(arg + " needs a value");
            if (arg == "--category") { c->survey_columns.category = v; c->survey = true; }
            else if (arg == "--weight") c->survey_columns.weight = v;
            else if (arg == "--stratum") c->survey_columns.stratum = v;
            else if (arg == "--cluster") c->survey_columns.cluster = v;
            else if (arg == "--design-effect") c->design_effect = v;
            else c->design_effects = v;
        }
        else if (arg == "--sheet" || arg == "--range") {
            if (i + 1 >= argc) return usage_error(arg + " needs a value");
            const std::string v = argv[++i];
            CellRange range;
            if (arg == "--sheet" && v.empty()) return usage_error("--sheet needs a sheet's name or its number (1 for the first)");
            if (arg == "--range") {
                if (const Status s = parse_cell_range(v, &range); !s.ok) return usage_error("--range: " + s.message);
            }
            (arg == "--sheet" ? c->workbook.sheet : c->workbook.range) = v;
        }
        else if (arg == "--by" || arg == "--group-shape" || arg == "--group-header" || arg == "--against" || arg == "--adjust" || arg == "--q") {
            if (i + 1 >= argc) return usage_error(arg + " needs a value");
            if (const int r = read_screen_option(arg, argv[++i], c); r != kGoOn) return r;
        } else if (arg == "--digits" || arg == "--bins" || arg == "--shape" || arg == "--third-column") {
            if (i + 1 >= argc) return usage_error(arg + " needs a value");
            if (const int r = read_input_option(arg, argv[++i], c); r != kGoOn) return r;
        }
        else if (std::find(kWithValue.begin(), kWithValue.end(), arg) != kWithValue.end()) {
            if (i + 1 >= argc) return usage_error(arg + " needs a value");
            c->opts.emplace_back(arg, argv[++i]);
        } else if (arg.size() > 1 && arg[0] == '-') return usage_error("unknown option " + arg);
        else if (c->path.empty()) c->path = arg;
        else return usage_error("only one input file can be given");
    }

    if (!c->survey && (!c->survey_columns.weight.empty() || !c->survey_columns.stratum.empty() || !c->survey_columns.cluster.empty()))
        return usage_error("--weight, --stratum and --cluster need --category (respondent rows: the category column)");
    if (c->survey && c->screening) return usage_error("--category (survey rows) cannot be combined with screening many groups (--by)");
    if (c->survey) c->survey_columns.sorted = c->input.sorted;
    if (c->table_format == "xlsx" && !c->json && isatty(fileno(stdout)) != 0)
        return usage_error("--table xlsx writes a binary workbook; redirect standard output to a file, such as > table.xlsx");
    return kGoOn;
}

// The input: the named file, or standard input for none or "-".
int read_input_text(const std::string& path, std::string* out) {
    std::string& text = *out;
    if (path.empty() || path == "-") {
        if (const int error = read_all(stdin, &text)) return cannot_read("standard input", error);
    } else {
        std::FILE* in = std::fopen(path.c_str(), "rb");
        if (in == nullptr) return cannot_read(path, errno);
        const int error = read_all(in, &text);
        std::fclose(in);
        if (error != 0) return cannot_read(path, error);
    }

    return kGoOn;
}

// Decodes the text and reads it: an analysis document (with its screen, when it has one), or
// pasted text as one sample or as groups. `read` receives a refusal of the input (printed later,
// in the output's form); the return is kGoOn or the exit status of text that is not text.
int read_analysis(int argc, char** argv, std::string* text_in, CommandLine* c, Analysis* analysis_out,
                  GroupedCounts* groups_out, Status* read_out) {
    std::string& text = *text_in;
    Analysis& analysis = *analysis_out;
    GroupedCounts& groups = *groups_out;
    Status& read = *read_out;
    // A workbook's chosen cells as tab-separated text, or the text decoded: UTF-8 without a mark, or refused.
    const bool from_stdin = c->path.empty() || c->path == "-";
    InputText input = input_text(std::move(text), from_stdin ? "standard input" : c->path, c->workbook);
    if (input.status.ok && !input.from_workbook && (!c->workbook.sheet.empty() || !c->workbook.range.empty()))
        return usage_error("--sheet and --range choose cells of a workbook (.xlsx or .ods); " +
                           (from_stdin ? std::string("standard input") : c->path) + " is text");
    if (!input.status.ok) {
        std::fprintf(stderr, "tallyproof: %s\n", input.status.message.c_str());
        print_error_document(input.status.message);
        return kRefused;
    }
    text = std::move(input.text);
    if (!input.notice.empty() && !c->json) std::fprintf(stderr, "note: %s\n", input.notice.c_str());
    if (!c->json)
        for (const auto& note : input.notes) std::fprintf(stderr, "note: %s\n", note.c_str());
    c->workbook_read = std::move(input);
    const std::size_t first = text.find_first_not_of(" \t\r\n");
    if (first != std::string::npos && text[first] == '{') {
        read = read_analysis_document(text, &analysis);
        bool document_screen = false;
        ScreenChoice from_document;
        if (read.ok) read = read_screen_document(text, &groups, &from_document, &c->screen_view, &document_screen);
        if (!c->json && read.ok)
            for (const auto& note : groups.notes) std::fprintf(stderr, "note: %s\n", note.c_str());
        if (document_screen) {
            // Options given on the command line override the document's screen settings.
            ScreenChoice chosen = from_document;
            for (int i = 1; i + 1 < argc; ++i) {
                const std::string arg = argv[i];
                if (arg == "--against") chosen.against = c->screen.against;
                else if (arg == "--adjust") chosen.adjust = c->screen.adjust;
                else if (arg == "--q") chosen.q = c->screen.q;
            }
            c->screen = chosen;
            c->screening = true;
        }
    } else if (c->survey) {
        // Respondent rows: the sample's categories and counts, the design corrected for (core/survey).
        SurveyRowsReading rows = read_survey_rows(text, c->survey_columns);
        read = rows.status;
        if (read.ok) {
            analysis.categories = rows.sample.categories;
            analysis.observed = rows.counts;
            analysis.design.requested = true;
            analysis.design.sample = std::move(rows.sample);
        }
    } else {
        if (!c->screening && c->input.bins.kind == BinChoice::Kind::equal_probability) {
            // The bins are placed under the model of --model, with the parameters of --param.
            for (const auto& [opt, val] : c->opts) {
                ModelKind kind;
                std::pair<std::string, double> param;
                if (opt == "--model" && model_kind_from_name(val, &kind)) c->input.bins.model = kind;
                else if (opt == "--param" && to_parameter(val, &param)) c->input.bins.parameters.push_back(param);
            }
        }
        // One sample, or with the screening options many groups (core's reading policy; the tool never
        // switches by itself).
        ReadInputOptions how;
        how.groups = c->screening ? GroupsReading::always : GroupsReading::never;
        how.group = c->group_input;
        InputReading reading = read_input(text, c->input, how);
        read = reading.status;
        std::vector<std::string> notes, alternatives;
        if (c->screening) {
            groups = std::move(reading.groups);
            apply_groups_mix(groups, &analysis);
            notes = groups.notes;
        } else {
            notes = reading.sample.notes;
            apply_input_mix(reading.sample, &analysis, &notes);  // options below override what the paste states
            alternatives = reading.sample.alternatives;
        }
        if (!c->json && read.ok) {
            for (const auto& note : notes) std::fprintf(stderr, "note: %s\n", note.c_str());
            for (const auto& alt : alternatives) std::fprintf(stderr, "alternative: %s\n", alt.c_str());
        }
    }

    return kGoOn;
}

// While raw digits are streamed, SIGINT, SIGTERM and SIGHUP stop the reading between pieces: the
// run says where it stopped and gives no result (a count of part of the data is never printed as
// a result). The handlers of before are put back when the stream ends.
volatile std::sig_atomic_t g_stop_signal = 0;
extern "C" void note_stop_signal(int sig) { g_stop_signal = sig; }
struct StopSignals {
    static constexpr int kCaught[3] = {SIGINT, SIGTERM, SIGHUP};
    struct sigaction before[3];
    StopSignals() {
        struct sigaction on {};
        on.sa_handler = note_stop_signal;
        sigemptyset(&on.sa_mask);
        on.sa_flags = 0;  // no SA_RESTART: a read waiting on a pipe returns at once
        for (int i = 0; i < 3; ++i) sigaction(kCaught[i], &on, &before[i]);
    }
    ~StopSignals() {
        for (int i = 0; i < 3; ++i) sigaction(kCaught[i], &before[i], nullptr);
    }
};
int stopped_by_signal(const std::string& name, std::size_t lines, std::size_t bytes) {
    const int sig = g_stop_signal;
    const char* which = sig == SIGINT ? "SIGINT" : sig == SIGTERM ? "SIGTERM" : sig == SIGHUP ? "SIGHUP" : "a signal";
    std::fprintf(stderr, "stopped by %s while reading %s, after line %zu (%zu bytes read): no result; the input was not read to its end\n",
                 which, name.c_str(), lines, bytes);
    return 128 + sig;
}

constexpr std::size_t kStreamChunk = kStreamHeadBytes;  // raw digits are read 1 MiB at a time
constexpr std::size_t kProgressEvery = 64u << 20;  // progress on a terminal every 64 MB

// Fills `buf` from `in` up to its size; returns the bytes read (fewer only at the end or on error).
std::size_t read_chunk(std::FILE* in, char* buf, std::size_t size) {
    std::size_t got = 0;
    for (std::size_t n; got < size && g_stop_signal == 0 && (n = std::fread(buf + got, 1, size - got, in)) > 0;) got += n;
    return got;
}

// --digits on raw numbers: the first MiB decides the shape (read_input, as for the whole text);
// when the input is longer and reads as a raw-digits tally, the rest is streamed through core's
// DigitStreamTally in 1 MiB pieces cut at line ends, so memory does not grow with the input and
// the 256 MB limit does not apply. Otherwise `text` receives the whole input and the caller reads
// it as before. Returns kGoOn with *streamed set when the reading is in `reading`, or an exit status.
// *open_line: the streamed input's last line when it has no line end (else 0).
int read_streamed_digits(const std::string& path, const CommandLine& c, std::string* text, ParsedInput* reading, bool* streamed,
                         std::size_t* open_line) {
    *streamed = false;
    *open_line = 0;
    StopSignals stop;
    const bool from_stdin = path.empty() || path == "-";
    const std::string name = from_stdin ? "standard input" : path;
    std::FILE* in = from_stdin ? stdin : std::fopen(path.c_str(), "rb");
    if (in == nullptr) return cannot_read(path, errno);
    struct Closer { std::FILE* f; bool own; ~Closer() { if (own) std::fclose(f); } } closer{in, !from_stdin};
    // core's DigitStreamReader decides from the first MiB (the page reads a file by the same rule)
    DigitStreamReader reader(c.input);
    const bool progress = isatty(fileno(stderr)) != 0;
    std::size_t next_progress = kProgressEvery;
    std::string buf(kStreamChunk, '\0');
    char last = '\n';  // the last byte read
    while (!reader.ended()) {
        errno = 0;
        const std::size_t got = read_chunk(in, buf.data(), buf.size());
        if (g_stop_signal != 0) {  // the whole lines read so far counted, to name the line reached
            if (reader.state() != DigitStreamReader::State::whole) reader.push(std::string_view(buf.data(), got));
            return stopped_by_signal(name, reader.lines(), reader.bytes());
        }
        if (std::ferror(in)) {
            if (reader.state() == DigitStreamReader::State::streaming)
                return cannot_read(name + " (after line " + std::to_string(reader.lines()) + ")", errno != 0 ? errno : EIO);
            return cannot_read(name, errno != 0 ? errno : EIO);
        }
        if (got > 0) last = buf[got - 1];
        reader.push(std::string_view(buf.data(), got));
        if (got < kStreamChunk) reader.end();
        if (reader.state() == DigitStreamReader::State::whole) {
            // Not streamed: the whole input, read as before (its start first).
            *text = reader.take_held();
            if (!reader.ended()) {
                char more[65536];
                for (std::size_t n; g_stop_signal == 0 && (n = std::fread(more, 1, sizeof more, in)) > 0;) text->append(more, n);
                if (g_stop_signal != 0) return stopped_by_signal(name, 0, text->size());
                if (std::ferror(in)) return cannot_read(name, errno != 0 ? errno : EIO);
            }
            return kGoOn;
        }
        if (reader.state() == DigitStreamReader::State::stopped) break;
        if (progress && reader.bytes() >= next_progress) {
            std::fprintf(stderr, "read %.1f GB, %zu values\n", static_cast<double>(reader.bytes()) / 1e9, reader.values());
            next_progress += kProgressEvery;
        }
    }
    *reading = reader.finish();
    if (reader.state() != DigitStreamReader::State::stopped && last != '\n' && last != '\r') *open_line = reader.lines() + 1;
    if (*open_line != 0 && reading->status.ok)
        reading->notes.push_back("The input ends in the middle of line " + std::to_string(*open_line) +
                                 " (no line end after it): if it was cut short (a program writing it stopped), these counts are of "
                                 "part of the data; the run exits with status 4.");
    *streamed = true;
    return kGoOn;
}

// The options that set the analysis (--model, --alpha, ...), over what the input stated.
int apply_options(const std::vector<std::pair<std::string, std::string>>& opts, Analysis* analysis_out) {
    Analysis& analysis = *analysis_out;
    for (const auto& [opt, val] : opts) {
        double v = 0;
        if (opt == "--ordered") analysis.ordered = true;
        else if (opt == "--williams") analysis.statistic.williams = true;
        else if (opt == "--model") {
            if (!model_kind_from_name(val, &analysis.model.kind)) return usage_error("unknown model kind " + val);
        } else if (opt == "--values") {
            if (!to_list(val, &analysis.model.values)) return usage_error("--values needs numbers such as 9:3:3:1");
        } else if (opt == "--edges") {
            if (!to_list(val, &analysis.model.edges)) return usage_error("--edges needs numbers such as -inf,10,20,inf");
        } else if (opt == "--param") {
            std::pair<std::string, double> param;
            if (!to_parameter(val, &param)) return usage_error("--param needs NAME=VALUE");
            auto same = std::find_if(analysis.model.parameters.begin(), analysis.model.parameters.end(),
                                     [&](const auto& p) { return p.first == param.first; });
            if (same != analysis.model.parameters.end()) same->second = param.second;  // already set by the paste
            else analysis.model.parameters.push_back(param);
        } else if (opt == "--method") {
            if (val == "asymptotic") analysis.pvalue.method = PValueMethod::asymptotic;
            else if (val == "exact") analysis.pvalue.method = PValueMethod::exact;
            else if (val == "monte-carlo") analysis.pvalue.method = PValueMethod::monte_carlo;
            else return usage_error("--method must be asymptotic, exact or monte-carlo");
        } else if (opt == "--ordering") {
            if (val == "statistic") analysis.pvalue.ordering = ExactOrdering::statistic;
            else if (val == "probability") analysis.pvalue.ordering = ExactOrdering::probability;
            else return usage_error("--ordering must be statistic or probability");
        } else if (opt == "--merge") {
            if (!merge_rule_from_name(val, &analysis.merge.rule)) return usage_error("--merge must be none, all-5, cochran or minimum");
        } else {
            if (!tallyproof::read_typed_number(val, &v)) return usage_error(opt + " needs a number");
            if (opt == "--alpha") {
                if (!(v > 0 && v < 1)) return usage_error("--alpha must be a number between 0 and 1");
                analysis.alpha = v;
            } else if (opt == "--lambda") analysis.statistic.lambda = v;
            else if (opt == "--extra-params") {
                if (!(v >= 0 && v <= 1000) || v != static_cast<int>(v)) return usage_error("--extra-params must be a whole number");
                analysis.extra_estimated_parameters = static_cast<int>(v);
            } else if (opt == "--replicates") {
                if (!(v >= 1 && v <= 1e9) || v != static_cast<double>(static_cast<std::uint64_t>(v))) return usage_error("--replicates must be a whole number from 1 to 1000000000");
                analysis.pvalue.replicates = static_cast<std::uint64_t>(v);
            } else if (opt == "--seed") {
                if (!(v >= 0 && v <= 9007199254740991.0) || v != static_cast<double>(static_cast<std::uint64_t>(v))) return usage_error("--seed must be a whole number");
                analysis.pvalue.seed = static_cast<std::uint64_t>(v);
            } else if (opt == "--min-expected") analysis.merge.minimum = v;
            else if (opt == "--plan-w") { analysis.plan.requested = true; analysis.plan.w = v; }
            else if (opt == "--plan-n") { analysis.plan.requested = true; analysis.plan.n = v; }
            else if (opt == "--target-power") { analysis.plan.requested = true; analysis.plan.target_power = v; }
            else if (opt == "--conformity") {
                if (!(v > 0 && v <= 1)) return usage_error("--conformity needs a margin w0 in (0, 1], such as 0.1");
                analysis.conformity.requested = true;
                analysis.conformity.margin_w = v;
                analysis.conformity.margin_points = NAN;
            } else if (opt == "--conformity-points") {
                if (!(v > 0 && v <= 100)) return usage_error("--conformity-points needs a shift in percentage points above 0, at most 100, such as 2");
                analysis.conformity.requested = true;
                analysis.conformity.margin_points = v;
                analysis.conformity.margin_w = NAN;
            } else if (opt == "--conformity-true-w") analysis.conformity.true_w = v;
            else if (opt == "--conformity-power") analysis.conformity.target_power = v;
        }
    }

    return kGoOn;
}

// The screen of many groups, written in the form asked for; the exit status.
int write_screen(const CommandLine& c, const Analysis& analysis, const GroupedCounts& groups, const Status& read) {
    ScreenResult s;
    if (!read.ok) s.status = read;
    else s = screen_groups(analysis, groups, c.screen);
    int screen_written = 0;
    if (c.json) {
        std::string doc = screen_json(analysis, groups, s, &c.screen_view);
        add_workbook_member(&doc, c.workbook_read);
        screen_written = write_output(doc + "\n", "the result document (--json)");
    } else if (s.status.ok && c.table_format == "xlsx") screen_written = write_workbook(screen_workbook(s), "the groups workbook (--table xlsx)");
    else if (s.status.ok && !c.table_format.empty())
        screen_written = write_output(group_table(s, TableExportOptions{c.table_format == "csv" ? TableFormat::csv : TableFormat::tsv,
                                                                        c.out_decimal_comma, c.byte_order_mark}),
                                      c.table_format == "csv" ? "the groups table (--table csv)" : "the groups table (--table tsv)");
    else if (s.status.ok && !c.writeup_style.empty()) screen_written = write_output(screen_writeup(s), "the screening write-up (--writeup)");
    else if (s.status.ok) screen_written = write_output(screen_report_text(s), "the screening report");
    if (!s.status.ok) std::fprintf(stderr, "tallyproof: %s\n", s.status.message.c_str());
    if (screen_written != 0) return screen_written;
    return s.status.ok ? 0 : kRefused;
}

// The one analysis, written in the form asked for; the exit status.
int write_result(const CommandLine& c, const Analysis& analysis, const Status& read) {
    Result result;
    if (!read.ok) result.status = read;
    else result = analyse_completely(analysis);
    int written = 0;
    if (c.json) {
        std::string doc = report_json(analysis, result);
        add_workbook_member(&doc, c.workbook_read);
        written = write_output(doc + "\n", "the result document (--json)");
    } else if (result.status.ok && c.table_format == "xlsx") written = write_workbook(result_workbook(analysis, result), "the workbook (--table xlsx)");
    else if (result.status.ok && !c.table_format.empty())
        written = write_output(category_table(result, TableExportOptions{c.table_format == "csv" ? TableFormat::csv : TableFormat::tsv,
                                                                         c.out_decimal_comma, c.byte_order_mark}),
                               c.table_format == "csv" ? "the table (--table csv)" : "the table (--table tsv)");
    else if (result.status.ok && !c.writeup_style.empty()) {
        WriteupOptions o;
        o.style = c.writeup_style == "markdown" ? WriteupStyle::markdown : c.writeup_style == "tsv" ? WriteupStyle::tsv : WriteupStyle::plain;
        o.decimal_comma = c.out_decimal_comma;
        written = write_output(writeup(analysis, result, o), ("the write-up (--writeup " + c.writeup_style + ")").c_str());
    } else if (result.status.ok) written = write_output(report_text(analysis, result), "the report");
    if (!result.status.ok) std::fprintf(stderr, "tallyproof: %s\n", result.status.message.c_str());
    if (written != 0) return written;
    return result.status.ok ? 0 : kRefused;
}

}  // namespace

int main(int argc, char** argv) {
    CommandLine c;
    for (int i = 1; i < argc; ++i) g_json = g_json || std::strcmp(argv[i], "--json") == 0;
    if (const int r = read_command_line(argc, argv, &c); r != kGoOn) return r;
    std::string text;
    Analysis analysis;
    GroupedCounts groups;
    Status read;
    bool streamed = false;
    std::size_t open_line = 0;  // a streamed input's last line, when it has no line end
    if (c.input.digits && !c.screening && !c.survey && !c.read_whole && c.workbook.sheet.empty() && c.workbook.range.empty()) {
        ParsedInput reading;
        if (const int r = read_streamed_digits(c.path, c, &text, &reading, &streamed, &open_line); r != kGoOn) return r;
        if (streamed) {
            read = reading.status;
            std::vector<std::string> notes = reading.notes;
            apply_input_mix(reading, &analysis, &notes);
            if (!c.json && read.ok)
                for (const auto& note : notes) std::fprintf(stderr, "note: %s\n", note.c_str());
            if (!c.json && read.ok)
                for (const auto& alt : reading.alternatives) std::fprintf(stderr, "alternative: %s\n", alt.c_str());
        }
    } else if (const int r = read_input_text(c.path, &text); r != kGoOn) {
        return r;
    }
    if (!streamed)
        if (const int r = read_analysis(argc, argv, &text, &c, &analysis, &groups, &read); r != kGoOn) return r;
    if (const int r = apply_options(c.opts, &analysis); r != kGoOn) return r;
    if (!c.design_effect.empty() || !c.design_effects.empty()) {
        if (c.screening) return usage_error("--design-effect(s) cannot be combined with screening many groups (--by)");
        if (!c.design_effect.empty() && !c.design_effects.empty()) return usage_error("give --design-effect or --design-effects, not both");
        analysis.design.requested = true;
        if (c.design_effect == "kish") {
            if (c.survey_columns.weight.empty()) return usage_error("--design-effect kish needs --category and --weight (respondent rows)");
            analysis.design.kish = true;
        } else if (!c.design_effect.empty()) {
            double d = 0;
            if (!tallyproof::read_typed_number(c.design_effect, &d) || !(d > 0 && std::isfinite(d)))
                return usage_error("--design-effect needs a number greater than 0, such as 1.8, or kish");
            analysis.design.overall_design_effect = d;
        } else if (!to_list(c.design_effects, &analysis.design.category_design_effects)) {
            return usage_error("--design-effects needs one number per category, such as 1.4,1.2,1.9");
        }
    }
    if (c.screening && analysis.conformity.requested &&
        std::any_of(c.opts.begin(), c.opts.end(), [](const auto& o) { return o.first == "--conformity" || o.first == "--conformity-points"; }))
        return usage_error("--conformity (show one sample conforms within w0) cannot be combined with --by or a document's "
                           "\"groups\" (a screen looks for departures across groups); test the group on its own with --conformity");
    if (c.screening) return write_screen(c, analysis, groups, read);
    const int written = write_result(c, analysis, read);
    if (written == 0 && open_line != 0 && read.ok) {
        std::fprintf(stderr, "warning: the input ends in the middle of line %zu; if it was cut short, the result is of part of the data\n", open_line);
        return kOpenEnd;
    }
    return written;
}
