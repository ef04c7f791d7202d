// Everything the prosody measures read, computed once per take: the F0 and
// energy tracks, the transcript, speech activity and syllable counts per word.
// Build one per take; measureWords / measureSpan / measureTake read it.
//
// Thread-safety: immutable after construction; const use from several
// threads is safe.
#pragma once

#include "earmark/analysis/take_analysis.hpp"
#include "earmark/prosody/speech_activity.hpp"
#include "earmark/prosody/syllables.hpp"
#include "earmark/prosody/transcript.hpp"

#include <vector>

namespace earmark {

// Weights of the prominence score: a word's prominence is the weighted sum of
// the z-scores (within the take) of its F0 peak in semitones, its mean energy
// in dB and its duration per syllable. Equal weights are common practice.
struct ProminenceWeights {
    double f0 = 1.0;
    double energy = 1.0;
    double duration = 1.0;
};

struct ProsodyParams {
    PauseParams pause;
    EnergyPeakParams peaks;
    ProminenceWeights prominence;
    // Voiced frames needed before F0 figures of a stretch are defined.
    int minVoicedFrames = 3;

    void validate() const;  // throws ParamError naming the field
};

class ProsodyContext {
public:
    // `pitch` and `energy` must cover the take (hops > 0). Words and phones
    // are sorted by start time; intervals with endS <= startS are dropped.
    // When the transcript's text has as many tokens as there are words, each
    // word gets the text token's punctuation (for pause-missing checks).
    // Throws ParamError for bad params or tracks without a positive hop.
    ProsodyContext(PitchTrack pitch, EnergyTrack energy, double durationS, Transcript transcript,
                   const ProsodyParams& params = {});

    // From a take analysis with both the F0 and the energy track; throws
    // ParamError("ProsodyContext.analysis") if either is missing.
    static ProsodyContext fromAnalysis(const TakeAnalysis& analysis, Transcript transcript,
                                       const ProsodyParams& params = {});

    const PitchTrack& pitch() const { return pitch_; }
    const EnergyTrack& energy() const { return energy_; }
    double durationS() const { return durationS_; }
    const Transcript& transcript() const { return transcript_; }
    const SpeechActivity& activity() const { return activity_; }
    const ProsodyParams& params() const { return params_; }

    // Word tokens with punctuation (from the text when the counts match, else the word labels).
    const std::vector<std::string>& wordTokens() const { return tokens_; }
    // Syllables of word i (phones inside it, else its spelling).
    int wordSyllables(std::size_t i) const { return wordSyllables_[i]; }

    // Syllables in the whole take and where the count came from.
    int syllables() const { return syllables_; }
    SyllableSource syllableSource() const { return syllableSource_; }
    // Syllables in [startS, endS): phones, else words (pro rata by overlap), else energy peaks.
    double syllablesIn(double startS, double endS) const;
    // Number of words: word tier, else text tokens; 0 when neither exists.
    int wordCount() const;

private:
    PitchTrack pitch_;
    EnergyTrack energy_;
    double durationS_;
    Transcript transcript_;
    ProsodyParams params_;
    SpeechActivity activity_;
    std::vector<std::string> tokens_;
    std::vector<int> wordSyllables_;
    int syllables_ = 0;
    SyllableSource syllableSource_ = SyllableSource::None;
};

}  // namespace earmark
