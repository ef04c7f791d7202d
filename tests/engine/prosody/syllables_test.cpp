// Syllable counting: the spelling rule on words of known syllable count
// (dictionary syllabification, common knowledge), against espeak-ng's own
// phonemisation over whole sentences, vowel-phone detection, and energy peaks
// on a synthetic syllable train with a known number of syllables.
#include "earmark/core/error.hpp"
#include "earmark/prosody/syllables.hpp"
#include "earmark/level/energy.hpp"
#include "engine/scan/espeak_takes.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <sstream>

namespace earmark {
namespace {

Interval iv(double a, double b, const char* label) {
    Interval i;
    i.startS = a;
    i.endS = b;
    i.label = label;
    return i;
}

TEST(SyllableRule, WordsOfKnownCount) {
    const std::pair<const char*, int> words[] = {
        {"ferry", 2},  {"lane", 1},     {"lanes", 1},    {"table", 2},    {"wanted", 2},  {"lowered", 2},
        {"boxes", 2},  {"radio", 3},    {"nation", 2},   {"usual", 3},    {"queen", 1},   {"yes", 1},
        {"stays", 1},  {"people", 2},   {"bicycles", 3}, {"harbour", 2},  {"the", 1},     {"crossing", 2},
        {"museum", 3}, {"afternoon", 3},{"free", 1},     {"every", 3},    {"Tuesday", 2}, {"don't", 1},
        {"a", 1},      {"well-known", 2}, {"42", 2},     {"7", 2},        {"", 0},        {"--", 0},
    };
    for (const auto& [word, n] : words) EXPECT_EQ(countSyllablesInWord(word), n) << word;
}

TEST(SyllableRule, AgreesWithEspeakPhonemisationOverSentences) {
    if (!test::haveSpeechTools()) GTEST_SKIP() << "espeak-ng is needed";
    test::TempDir dir;
    int rule = 0, espeak = 0;
    for (const auto& line : test::tramwayLines()) {
        std::istringstream words(test::espeakPhonemes(line, dir.path() / "ph.txt"));
        std::string word;
        int vowels = 0;
        while (words >> word) {
            std::istringstream phones(word);
            std::string phone;
            while (std::getline(phones, phone, '_')) vowels += isVowelPhone(phone);
        }
        const int mine = countSyllablesInText(line);
        EXPECT_NEAR(mine, vowels, std::max(2.0, 0.15 * vowels)) << line;
        rule += mine;
        espeak += vowels;
    }
    // Over all 21 lines the rule is within 5 % of espeak-ng's vowel count.
    EXPECT_NEAR(static_cast<double>(rule) / espeak, 1.0, 0.05) << rule << " vs " << espeak;
    RecordProperty("rule_vs_espeak", std::to_string(rule) + "/" + std::to_string(espeak));
}

TEST(VowelPhones, ArpabetIpaAndSampaStyles) {
    for (const char* v : {"AA1", "IY", "ER0", "AH", "ə", "ˈɔː", "ɪ", "æ", "a", "@", "3:", "V", "0", "'O@", "i:"})
        EXPECT_TRUE(isVowelPhone(v)) << v;
    for (const char* c : {"K", "NG", "Y", "W", "HH", "t", "ʃ", "ŋ", "N", "D", "j", "tS", "", "ˈ"})
        EXPECT_FALSE(isVowelPhone(c)) << c;
    const std::vector<Interval> phones = {iv(0.0, 0.1, "K"), iv(0.1, 0.2, "AE1"), iv(0.2, 0.3, "T"), iv(0.3, 0.4, "IY")};
    EXPECT_EQ(countVowelPhones(phones, 0.0, 0.4), 2);
    EXPECT_EQ(countVowelPhones(phones, 0.0, 0.2), 1);
}

TEST(EnergyPeaks, CountsTheSyllablesOfASyntheticTrain) {
    // 9 voiced syllables of 0.18 s separated by 0.07 s of weak noise (a consonant).
    std::vector<test::VoiceSegment> segs;
    segs.push_back({test::VoiceSegment::Kind::Silence, 0.3, 0, 0, 0});
    const int syllables = 9;
    for (int i = 0; i < syllables; ++i) {
        segs.push_back({test::VoiceSegment::Kind::Voiced, 0.18, 130.0 + 5 * i, 120.0 + 5 * i, 0.3});
        segs.push_back({test::VoiceSegment::Kind::Noise, 0.07, 0, 0, 0.005});
    }
    segs.push_back({test::VoiceSegment::Kind::Silence, 0.3, 0, 0, 0});
    const auto voice = test::synthesiseVoice(segs, 16000.0);
    const auto energy = analyseEnergy(voice.signal);
    double loud = -200;
    for (float d : energy.db) loud = std::max(loud, static_cast<double>(d));
    EXPECT_EQ(countEnergyPeaks(energy, nullptr, loud, 0.0, voice.signal.durationSeconds()), syllables);
    // Half the take holds about half the syllables.
    const int half = countEnergyPeaks(energy, nullptr, loud, 0.0, 0.3 + 4.5 * 0.25);
    EXPECT_NEAR(half, 4.5, 1.0);
    EXPECT_EQ(countEnergyPeaks(energy, nullptr, loud, 1.0, 1.0), 0);
    EXPECT_THROW(countEnergyPeaks(energy, nullptr, loud, 0, 1, EnergyPeakParams{.minDipDb = 0}), ParamError);
}

}  // namespace
}  // namespace earmark
