#include "earmark/prosody/prosody_context.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {
namespace {

std::vector<Interval> usableSorted(std::vector<Interval> items) {
    std::erase_if(items, [](const Interval& l) { return !(l.endS > l.startS); });
    std::stable_sort(items.begin(), items.end(),
                     [](const Interval& a, const Interval& b) { return a.startS < b.startS; });
    return items;
}

}  // namespace

void ProsodyParams::validate() const {
    pause.validate();
    peaks.validate();
    for (double w : {prominence.f0, prominence.energy, prominence.duration})
        if (!std::isfinite(w)) throw ParamError("ProsodyParams.prominence", "weights must be finite");
    if (minVoicedFrames < 1) throw ParamError("ProsodyParams.minVoicedFrames", "must be >= 1");
}

ProsodyContext::ProsodyContext(PitchTrack pitch, EnergyTrack energy, double durationS, Transcript transcript,
                               const ProsodyParams& params)
    : pitch_(std::move(pitch)), energy_(std::move(energy)), durationS_(durationS),
      transcript_(std::move(transcript)), params_(params) {
    params_.validate();
    if (!(pitch_.hopSeconds > 0)) throw ParamError("ProsodyContext.pitch", "F0 track has no positive hop");
    if (!(durationS_ >= 0)) throw ParamError("ProsodyContext.durationS", "must be >= 0");
    transcript_.words = usableSorted(std::move(transcript_.words));
    transcript_.phones = usableSorted(std::move(transcript_.phones));
    activity_ = detectSpeech(energy_, durationS_, params_.pause);

    const auto& words = transcript_.words;
    const auto textTok = textTokens(transcript_.text);
    if (!words.empty() && textTok.size() == words.size()) {
        tokens_ = textTok;
    } else if (!words.empty()) {
        for (const auto& w : words) tokens_.push_back(w.label);
    } else {
        tokens_ = textTok;
    }
    const bool phones = !transcript_.phones.empty() && countVowelPhones(transcript_.phones, 0, 1e300) > 0;
    for (const auto& w : words) {
        const int fromPhones = phones ? countVowelPhones(transcript_.phones, w.startS, w.endS) : 0;
        wordSyllables_.push_back(phones ? fromPhones : countSyllablesInWord(w.label));
    }
    if (phones) {
        syllables_ = countVowelPhones(transcript_.phones, 0, 1e300);
        syllableSource_ = SyllableSource::Phones;
    } else if (!tokens_.empty()) {
        for (const auto& t : tokens_) syllables_ += countSyllablesInWord(t);
        syllableSource_ = SyllableSource::Text;
    } else if (activity_.hasSpeech()) {
        syllables_ = countEnergyPeaks(energy_, &pitch_, activity_.speechLevelDb, *activity_.speechStartS,
                                      *activity_.speechEndS, params_.peaks);
        syllableSource_ = SyllableSource::EnergyPeaks;
    }
}

ProsodyContext ProsodyContext::fromAnalysis(const TakeAnalysis& analysis, Transcript transcript,
                                            const ProsodyParams& params) {
    if (!analysis.pitch || !analysis.energy)
        throw ParamError("ProsodyContext.analysis", "needs both the F0 and the energy track");
    return ProsodyContext(*analysis.pitch, *analysis.energy, analysis.signal.durationSeconds(),
                          std::move(transcript), params);
}

int ProsodyContext::wordCount() const {
    return transcript_.words.empty() ? static_cast<int>(tokens_.size()) : static_cast<int>(transcript_.words.size());
}

double ProsodyContext::syllablesIn(double startS, double endS) const {
    if (!(endS > startS)) return 0.0;
    if (syllableSource_ == SyllableSource::Phones) return countVowelPhones(transcript_.phones, startS, endS);
    const auto& words = transcript_.words;
    if (!words.empty()) {
        double total = 0;
        for (std::size_t i = 0; i < words.size(); ++i) {
            const double overlap = std::min(endS, words[i].endS) - std::max(startS, words[i].startS);
            if (overlap > 0) total += wordSyllables_[i] * overlap / (words[i].endS - words[i].startS);
        }
        return total;
    }
    // Without word times, spread the text's syllables over the speech time
    // (pauses excluded) is too coarse for a span; count energy peaks instead.
    return countEnergyPeaks(energy_, &pitch_, activity_.speechLevelDb, startS, endS, params_.peaks);
}

}  // namespace earmark
