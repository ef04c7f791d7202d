#include "earmark/widgets/mark_snapshot.hpp"

#include "earmark/marks/mark_measures.hpp"
#include "earmark/prosody/transcript.hpp"

#include <QObject>

#include <exception>

namespace earmark::widgets {

MeasureSnapshot snapshotForSpan(const TakeTracks& tracks, double durationS, const TierSet& tiers,
                                const std::string& text, double startS, double endS) {
    if (!tracks.pitch || !tracks.energy) return {};
    try {
        const ProsodyContext context(*tracks.pitch, *tracks.energy, durationS, transcriptFrom(tiers, text));
        return measureMarkSpan(context, startS, endS);
    } catch (const std::exception&) {
        return {};  // an empty span inside the take: nothing to measure
    }
}

std::vector<std::pair<QString, QString>> describeMeasures(const MeasureSnapshot& m) {
    struct Row {
        const char* key;
        QString label;
        QString unit;
        int decimals;
    };
    const Row rows[] = {
        {"duration_s", QObject::tr("duration"), QObject::tr("s"), 3},
        {"f0_mean_hz", QObject::tr("F0 mean"), QObject::tr("Hz"), 1},
        {"f0_min_hz", QObject::tr("F0 min"), QObject::tr("Hz"), 1},
        {"f0_max_hz", QObject::tr("F0 max"), QObject::tr("Hz"), 1},
        {"f0_range_st", QObject::tr("F0 range"), QObject::tr("st"), 1},
        {"f0_slope_st_per_s", QObject::tr("F0 slope"), QObject::tr("st/s"), 1},
        {"energy_mean_db", QObject::tr("mean energy"), QObject::tr("dBFS"), 1},
        {"syllables_per_s", QObject::tr("speaking rate"), QObject::tr("syll/s"), 1},
        {"pause_s", QObject::tr("pause"), QObject::tr("s"), 3},
    };
    std::vector<std::pair<QString, QString>> out;
    for (const Row& r : rows) {
        const auto it = m.find(r.key);
        out.emplace_back(r.label, it == m.end() ? QObject::tr("—") : QStringLiteral("%1 %2").arg(it->second, 0, 'f', r.decimals).arg(r.unit));
    }
    return out;
}

}  // namespace earmark::widgets
