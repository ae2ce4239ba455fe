// Demo scenarios (invented data, assets/demos/), embedded at build time by assets/embed_demos.py.
#pragma once

namespace tallyproof::web {

struct DemoScenario {
    const char* title;
    const char* story;     // one line
    const char* document;  // an analysis document (JSON)
};

extern const DemoScenario kDemoScenarios[];
extern const int kDemoScenarioCount;

}  // namespace tallyproof::web
