#include "earmark/export/analysis_json.hpp"

#include "io/json_text.hpp"

#include <nlohmann/json.hpp>

#include <cmath>

namespace earmark {
namespace {

using nlohmann::json;

// Rounds for compact output; tracks do not need more than this precision.
json rounded(double v, double scale) {
    if (!std::isfinite(v)) return nullptr;
    return std::round(v * scale) / scale;
}

json optionalNumber(const std::optional<double>& v, double scale) {
    return v ? rounded(*v, scale) : json(nullptr);
}

}  // namespace

std::string analysisToJson(const TakeAnalysis& a, const AnalysisParams& params,
                           const AnalysisJsonOptions& options) {
    json j;
    io_detail::putPath(j, "file", a.info.path);
    j["format"] = a.info.format;
    j["duration_s"] = rounded(a.info.durationSeconds(), 1e6);
    j["sample_rate"] = a.info.sampleRate;
    j["channels"] = a.info.channels;
    j["frames"] = a.info.frames;
    j["channel_used"] = params.channels.mode == ChannelMode::Mix
                            ? json("mix")
                            : json(params.channels.channel + 1);

    json summary;
    summary["f0_median_hz"] = optionalNumber(a.pitchSummary.medianHz, 100);
    summary["f0_p5_hz"] = optionalNumber(a.pitchSummary.p5Hz, 100);
    summary["f0_p95_hz"] = optionalNumber(a.pitchSummary.p95Hz, 100);
    summary["f0_range_st"] = optionalNumber(a.pitchSummary.rangeSemitones, 100);
    summary["voiced_fraction"] = a.pitch ? rounded(a.pitchSummary.voicedFraction, 1e4) : json(nullptr);
    summary["loudness_lufs"] = a.loudnessLufs ? rounded(*a.loudnessLufs, 100) : json(nullptr);
    summary["sample_peak_dbfs"] = rounded(a.sampleStats.samplePeakDbfs, 100);
    summary["clipped_samples"] = a.sampleStats.clippedSamples;
    summary["dc_offset"] = rounded(a.sampleStats.dcOffset, 1e6);
    j["summary"] = summary;

    if (a.pitch) {
        json f0;
        f0["hop_s"] = a.pitch->hopSeconds;
        f0["min_hz"] = params.pitch.minF0Hz;
        f0["max_hz"] = params.pitch.maxF0Hz;
        f0["frames"] = a.pitch->size();
        if (options.includeTracks) {
            json hz = json::array(), conf = json::array();
            for (std::size_t i = 0; i < a.pitch->size(); ++i) {
                hz.push_back(a.pitch->voiced(i) ? rounded(a.pitch->f0Hz[i], 100) : json(nullptr));
                conf.push_back(rounded(a.pitch->confidence[i], 1000));
            }
            f0["hz"] = std::move(hz);
            f0["confidence"] = std::move(conf);
        }
        j["f0"] = std::move(f0);
    }
    if (a.energy) {
        json e;
        e["hop_s"] = a.energy->hopSeconds;
        e["window_s"] = params.energy.windowSeconds;
        e["frames"] = a.energy->db.size();
        if (options.includeTracks) {
            json db = json::array();
            for (float v : a.energy->db) db.push_back(rounded(v, 100));
            e["db"] = std::move(db);
        }
        j["energy"] = std::move(e);
    }
    if (a.mel) {
        j["mel"] = {{"hop_s", a.mel->hopSeconds}, {"sample_rate", a.mel->sampleRate}, {"frames", a.mel->frames}, {"bands", a.mel->bins},
                    {"fmin_hz", params.mel.fminHz}, {"fmax_hz", params.mel.fmaxHz},
                    {"scale", params.mel.scale == MelScale::Htk ? "htk" : "slaney"}};
    }
    return j.dump(options.indent, ' ', false, json::error_handler_t::replace);
}

}  // namespace earmark
