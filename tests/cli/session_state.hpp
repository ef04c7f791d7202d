// A session's content as text, for tests that compare "before" and "after":
// takes, tiers, suspects and marks with every field but the clock times
// (those differ between two runs of the same command).
#pragma once

#include "earmark/store/session.hpp"

#include <filesystem>
#include <sstream>
#include <string>

namespace earmark::test {

// "absent" when there is no file; the integrity check must pass otherwise.
inline std::string sessionState(const std::string& path) {
    if (!std::filesystem::exists(path)) return "absent";
    const Session s = Session::open(path, OpenMode::ReadOnly);
    std::ostringstream out;
    out.precision(17);
    const std::string check = s.integrityCheck();
    if (check != "ok") return "damaged: " + check;
    for (const Take& t : s.takes()) {
        out << "take " << t.id << " @" << t.queuePosition << " " << t.storedAudioPath << " line=" << t.lineId
            << " text=" << t.text << " build=" << t.build << " " << reviewStatusName(t.status) << " "
            << t.durationSeconds << "\n";
        for (const TierRow& r : s.tiers(t.id))
            out << "  tier " << r.tier << " " << r.startSeconds << " " << r.endSeconds << " " << r.label << "\n";
    }
    for (const Suspect& x : s.suspects())
        out << "suspect " << x.takeId << " " << x.name << " " << x.value << " " << x.threshold << " "
            << x.startSeconds << " " << x.endSeconds << " " << x.reason << "\n";
    for (const Mark& m : s.marks()) {
        out << "mark " << m.id << " take " << m.takeId << " " << categoryName(m.category) << "/" << m.subtype << " "
            << severityName(m.severity) << " " << m.startSeconds << " " << m.endSeconds << " [" << m.words << "] "
            << m.note << " by " << m.rater;
        for (const auto& [name, value] : m.measures) out << " " << name << "=" << value;
        out << "\n";
    }
    return out.str();
}

}  // namespace earmark::test
