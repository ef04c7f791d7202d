#include "earmark/scan/scan_session.hpp"

#include "earmark/core/error.hpp"
#include "earmark/marks/utf8.hpp"
#include "earmark/store/session.hpp"

#include <cmath>
#include <filesystem>
#include <map>
#include <set>

namespace earmark {
namespace fs = std::filesystem;
namespace {

std::string canonical(const std::string& path) {
    std::error_code ec;
    auto p = fs::weakly_canonical(fs::absolute(path), ec);
    return ec ? path : p.string();
}

// The session keeps the audio path as its bytes; the line id is one line of
// UTF-8 text, so bytes of another encoding and control characters (a file
// name may hold a line break) are shown as U+FFFD.
std::string lineIdOf(const std::string& id) {
    std::string out;
    for (char c : validUtf8(id)) {
        const auto u = static_cast<unsigned char>(c);
        out += u < 0x20 || u == 0x7F ? std::string("\xEF\xBF\xBD") : std::string(1, c);
    }
    return out;
}

Suspect toStored(const TakeSuspect& s, double durationS) {
    Suspect out;
    out.name = suspectName(s.kind);
    out.value = std::isfinite(s.value) ? s.value : 0.0;
    out.threshold = std::isfinite(s.threshold) ? s.threshold : 0.0;
    const bool span = std::isfinite(s.startS) && std::isfinite(s.endS) && s.endS >= s.startS;
    out.startSeconds = span ? std::max(0.0, s.startS) : 0.0;
    out.endSeconds = span ? std::min(s.endS, durationS) : durationS;
    if (out.endSeconds < out.startSeconds) out.endSeconds = out.startSeconds;
    out.reason = s.reason;
    return out;
}

// The scan's changes to one open session, as one transaction.
SessionWriteSummary fillScanSession(Session& session, const ScanReport& report, const std::vector<ScanItem>& items) {
    SessionWriteSummary summary;
    session.inOneTransaction("writing the scan", [&] {
        std::map<std::string, std::string> textOf;
        for (const auto& item : items) textOf[item.id] = item.text;

        std::map<std::string, TakeId> byPath;
        for (const auto& t : session.takes()) byPath[canonical(t.audioPath)] = t.id;

        std::vector<NewTake> fresh;
        for (const auto& row : report.rows) {
            if (row.failed) {
                ++summary.skipped;
                continue;
            }
            if (byPath.count(canonical(row.file))) continue;
            fresh.push_back({row.file, lineIdOf(row.id), textOf[row.id], ""});
        }
        const auto ids = session.addTakes(fresh);
        summary.added = static_cast<int>(ids.size());
        for (std::size_t i = 0; i < fresh.size(); ++i) byPath[canonical(fresh[i].audioPath)] = ids[i];

        std::vector<TakeId> order;
        std::set<TakeId> placed;
        for (const auto& row : report.rows) {
            if (row.failed) continue;
            const TakeId id = byPath.at(canonical(row.file));
            const double duration = session.take(id).durationSeconds;
            std::vector<Suspect> stored;
            for (const auto& s : row.suspects) stored.push_back(toStored(s, duration));
            session.replaceSuspects(id, stored);
            if (placed.insert(id).second) order.push_back(id);
        }
        summary.updated = static_cast<int>(order.size()) - summary.added;
        for (const auto& t : session.takes())
            if (!placed.count(t.id)) order.push_back(t.id);
        session.setQueueOrder(order);
    });
    return summary;
}

}  // namespace

SessionWriteSummary writeScanSession(const std::string& sessionPath, const ScanReport& report,
                                     const std::vector<ScanItem>& items) {
    if (!Session::exists(sessionPath)) {
        try {
            SessionWriteSummary summary;
            Session::createWhole(sessionPath,
                                 [&](Session& session) { summary = fillScanSession(session, report, items); });
            return summary;
        } catch (const InputError&) {
            // Another scan (a shard on another node) made it meanwhile: write into theirs.
            if (!Session::exists(sessionPath)) throw;
        }
    }
    Session session = Session::open(sessionPath);
    return fillScanSession(session, report, items);
}

}  // namespace earmark
