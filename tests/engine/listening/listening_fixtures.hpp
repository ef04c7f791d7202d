// Small invented test designs shared by the listening-test suites.
#pragma once

#include "earmark/listening/test_design.hpp"

#include <nlohmann/json.hpp>

#include <fstream>

#include <string>
#include <vector>

namespace earmark::listening::fixtures {

// Agreement asked of every value against scipy.stats.
inline constexpr double kTol = 1e-9;

// tests/data/listening/stats_reference.json: scipy.stats values written by
// tests/data/make_listening_reference.py.
inline const nlohmann::json& statsReference() {
    static const nlohmann::json j = [] {
        std::ifstream in(std::string(EARMARK_TEST_DATA_DIR) + "/listening/stats_reference.json");
        return nlohmann::json::parse(in);
    }();
    return j;
}

// `lines` lines "l01"…; systems as given (name, role); fake audio paths.
inline TestDesign designOf(TestKind kind, const std::vector<std::pair<std::string, SystemRole>>& systems, int lines,
                           int raters, std::uint64_t seed = 7) {
    TestDesign d;
    d.name = "round";
    d.kind = kind;
    for (const auto& [name, role] : systems) d.systems.push_back({name, role, "builds/" + name, 0, 0});
    for (int i = 0; i < lines; ++i) {
        Line line;
        line.id = (i < 9 ? "l0" : "l") + std::to_string(i + 1);
        line.text = "sentence " + std::to_string(i + 1);
        for (const auto& [name, role] : systems) line.audio.push_back("builds/" + name + "/" + line.id + ".wav");
        d.lines.push_back(line);
    }
    d.plan.raters = raters;
    d.plan.seed = seed;
    return d;
}

inline TestDesign mushraDesign(int lines, int raters, std::uint64_t seed = 7) {
    return designOf(TestKind::Mushra,
                    {{"ref", SystemRole::Reference},
                     {"anchor", SystemRole::LowAnchor},
                     {"mid", SystemRole::MidAnchor},
                     {"build-a", SystemRole::Candidate},
                     {"build-b", SystemRole::Candidate}},
                    lines, raters, seed);
}

}  // namespace earmark::listening::fixtures
