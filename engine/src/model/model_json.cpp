#include "earmark/model/model_json.hpp"

#include "io/json_text.hpp"

#include <nlohmann/json.hpp>

#include <cmath>

namespace earmark {
namespace {

using nlohmann::json;

json rounded(double v, double scale) { return std::isfinite(v) ? json(std::round(v * scale) / scale) : json(nullptr); }

json settingsJson(const MelSettings& s) {
    return {
        {"sample_rate", s.sampleRateHz},
        {"hop_size", s.hopSize},
        {"fft_size", s.fftSize},
        {"window_size", s.windowSize},
        {"window", sidecarName(s.window)},
        {"frame_alignment", sidecarName(s.alignment)},
        {"bands", s.bands},
        {"fmin_hz", s.fminHz},
        {"fmax_hz", s.fmaxHz},
        {"mel_scale", sidecarName(s.scale)},
        {"normalisation", sidecarName(s.normalisation)},
        {"spectrum", sidecarName(s.spectrum)},
        {"log", melLogBaseName(s.log)},
        {"log_floor", s.logFloor},
    };
}

}  // namespace

std::string melDifferenceToJson(const PredictedMel& p, const MelDifference& d, const std::string& predictionPath,
                                const std::string& audioPath) {
    json regions = json::array();
    for (const MelDifferenceRegion& r : d.regions)
        regions.push_back({
            {"first_frame", r.firstFrame},
            {"last_frame", r.lastFrame},
            {"first_band", r.firstBand},
            {"last_band", r.lastBand},
            {"start_s", rounded(r.startS, 1e4)},
            {"end_s", rounded(r.endS, 1e4)},
            {"low_hz", rounded(r.lowHz, 10)},
            {"high_hz", rounded(r.highHz, 10)},
            {"cells", r.cells},
            {"mean_db", rounded(r.meanDb, 100)},
            {"peak_db", rounded(r.peakDb, 100)},
        });
    json frames = json::array();
    for (float v : d.frameMeanAbsDb) frames.push_back(rounded(v, 100));
    json j = {
        {"prediction",
         {
             {"dtype", p.dtype},
             {"layout", melLayoutName(p.layout)},
             {"layout_from", p.layoutFrom},
             {"sidecar", p.sidecarPath ? json(*p.sidecarPath) : json(nullptr)},
             {"frames", p.mel.frames},
             {"settings", settingsJson(p.settings)},
             {"assumed", p.assumed},
         }},
        {"difference",
         {
             {"units", "dB (predicted minus computed)"},
             {"predicted_frames", d.predictedFrames},
             {"computed_frames", d.computedFrames},
             {"first_frame", d.firstFrame},
             {"compared_frames", d.comparedFrames},
             {"mean_db", rounded(d.meanDb, 1e4)},
             {"mean_abs_db", rounded(d.meanAbsDb, 1e4)},
             {"rms_db", rounded(d.rmsDb, 1e4)},
             {"max_abs_db", rounded(d.maxAbsDb, 1e4)},
             {"max_at", {{"frame", d.maxFrame}, {"band", d.maxBand}}},
             {"regions", regions},
             {"frame_mean_abs_db", frames},
         }},
        {"warnings", d.warnings},
    };
    io_detail::putPath(j["prediction"], "file", predictionPath);
    if (p.sidecarPath) io_detail::putPath(j["prediction"], "sidecar", *p.sidecarPath);
    io_detail::putPath(j, "audio", audioPath);
    return j.dump(2, ' ', false, json::error_handler_t::replace);
}

std::string attentionToJson(const AttentionAlignment& a, const std::vector<std::string>& labels,
                            const AttentionParams& params, const std::string& matrixPath) {
    const double hop = params.hopSeconds();
    json tokens = json::array();
    for (std::size_t k = 0; k < labels.size(); ++k) {
        const int f0 = a.path.firstFrame[k], f1 = a.path.lastFrame[k];
        tokens.push_back({{"index", k},
                          {"text", labels[k]},
                          {"first_frame", f0},
                          {"frames", f1 - f0 + 1},
                          {"start_s", rounded(f0 * hop, 1e6)},
                          {"end_s", rounded((f1 + 1) * hop, 1e6)}});
    }
    json faults = json::array();
    for (const AttentionEvent& e : a.faults) {
        json text = json::array();
        for (int k = e.firstToken; k <= e.lastToken; ++k) text.push_back(labels[static_cast<std::size_t>(k)]);
        faults.push_back({{"kind", attentionFaultName(e.kind)},
                          {"first_frame", e.firstFrame},
                          {"last_frame", e.lastFrame},
                          {"start_s", rounded(e.startS, 1e6)},
                          {"end_s", rounded(e.endS, 1e6)},
                          {"first_token", e.firstToken},
                          {"last_token", e.lastToken},
                          {"tokens", text}});
    }
    json j = {
        {"frames", a.argmax.size()},
        {"tokens_count", labels.size()},
        {"hop_size", params.frame.hopSize},
        {"sample_rate", params.frame.sampleRate},
        {"duration_s", rounded(a.durationS, 1e6)},
        {"path_score", rounded(a.path.score, 1e4)},
        {"tokens", tokens},
        {"faults", faults},
        {"argmax", a.argmax},
    };
    io_detail::putPath(j, "matrix", matrixPath);
    return j.dump(2, ' ', false, json::error_handler_t::replace);
}

}  // namespace earmark
