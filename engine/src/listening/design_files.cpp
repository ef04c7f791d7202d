#include "earmark/listening/design_files.hpp"

#include "earmark/core/error.hpp"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <filesystem>
#include <map>
#include <set>

namespace earmark::listening {
namespace {

namespace fs = std::filesystem;
using nlohmann::json;

bool isAudioFile(const fs::path& p) {
    std::string ext = p.extension().string();
    std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return std::tolower(c); });
    return ext == ".wav" || ext == ".flac" || ext == ".ogg" || ext == ".aiff" || ext == ".aif";
}

}  // namespace

DesignDraft designFromTakes(const std::string& name, TestKind kind, const std::vector<SourceTake>& takes,
                            const std::vector<std::pair<std::string, SystemRole>>& roles, bool dropIncomplete,
                            const std::string& subject) {
    DesignDraft out;
    TestDesign& d = out.design;
    d.name = name;
    d.kind = kind;
    d.instructions = defaultInstructions(kind);
    std::map<std::string, std::map<std::string, const SourceTake*>> byLine;  // line → system → take
    for (const SourceTake& t : takes) {
        if (t.system.empty()) throw InputError(subject, "take " + t.audio + " belongs to no system (no build tag)");
        if (t.line.empty()) throw InputError(subject, "take " + t.audio + " has no line id");
        if (d.systemIndex(t.system) < 0) d.systems.push_back({t.system, SystemRole::Candidate, "", 0, 0});
        auto& slot = byLine[t.line][t.system];
        if (slot) throw InputError(subject, "system '" + t.system + "' has two takes of line '" + t.line + "': " +
                                                slot->audio + " and " + t.audio);
        slot = &t;
    }
    for (const auto& [system, role] : roles) {
        const int i = d.systemIndex(system);
        if (i < 0) throw InputError(subject, "no takes of system '" + system + "' (given a role)");
        d.systems[static_cast<std::size_t>(i)].role = role;
    }
    for (const auto& [lineId, systems] : byLine) {
        std::vector<std::string> missing;
        for (const System& s : d.systems)
            if (!systems.count(s.name)) missing.push_back(s.name);
        if (!missing.empty()) {
            std::string names;
            for (const auto& m : missing) names += (names.empty() ? "'" : ", '") + m + "'";
            if (!dropIncomplete)
                throw InputError(subject, "line '" + lineId + "' has no take of system " + names +
                                              " (drop incomplete lines to leave it out)");
            out.notes.push_back("line '" + lineId + "' left out: no take of system " + names);
            continue;
        }
        Line line;
        line.id = lineId;
        for (const System& s : d.systems) {
            const SourceTake* t = systems.at(s.name);
            if (line.text.empty()) line.text = t->text;
            line.audio.push_back(t->audio);
        }
        d.lines.push_back(std::move(line));
    }
    if (d.lines.empty()) throw InputError(subject, "no line has a take of every system");
    return out;
}

std::vector<SourceTake> takesFromFolders(const std::vector<std::string>& specs) {
    std::vector<SourceTake> out;
    for (const std::string& spec : specs) {
        const auto eq = spec.find('=');
        const std::string folder = eq == std::string::npos ? spec : spec.substr(eq + 1);
        std::string system = eq == std::string::npos ? fs::path(folder).lexically_normal().filename().string()
                                                     : spec.substr(0, eq);
        if (system.empty() || system == ".") system = fs::absolute(folder).lexically_normal().parent_path().filename().string();
        std::error_code ec;
        if (!fs::is_directory(folder, ec)) throw InputError(folder, "is not a folder");
        std::vector<fs::path> files;
        for (const auto& entry : fs::directory_iterator(folder, ec))
            if (entry.is_regular_file() && isAudioFile(entry.path())) files.push_back(entry.path());
        if (ec) throw InputError(folder, "cannot be listed: " + ec.message());
        if (files.empty()) throw InputError(folder, "holds no audio files (wav, flac, ogg, aiff)");
        std::sort(files.begin(), files.end());
        for (const fs::path& f : files) out.push_back({system, f.stem().string(), "", fs::absolute(f).string()});
    }
    return out;
}

std::string designToJson(const TestDesign& d) {
    json j;
    j["name"] = d.name;
    j["kind"] = std::string(kindName(d.kind));
    j["instructions"] = d.instructions;
    j["systems"] = json::array();
    for (const System& s : d.systems) {
        json sj = {{"name", s.name}, {"role", std::string(roleName(s.role))}, {"source", s.source}};
        if (s.role == SystemRole::AttentionCheck) sj["accept"] = {s.acceptMin, s.acceptMax};
        j["systems"].push_back(sj);
    }
    j["lines"] = json::array();
    for (const Line& line : d.lines) j["lines"].push_back({{"id", line.id}, {"text", line.text}, {"audio", line.audio}});
    j["plan"] = {{"raters", d.plan.raters},
                 {"lines_per_rater", d.plan.linesPerRater},
                 {"repeats_per_rater", d.plan.repeatsPerRater},
                 {"attention_per_rater", d.plan.attentionPerRater},
                 {"seed", d.plan.seed}};
    return j.dump(1);
}

TestDesign designFromJson(const std::string& text, const std::string& subject) {
    try {
        const json j = json::parse(text);
        TestDesign d;
        d.name = j.at("name").get<std::string>();
        const auto kind = parseKind(j.at("kind").get<std::string>());
        if (!kind) throw InputError(subject, "unknown test kind '" + j.at("kind").get<std::string>() + "'");
        d.kind = *kind;
        d.instructions = j.value("instructions", std::string());
        for (const json& s : j.at("systems")) {
            System sys;
            sys.name = s.at("name").get<std::string>();
            const auto role = parseRole(s.at("role").get<std::string>());
            if (!role) throw InputError(subject, "unknown role '" + s.at("role").get<std::string>() + "'");
            sys.role = *role;
            sys.source = s.value("source", std::string());
            if (s.contains("accept")) {
                sys.acceptMin = s["accept"].at(0).get<double>();
                sys.acceptMax = s["accept"].at(1).get<double>();
            }
            d.systems.push_back(sys);
        }
        for (const json& l : j.at("lines"))
            d.lines.push_back({l.at("id").get<std::string>(), l.value("text", std::string()),
                               l.at("audio").get<std::vector<std::string>>()});
        const json& p = j.at("plan");
        d.plan.raters = p.at("raters").get<int>();
        d.plan.linesPerRater = p.value("lines_per_rater", 0);
        d.plan.repeatsPerRater = p.value("repeats_per_rater", 0);
        d.plan.attentionPerRater = p.value("attention_per_rater", 0);
        d.plan.seed = p.at("seed").get<std::uint64_t>();
        return d;
    } catch (const json::exception& e) {
        throw InputError(subject, std::string("is not a listening-test design: ") + e.what());
    }
}

}  // namespace earmark::listening
