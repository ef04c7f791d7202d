// Syllable counts, from the best source at hand: a phone tier (vowel phones),
// else the text (an English spelling rule), else energy peaks.
//
// Thread-safety: pure functions.
#pragma once

#include "earmark/level/energy.hpp"
#include "earmark/pitch/pitch_track.hpp"
#include "earmark/prosody/transcript.hpp"

#include <string>
#include <string_view>

namespace earmark {

enum class SyllableSource { Phones, Text, EnergyPeaks, None };
const char* syllableSourceName(SyllableSource source);  // "phones", "text", "energy", "none"

// Earmark's own spelling rule for English, a rough estimate (typically within
// ±10 % over a sentence, checked against espeak-ng's phonemisation in the
// tests): vowel groups (a e i o u y, y not word-initial), minus a silent final
// "e" (kept in a consonant + "le" ending), minus "-es"/"-ed" endings that add
// no syllable, plus one for the vowel pairs usually said apart ("ia", "io",
// "iu", "ua", "uo" outside "-tion"-like endings and "qu"/"gu"; "-eum"). Each digit
// counts the syllables of its English name. Any word with letters or digits
// counts at least 1; anything else 0.
int countSyllablesInWord(std::string_view word);
int countSyllablesInText(std::string_view text);

// True if the phone label is a vowel (a syllable nucleus): ARPAbet vowels
// (AA…UW, stress digits allowed), IPA vowels, and the vowel symbols of
// SAMPA-like sets ("@", "3", "V", "{", "0", …). Stress marks are ignored. A lone
// "Y" is read as the ARPAbet consonant.
bool isVowelPhone(std::string_view label);

// Vowel phones whose midpoint lies in [startS, endS).
int countVowelPhones(const std::vector<Interval>& phones, double startS, double endS);

// Syllable nuclei from energy peaks, after the idea of de Jong & Wempe (2009),
// Behavior Research Methods 41(2), 385–390: a nucleus is a peak
// of the (smoothed) energy contour that rises at least `minDipDb` above the
// dips on both sides, lies within `maxBelowSpeechDb` of the take's speech
// level and, when a pitch track is given, falls on a voiced frame.
struct EnergyPeakParams {
    double smoothSeconds = 0.04;     // moving-average length over the dB contour
    double minDipDb = 2.0;           // required dip between neighbouring peaks
    double maxBelowSpeechDb = 25.0;  // peaks quieter than speech level − this are ignored
    double minGapSeconds = 0.08;     // two nuclei closer than this are one

    void validate() const;  // throws ParamError("EnergyPeakParams.<field>")
};

// `speechLevelDb`: the take's speech level (see SpeechActivity). `pitch` may be
// null (then voicing is not required). Counts peaks in [startS, endS).
int countEnergyPeaks(const EnergyTrack& energy, const PitchTrack* pitch, double speechLevelDb,
                     double startS, double endS, const EnergyPeakParams& params = {});

}  // namespace earmark
