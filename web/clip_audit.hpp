// Finds text cut by a clip rectangle in the frame just drawn: a glyph that reaches past the
// rectangle it is drawn in, where its window cannot be scrolled that way to show the rest.
// Tests ask for it (tp_clip_audit) to check that nothing is cut mid-word or mid-number on a
// phone; text that scrolls (the counts table's columns, a long report) is not counted as cut.
#pragma once

namespace tallyproof::web {

// Asks for an audit of the next frame drawn.
void request_clip_audit();
// Called after ImGui::Render(): when an audit was asked for, scans the frame's draw data and
// publishes globalThis.tallyproofPage.clipped = { glyphs, windows: [...], samples: [...] }.
void run_clip_audit();

}  // namespace tallyproof::web
