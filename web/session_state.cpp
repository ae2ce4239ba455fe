// The session's transitions: autosave (this tab's slot, the latest, the recent list shared by
// the tabs), restoring on reload, share links, and the notice line. A change only marks what is
// due (publish, keep_analysis); settle_frame() publishes and stores it once per frame.
#include "app_state.hpp"
#include "app_state_internal.hpp"

#include <emscripten.h>

#include <algorithm>
#include <cstdlib>
#include <cstring>

#include "analysis_document.hpp"
#include "demo_library.hpp"
#include "json_reader.hpp"
#include "json_writer.hpp"
#include "number_format.hpp"
#include "page_bridge.hpp"
#include "report.hpp"
#include "share_link.hpp"

namespace tallyproof::web {
namespace {


constexpr const char* kRecentPrefix = "tallyproof.recent.";  // + id: one key per entry, shared by the tabs
constexpr const char* kOldRecentKey = "tallyproof.recent";     // the whole list in one key (earlier versions)
constexpr const char* kLatestKey = "tallyproof.current";   // the latest analysis of any tab: a new tab starts there
constexpr const char* kTabKey = "tallyproof.tab-current";  // this tab's own (sessionStorage)
constexpr const char* kTabIdKey = "tallyproof.tab-id";
// The file this tab's counts were tallied from in chunks: "<analysis id>\n<file name>" (sessionStorage).
constexpr const char* kTabStreamedKey = "tallyproof.tab-streamed";
constexpr const char* kStorageRefused =
    "This analysis is not being kept in this browser (storage is refused or full): use Save & share, "
    "Download analysis (JSON) to keep it.";

}  // namespace

// A short confirmation under the title bar, mirrored into the page for screen readers. While
// storage is refused that is said first, whatever else is confirmed.
void set_notice(AppState& s, const std::string& text) {
    s.view.notice = text;
    if (s.session.storage_refused && text.find(kStorageRefused) == std::string::npos)
        s.view.notice = std::string(kStorageRefused) + (text.empty() ? "" : "  " + text);
    publish_notice(s.view.notice);
}

std::string new_analysis_id() {
    static unsigned counter = 0;  // distinct within a tab; the time and a random part across tabs
    return std::to_string(static_cast<long long>(wall_clock_ms())) + "-" + std::to_string(std::rand() % 100000) + "-" +
           std::to_string(++counter);
}

namespace {

// The analysis on screen is the example `demo_index` as loaded (not yet edited).
bool shows_unchanged_demo(const AppState& s) {
    if (s.view.demo_index < 0 || s.view.demo_index >= kDemoScenarioCount) return false;
    Analysis demo;
    if (!read_analysis_document(kDemoScenarios[s.view.demo_index].document, &demo).ok) return false;
    return demo.observed == s.analysis.observed && demo.categories == s.analysis.categories &&
           demo.model.kind == s.analysis.model.kind && demo.model.values == s.analysis.model.values;
}

// A title from the data: the first categories, N and the expected mix; an example's name only
// while its data are on screen unchanged.
std::string saved_title(const AppState& s) {
    if (s.groups.open) return screen_title(s);
    const auto& c = s.analysis.categories;
    std::string cats;
    for (std::size_t i = 0; i < c.size() && i < 3; ++i) cats += (i ? ", " : "") + (c[i].empty() ? std::string("(no label)") : c[i]);
    if (c.size() > 3) cats += ", …";
    if (cats.empty()) cats = "no categories";
    std::string t = cats + " · N = " + format_count(s.result.n);
    if (!s.result.model_description.empty()) t += " · " + s.result.model_description;
    if (shows_unchanged_demo(s)) t = std::string("Example: ") + kDemoScenarios[s.view.demo_index].title + " · " + t;
    return t;
}

// One entry of the recent list from its JSON object (false when it is not one).
bool read_saved_entry(const JsonValue& e, SavedAnalysis* out) {
    const JsonValue *t = e.find("title"), *w = e.find("when"), *d = e.find("document"), *id = e.find("id"), *ms = e.find("saved_ms");
    if (!(t && w && d && t->is(JsonValue::Type::string) && w->is(JsonValue::Type::string) && d->is(JsonValue::Type::string)))
        return false;
    *out = SavedAnalysis{t->string, w->string, d->string, "", 0};
    if (id && id->is(JsonValue::Type::string)) out->id = id->string;
    if (ms && ms->is(JsonValue::Type::number)) out->saved_ms = ms->number;
    return true;
}

// Each entry is its own key (kRecentPrefix + id), written only by the tab that changes that
// analysis: two tabs saving at once never overwrite each other's entries (a shared list written
// back whole lost one tab's entry when the other read it a moment before).
bool write_saved_entry(const SavedAnalysis& r) {
    JsonWriter j;
    j.begin_object().key("title").value(r.title).key("when").value(r.when).key("document").value(r.document)
        .key("id").value(r.id).key("saved_ms").value(r.saved_ms).end_object();
    return storage_set((std::string(kRecentPrefix) + r.id).c_str(), j.str());
}

void remove_saved_entry(const std::string& id) { storage_remove((std::string(kRecentPrefix) + id).c_str()); }

// A list saved whole by an earlier version (one key) becomes one key per entry, once.
void move_old_recent_list() {
    const std::string old = storage_get(kOldRecentKey);
    if (old.empty()) return;
    JsonValue list;
    bool moved = true;
    if (parse_json(old, &list).ok && list.is(JsonValue::Type::array)) {
        int i = 0;
        for (const auto& e : list.array) {
            SavedAnalysis a;
            if (!read_saved_entry(e, &a)) continue;
            if (a.id.empty()) a.id = "old-" + std::to_string(i);
            if (a.saved_ms == 0) a.saved_ms = 1000.0 - i;  // keeps their order, older than anything new
            ++i;
            moved = write_saved_entry(a) && moved;
        }
    }
    if (moved) storage_remove(kOldRecentKey);
}

// Every entry in storage, newest first.
std::vector<SavedAnalysis> read_all_saved_entries() {
    move_old_recent_list();
    std::vector<SavedAnalysis> out;
    for (const std::string& key : storage_keys(kRecentPrefix)) {
        JsonValue e;
        SavedAnalysis a;
        if (parse_json(storage_get(key.c_str()), &e).ok && read_saved_entry(e, &a)) {
            a.id = key.substr(std::strlen(kRecentPrefix));
            out.push_back(std::move(a));
        }
    }
    std::stable_sort(out.begin(), out.end(), [](const SavedAnalysis& a, const SavedAnalysis& b) {
        return a.saved_ms != b.saved_ms ? a.saved_ms > b.saved_ms : a.id > b.id;
    });
    return out;
}

std::vector<SavedAnalysis> read_recent_list() {
    std::vector<SavedAnalysis> out = read_all_saved_entries();
    if (out.size() > kRecentLimit) out.resize(kRecentLimit);
    return out;
}

void note_storage(AppState& s, bool kept) {
    if (kept || s.session.storage_refused) return;
    s.session.storage_refused = true;
    set_notice(s, s.view.notice);
}

}  // namespace

// Autosave: the analysis on screen is kept after every change, in this tab's slot (restored on
// its reload), as the latest (where a new tab starts) and in the recent list, which is read,
// merged with this analysis by identity and time, and written back, so other tabs' entries stay.
void remember(AppState& s, const std::string& document) {
    if (s.session.analysis_id.empty()) s.session.analysis_id = new_analysis_id();
    bool kept = tab_storage_set(kTabKey, document);
    kept = tab_storage_set(kTabIdKey, s.session.analysis_id) && kept;
    // Counts tallied from a file read in chunks: only the counts are in the document; which file
    // they came from is kept beside it, for the reload to say so.
    if (!s.reading.streamed.empty()) tab_storage_set(kTabStreamedKey, s.session.analysis_id + "\n" + s.reading.streamed);
    else tab_storage_remove(kTabStreamedKey);
    kept = storage_set(kLatestKey, document) && kept;
    // The same data saved under another entry (a restore, another tab) is one analysis: one entry.
    for (const auto& e : read_all_saved_entries())
        if (e.id != s.session.analysis_id && e.document == document) remove_saved_entry(e.id);
    kept = write_saved_entry(SavedAnalysis{saved_title(s), local_time_text(), document, s.session.analysis_id, wall_clock_ms()}) && kept;
    std::vector<SavedAnalysis> list = read_all_saved_entries();
    for (std::size_t i = kRecentLimit; i < list.size(); ++i) remove_saved_entry(list[i].id);  // the oldest go first
    if (list.size() > kRecentLimit) list.resize(kRecentLimit);
    s.session.recent = std::move(list);
    note_storage(s, kept);
}


// A change marks what is due; settle_frame() does it once per frame (as ImGui saves its
// settings once they are marked dirty), so a burst of edits, or a screen's several steps, build
// and store the document once rather than at every step.
void publish(AppState& s) {
    s.report = report_text(s.analysis, s.result);
    // While the Groups view shows the screen, the live region carries the screen's report and the
    // screen is kept once its groups are tested (recompute_groups); an opened group keeps the screen.
    if (s.groups.open && s.groups.opened < 0) return;
    s.session.due_publish = Session::Publish::analysis;
    s.session.due_save = true;
}



void settle_frame(AppState& s) {
    Session& due = s.session;
    if (due.due_publish == Session::Publish::none && !due.due_save) return;
    // A screen too large to keep whole: its document (megabytes) is built only when saved as a
    // file; the page gets the pooled sample's settings, and the notice says why it is not kept.
    const bool whole = !s.groups.open || screen_kept_whole(s);
    const std::string document = whole ? analysis_document(s) : write_analysis_document(s.analysis);
    if (due.due_publish == Session::Publish::analysis) publish_result(s.report, report_json(s.analysis, s.result), document);
    if (due.due_publish == Session::Publish::screen) publish_screen_now(s, document);
    if (due.due_save && whole) remember(s, document);
    else if (due.due_save && s.groups.result.status.ok)
        set_notice(s, "A screen of " + format_grouped(static_cast<std::uint64_t>(s.groups.counts.groups.size())) +
                          " groups is too large to keep in this browser (it keeps about 5 MB a site): to keep it, use "
                          "Save & share, Download analysis (JSON), and open that file to return to it.");
    due.due_publish = Session::Publish::none;
    due.due_save = false;
}

void keep_analysis(AppState& s) { s.session.due_save = true; }

void restore_session(AppState& s) {
    s.session.recent = read_recent_list();
    watch_storage(kOldRecentKey);  // and every key it begins
    const std::string fragment = location_fragment();
    if (!fragment.empty()) {
        if (open_share_fragment(s, fragment)) return;
        const std::string message = s.refused.message;
        load_demo(s, 0);  // something to look at, with the refusal above it
        s.refused.message = message;
        publish_error(message);
        return;
    }
    // This tab's own analysis on its reload; a new tab starts from the latest of any tab.
    const std::string own = tab_storage_get(kTabKey), own_id = tab_storage_get(kTabIdKey);
    const std::string saved = own.empty() ? storage_get(kLatestKey) : own;
    const std::string streamed = own.empty() ? "" : tab_storage_get(kTabStreamedKey);
    if (!saved.empty() && open_document(s, saved)) {
        std::string id = own.empty() ? "" : own_id;
        for (const auto& e : s.session.recent)
            if (id.empty() && e.document == saved) id = e.id;
        const std::size_t cut = streamed.find('\n');
        const std::string file = cut != std::string::npos && !own_id.empty() && streamed.compare(0, cut, own_id) == 0
                                     ? streamed.substr(cut + 1) : std::string();
        s.reading.streamed = file;  // kept beside the document again by remember()
        if (!id.empty()) {  // the same analysis: its entry, not a new one
            s.session.analysis_id = id;
            remember(s, saved);
        }
        s.reading.source_name = "restored from the last session";
        if (!file.empty()) {
            s.reading.source_name = "restored: the counts tallied from " + file;
            set_notice(s, "Restored the counts tallied from " + file + ". The file was read in chunks and only its counts were kept "
                          "in this browser, not its text: to read it another way, open it again.");
        }
        return;
    }
    clear_refusal(s);
    load_demo(s, 0);
}

bool open_share_fragment(AppState& s, const std::string& fragment) {
    std::string document;
    const Status st = decode_share_fragment(fragment, &document);
    if (!st.ok) {
        clear_refusal(s);  // a link is not text to edit here
        s.refused.message = st.message;
        publish_error(st.message);
        s.view.frames_to_draw = 3;
        return false;
    }
    if (!open_document(s, document)) return false;
    s.reading.source_name = "share link";
    return true;
}

void start_fresh(AppState& s) {
    storage_remove(kLatestKey);
    tab_storage_remove(kTabKey);
    tab_storage_remove(kTabIdKey);
    tab_storage_remove(kTabStreamedKey);
    s.merge_undo.clear();
    load_demo(s, 0);
    set_notice(s, "Started fresh: paste your counts, or pick an example.");
}

void open_recent(AppState& s, int index) {
    if (index < 0 || index >= static_cast<int>(s.session.recent.size())) return;
    const SavedAnalysis chosen = s.session.recent[index];
    if (open_document(s, chosen.document)) {
        s.reading.source_name = "recent: " + chosen.title;
        s.session.analysis_id = chosen.id;  // edits go on in its entry
        remember(s, chosen.document);
    }
}

void remove_recent(AppState& s, int index) {
    if (index < 0 || index >= static_cast<int>(s.session.recent.size())) return;
    const std::string id = s.session.recent[index].id;
    remove_saved_entry(id);
    s.session.recent = read_recent_list();
    if (id == s.session.analysis_id) s.session.analysis_id = new_analysis_id();  // kept on screen, no longer in the list
    s.view.frames_to_draw = 3;
}

void reload_recent(AppState& s) {
    s.session.recent = read_recent_list();
    s.view.frames_to_draw = 3;
}

void copy_share_link(AppState& s) {
    if (s.groups.open) {
        const std::string link = encode_share_fragment(screen_document(s));
        if (link.empty()) {  // beyond kShareMaxFragmentChars (65,536 characters: about 3,100 groups)
            set_notice(s, "This screen of " + format_count(static_cast<double>(s.groups.counts.groups.size())) +
                              " groups is too long for a share link (a link holds up to 65,536 characters, about 3,100 groups); "
                              "download the analysis file (JSON) instead: it keeps the whole screen.");
            return;
        }
        copy_text(page_address() + "#" + link);
        set_notice(s, "Share link copied: it carries the whole screen (every group, its settings, the order and the opened "
                      "group) in the link itself; nothing is sent to any server.");
        return;
    }
    const std::string fragment = encode_share_fragment(write_analysis_document(s.analysis));
    if (fragment.empty() || fragment.size() > 8000) {
        set_notice(s, "This analysis is too large for a share link; download the analysis file (JSON) instead.");
        return;
    }
    copy_text(page_address() + "#" + fragment);
    set_notice(s, "Share link copied: it carries the whole analysis in the link itself; nothing is sent to any server.");
}

}  // namespace tallyproof::web
