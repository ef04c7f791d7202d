#include "earmark/prosody/rules.hpp"

#include "earmark/core/error.hpp"
#include "earmark/io/text_file.hpp"
#include "io/json_text.hpp"

#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdint>
#include <limits>
#include <fstream>
#include <sstream>
#include <variant>

namespace earmark {
namespace {

using Json = nlohmann::ordered_json;

// One key of the rules document, bound to a field of a ScanRules.
struct Field {
    const char* key;
    std::variant<bool*, double*, int*, std::int64_t*> target;
};
struct Section {
    const char* name;
    std::vector<Field> fields;
};

std::vector<Field> switchFields(RuleSwitch& r) { return {{"enabled", &r.enabled}, {"weight", &r.weight}}; }

std::vector<Field> with(std::vector<Field> a, std::vector<Field> b) {
    a.insert(a.end(), b.begin(), b.end());
    return a;
}

// The document layout: the single place that names sections and keys.
std::vector<Section> layout(ScanRules& r) {
    return {
        {"measure", {{"min_pause_s", &r.pause.minPauseSeconds},
                     {"silence_below_speech_db", &r.pause.silenceBelowSpeechDb},
                     {"absolute_silence_dbfs", &r.pause.absoluteSilenceDb},
                     {"min_speech_s", &r.pause.minSpeechSeconds},
                     {"speech_level_percentile", &r.pause.speechLevelPercentile}}},
        {"score", {{"cap_per_suspect", &r.scoreCapPerSuspect}}},
        {"flat", with(switchFields(r.flat), {{"max_range_st", &r.flat.maxRangeSt},
                                             {"min_words", &r.flat.minWords},
                                             {"min_seconds_without_words", &r.flat.minSecondsWithoutWords}})},
        {"pitch_jump", with(switchFields(r.pitchJump), {{"min_step_st", &r.pitchJump.minStepSt}})},
        {"pause_too_long", with(switchFields(r.pauseTooLong), {{"max_s", &r.pauseTooLong.maxSeconds}})},
        {"pause_missing", with(switchFields(r.pauseMissing), {{"min_after_comma_s", &r.pauseMissing.minAfterCommaS},
                                                              {"min_after_stop_s", &r.pauseMissing.minAfterStopS}})},
        {"rushed", with(switchFields(r.rushed), {{"max_syllables_per_s", &r.rushed.limitSyllablesPerS},
                                                 {"min_speech_s", &r.rushed.minSpeechSeconds}})},
        {"dragged", with(switchFields(r.dragged), {{"min_syllables_per_s", &r.dragged.limitSyllablesPerS},
                                                   {"min_speech_s", &r.dragged.minSpeechSeconds}})},
        {"clipping", with(switchFields(r.clipping), {{"max_clipped_samples", &r.clipping.maxClippedSamples}})},
        {"truncation", with(switchFields(r.truncation), {{"tail_s", &r.truncation.tailSeconds},
                                                         {"max_tail_db", &r.truncation.maxTailDb},
                                                         {"voiced_tail", &r.truncation.voicedTail}})},
        {"leading_silence", with(switchFields(r.leadingSilence), {{"max_s", &r.leadingSilence.maxSeconds}})},
        {"trailing_silence", with(switchFields(r.trailingSilence), {{"max_s", &r.trailingSilence.maxSeconds}})},
        {"loudness", with(switchFields(r.loudness), {{"max_deviation_lu", &r.loudness.maxDeviationLu},
                                                     {"min_takes", &r.loudness.minTakes}})},
        {"dc_offset", with(switchFields(r.dcOffset), {{"max_abs", &r.dcOffset.maxAbs}})},
        {"pronunciation", with(switchFields(r.pronunciation), {{"max_mads_below", &r.pronunciation.maxMadsBelow},
                                                               {"min_mad", &r.pronunciation.minMad},
                                                               {"min_words", &r.pronunciation.minWords},
                                                               {"min_same_word", &r.pronunciation.minSameWord}})},
        {"skipped_word", switchFields(r.skippedWord)},
        {"repeated_word", switchFields(r.repeatedWord)},
        {"extra_speech", with(switchFields(r.extraSpeech), {{"min_s", &r.extraSpeech.minSeconds}})},
        {"substituted_word", switchFields(r.substitutedWord)},
        {"early_end", switchFields(r.earlyEnd)},
        {"longform", {{"window_s", &r.longform.windowSeconds},
                      {"window_hop_s", &r.longform.windowHopSeconds},
                      {"min_take_s", &r.longform.minTakeSeconds},
                      {"scan_min_take_s", &r.longform.scanMinTakeSeconds},
                      {"drift_min_span_s", &r.longform.driftMinSpanSeconds}}},
        {"seam", {{"enabled", &r.longform.seam.enabled},
                  {"context_s", &r.longform.seam.contextSeconds},
                  {"level_step_db", &r.longform.seam.levelStepDb},
                  {"room_tone_step_db", &r.longform.seam.roomToneStepDb},
                  {"click_db", &r.longform.seam.clickDb},
                  {"envelope_jump", &r.longform.seam.envelopeJump}}},
        {"level_drift", {{"enabled", &r.longform.levelDrift.enabled}, {"min_change_db", &r.longform.levelDrift.minChange}}},
        {"pitch_drift", {{"enabled", &r.longform.pitchDrift.enabled}, {"min_change_st", &r.longform.pitchDrift.minChange}}},
        {"rate_drift", {{"enabled", &r.longform.rateDrift.enabled},
                        {"min_change_percent", &r.longform.rateDrift.minChange}}},
        {"timbre_shift", {{"enabled", &r.longform.timbreShift.enabled},
                          {"min_ratio", &r.longform.timbreShift.minRatio},
                          {"min_s", &r.longform.timbreShift.minSeconds}}},
        {"monotone_stretch", {{"enabled", &r.longform.monotone.enabled},
                              {"max_range_st", &r.longform.monotone.maxRangeSt},
                              {"min_s", &r.longform.monotone.minSeconds}}},
        {"click", with(switchFields(r.click), {{"min_ratio", &r.click.params.minRatio},
                                               {"min_isolation", &r.click.params.minIsolation},
                                               {"isolation_s", &r.click.params.isolationSeconds},
                                               {"floor_below_speech_db", &r.click.params.floorBelowSpeechDb}})},
        {"noise_burst", with(switchFields(r.noiseBurst), {{"band_hz", &r.noiseBurst.params.bandHz},
                                                          {"min_excess_db", &r.noiseBurst.params.minExcessDb},
                                                          {"max_s", &r.noiseBurst.params.maxSeconds},
                                                          {"below_speech_db", &r.noiseBurst.params.belowSpeechDb},
                                                          {"sub_band_hz", &r.noiseBurst.params.subBandHz},
                                                          {"low_band_hz", &r.noiseBurst.params.lowBandHz},
                                                          {"max_low_dip_db", &r.noiseBurst.params.maxLowDipDb},
                                                          {"max_mid_rise_db", &r.noiseBurst.params.maxMidRiseDb}})},
        {"buzz", with(switchFields(r.buzz), {{"min_aperiodicity", &r.buzz.params.minAperiodicity},
                                             {"unvoiced_min_aperiodicity", &r.buzz.params.unvoicedMinAperiodicity},
                                             {"max_below_speech_db", &r.buzz.params.maxBelowSpeechDb},
                                             {"low_hz", &r.buzz.params.lowHz},
                                             {"min_low_share", &r.buzz.params.minLowShare},
                                             {"min_s", &r.buzz.params.minSeconds}})},
        {"dropout", with(switchFields(r.dropout), {{"min_depth_db", &r.dropout.params.minDepthDb},
                                                   {"min_s", &r.dropout.params.minSeconds},
                                                   {"max_s", &r.dropout.params.maxSeconds},
                                                   {"edge_below_speech_db", &r.dropout.params.edgeBelowSpeechDb},
                                                   {"max_f0_step_st", &r.dropout.params.maxF0StepSt},
                                                   {"unvoiced_edge_below_speech_db",
                                                    &r.dropout.params.unvoicedEdgeBelowSpeechDb}})},
    };
}

std::string keyPath(const char* section, const std::string& key) { return std::string("rules.") + section + "." + key; }

void readField(const Field& f, const Json& v, const std::string& path) {
    std::visit(
        [&](auto* p) {
            using T = std::remove_pointer_t<decltype(p)>;
            if constexpr (std::is_same_v<T, bool>) {
                if (!v.is_boolean()) throw ParamError(path, "expects true or false");
                *p = v.get<bool>();
            } else if constexpr (std::is_same_v<T, double>) {
                if (!v.is_number()) throw ParamError(path, "expects a number");
                *p = v.get<double>();
            } else {
                if (!v.is_number_integer()) throw ParamError(path, "expects a whole number");
                using Limits = std::numeric_limits<T>;
                const bool fits = v.is_number_unsigned()
                                      ? v.get<std::uint64_t>() <= static_cast<std::uint64_t>(Limits::max())
                                      : v.get<std::int64_t>() >= Limits::min() && v.get<std::int64_t>() <= Limits::max();
                if (!fits) throw ParamError(path, "is out of range for a whole number");
                *p = v.get<T>();
            }
        },
        f.target);
}

void requireFinite(double v, const std::string& path) {
    if (!std::isfinite(v)) throw ParamError(path, "must be finite");
}

void validateLongform(const LongformRules& l) {
    const auto positive = [](double v, const char* section, const char* key) {
        if (!(v > 0)) throw ParamError(keyPath(section, key), "must be positive");
    };
    if (!(l.windowSeconds >= 5 && l.windowSeconds <= 600)) throw ParamError("rules.longform.window_s", "must be 5…600 s");
    if (!(l.windowHopSeconds > 0 && l.windowHopSeconds <= l.windowSeconds))
        throw ParamError("rules.longform.window_hop_s", "must be positive and at most window_s");
    if (!(l.minTakeSeconds >= l.windowSeconds)) throw ParamError("rules.longform.min_take_s", "must be at least window_s");
    if (!(l.scanMinTakeSeconds >= l.minTakeSeconds))
        throw ParamError("rules.longform.scan_min_take_s", "must be at least min_take_s");
    positive(l.driftMinSpanSeconds, "longform", "drift_min_span_s");
    positive(l.seam.contextSeconds, "seam", "context_s");
    positive(l.seam.levelStepDb, "seam", "level_step_db");
    positive(l.seam.roomToneStepDb, "seam", "room_tone_step_db");
    positive(l.seam.clickDb, "seam", "click_db");
    if (!(l.seam.envelopeJump > 1)) throw ParamError("rules.seam.envelope_jump", "must be above 1 (a ratio to the median join)");
    positive(l.levelDrift.minChange, "level_drift", "min_change_db");
    positive(l.pitchDrift.minChange, "pitch_drift", "min_change_st");
    positive(l.rateDrift.minChange, "rate_drift", "min_change_percent");
    if (!(l.timbreShift.minRatio > 1)) throw ParamError("rules.timbre_shift.min_ratio", "must be above 1");
    positive(l.timbreShift.minSeconds, "timbre_shift", "min_s");
    positive(l.monotone.maxRangeSt, "monotone_stretch", "max_range_st");
    positive(l.monotone.minSeconds, "monotone_stretch", "min_s");
}

}  // namespace

ProsodyParams ScanRules::prosodyParams() const {
    ProsodyParams p;
    p.pause = pause;
    return p;
}

bool ScanRules::wordEvidenceEnabled() const {
    return pronunciation.enabled || skippedWord.enabled || repeatedWord.enabled || extraSpeech.enabled ||
           substitutedWord.enabled || earlyEnd.enabled;
}

void ScanRules::validate() const {
    try {
        pause.validate();
    } catch (const ParamError& e) {
        // Name the key of the rules document rather than the struct field.
        const std::string& s = e.subject();
        const std::string field = s.substr(s.find('.') + 1);
        const char* key = field == "minPauseSeconds"        ? "min_pause_s"
                          : field == "silenceBelowSpeechDb" ? "silence_below_speech_db"
                          : field == "absoluteSilenceDb"    ? "absolute_silence_dbfs"
                          : field == "minSpeechSeconds"     ? "min_speech_s"
                                                            : "speech_level_percentile";
        throw ParamError(keyPath("measure", key), e.problem());
    }
    if (!(scoreCapPerSuspect >= 1)) throw ParamError("rules.score.cap_per_suspect", "must be >= 1");
    ScanRules self = *this;  // layout() binds pointers to a mutable object; this copy is only read
    for (const auto& section : layout(self))
        for (const auto& f : section.fields)
            if (auto d = std::get_if<double*>(&f.target)) requireFinite(**d, keyPath(section.name, f.key));
    auto positive = [](double v, const char* section, const char* key) {
        if (!(v > 0)) throw ParamError(keyPath(section, key), "must be positive");
    };
    auto nonNegative = [](double v, const char* section, const char* key) {
        if (!(v >= 0)) throw ParamError(keyPath(section, key), "must be >= 0");
    };
    const std::pair<const char*, const RuleSwitch*> switches[] = {
        {"flat", &flat}, {"pitch_jump", &pitchJump}, {"pause_too_long", &pauseTooLong},
        {"pause_missing", &pauseMissing}, {"rushed", &rushed}, {"dragged", &dragged},
        {"clipping", &clipping}, {"truncation", &truncation}, {"leading_silence", &leadingSilence},
        {"trailing_silence", &trailingSilence}, {"loudness", &loudness}, {"dc_offset", &dcOffset},
        {"click", &click}, {"noise_burst", &noiseBurst}, {"buzz", &buzz}, {"dropout", &dropout},
        {"pronunciation", &pronunciation}, {"skipped_word", &skippedWord}, {"repeated_word", &repeatedWord},
        {"extra_speech", &extraSpeech}, {"substituted_word", &substitutedWord}, {"early_end", &earlyEnd}};
    for (const auto& [name, sw] : switches) nonNegative(sw->weight, name, "weight");
    positive(flat.maxRangeSt, "flat", "max_range_st");
    if (flat.minWords < 2) throw ParamError("rules.flat.min_words", "must be >= 2");
    positive(flat.minSecondsWithoutWords, "flat", "min_seconds_without_words");
    positive(pitchJump.minStepSt, "pitch_jump", "min_step_st");
    positive(pauseTooLong.maxSeconds, "pause_too_long", "max_s");
    positive(pauseMissing.minAfterCommaS, "pause_missing", "min_after_comma_s");
    positive(pauseMissing.minAfterStopS, "pause_missing", "min_after_stop_s");
    positive(rushed.limitSyllablesPerS, "rushed", "max_syllables_per_s");
    nonNegative(rushed.minSpeechSeconds, "rushed", "min_speech_s");
    positive(dragged.limitSyllablesPerS, "dragged", "min_syllables_per_s");
    nonNegative(dragged.minSpeechSeconds, "dragged", "min_speech_s");
    if (dragged.limitSyllablesPerS >= rushed.limitSyllablesPerS)
        throw ParamError("rules.dragged.min_syllables_per_s", "must be below rules.rushed.max_syllables_per_s");
    if (clipping.maxClippedSamples < 0) throw ParamError("rules.clipping.max_clipped_samples", "must be >= 0");
    positive(truncation.tailSeconds, "truncation", "tail_s");
    if (!(truncation.maxTailDb < 0)) throw ParamError("rules.truncation.max_tail_db", "must be negative (dB below the speech level)");
    positive(leadingSilence.maxSeconds, "leading_silence", "max_s");
    positive(trailingSilence.maxSeconds, "trailing_silence", "max_s");
    positive(loudness.maxDeviationLu, "loudness", "max_deviation_lu");
    if (loudness.minTakes < 2) throw ParamError("rules.loudness.min_takes", "must be >= 2");
    positive(dcOffset.maxAbs, "dc_offset", "max_abs");
    positive(pronunciation.maxMadsBelow, "pronunciation", "max_mads_below");
    positive(pronunciation.minMad, "pronunciation", "min_mad");
    if (pronunciation.minWords < 2) throw ParamError("rules.pronunciation.min_words", "must be >= 2");
    if (pronunciation.minSameWord < 3)
        throw ParamError("rules.pronunciation.min_same_word", "must be >= 3");
    nonNegative(extraSpeech.minSeconds, "extra_speech", "min_s");
    validateLongform(longform);
    // The detectors check their own parameters; name the section in the error.
    auto detector = [](const char* section, auto&& check) {
        try {
            check();
        } catch (const ParamError& e) {
            throw ParamError(std::string("rules.") + section, e.subject() + " " + e.problem());
        }
    };
    detector("click", [&] { click.params.validate(); });
    detector("noise_burst", [&] { noiseBurst.params.validate(); });
    detector("buzz", [&] { buzz.params.validate(); });
    detector("dropout", [&] { dropout.params.validate(); });
}

ScanRules parseRules(const std::string& json, const std::string& origin) {
    Json doc;
    try {
        doc = io_detail::parseJsonText<Json>(json, origin);
    } catch (const InputError& e) {
        // A rules file is a setting: bad content is a bad setting (exit 2), named by its file.
        throw ParamError(origin, e.problem());
    }
    if (!doc.is_object()) throw ParamError("rules", "the document must be a JSON object");
    ScanRules rules;
    const auto sections = layout(rules);
    for (const auto& [name, body] : doc.items()) {
        if (name == "comment") continue;  // free text for the file's author
        const Section* section = nullptr;
        for (const auto& s : sections)
            if (name == s.name) section = &s;
        if (!section) throw ParamError("rules." + name, "unknown section");
        if (!body.is_object()) throw ParamError("rules." + name, "expects an object");
        for (const auto& [key, value] : body.items()) {
            const Field* field = nullptr;
            for (const auto& f : section->fields)
                if (key == f.key) field = &f;
            if (!field) throw ParamError(keyPath(section->name, key), "unknown key");
            readField(*field, value, keyPath(section->name, key));
        }
    }
    rules.validate();
    return rules;
}

ScanRules loadRules(const std::string& path) {
    return parseRules(readTextFile(path), path);
}

std::string rulesToJson(const ScanRules& rules) {
    ScanRules copy = rules;
    Json doc = Json::object();
    for (const auto& section : layout(copy)) {
        Json body = Json::object();
        for (const auto& f : section.fields)
            std::visit([&](auto* p) { body[f.key] = *p; }, f.target);
        doc[section.name] = body;
    }
    return doc.dump(2);
}

}  // namespace earmark
