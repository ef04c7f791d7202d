// Word evidence read for review: score classes, expected-vs-heard rows and
// the suspects a take raises. Checked against takes rendered by Debian's
// festival voices (tests/data/evidence/render_festival_takes.py): the word
// with a planted changed vowel must stand out, clean takes must not.
#include "earmark/acoustic/evidence_review.hpp"
#include "earmark/acoustic/evidence_trust.hpp"
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "support/festival_takes.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdio>

namespace earmark {
namespace {

namespace fs = std::filesystem;

WordEvidenceResult evidenceOf(const std::string& name) {
    const fs::path wav = test::festivalTakes() / name;
    return gatherWordEvidence(loadAudio(wav.string()).signal, test::firstLine(fs::path(wav).replace_extension(".txt")));
}

const WordEvidence* findWord(const WordEvidenceResult& r, const std::string& label) {
    for (const WordEvidence& w : r.words)
        if (w.label == label) return &w;
    return nullptr;
}

bool names(const Suspect& s, const std::string& word) { return s.reason.find("'" + word + "'") != std::string::npos; }

TEST(EvidenceReview, ScoreClassesFollowTheBands) {
    WordEvidence w;
    w.spoken = true;
    const ScoreBands bands{.doubtfulBelow = -1.0, .poorBelow = -2.0};
    w.score = -0.2;
    EXPECT_EQ(classifyWord(w, bands), WordScoreClass::Good);
    w.score = -1.0;  // the bound itself is not below it
    EXPECT_EQ(classifyWord(w, bands), WordScoreClass::Good);
    w.score = -1.5;
    EXPECT_EQ(classifyWord(w, bands), WordScoreClass::Doubtful);
    w.score = -2.5;
    EXPECT_EQ(classifyWord(w, bands), WordScoreClass::Poor);
    w.substituted = true;
    EXPECT_EQ(classifyWord(w, bands), WordScoreClass::Unspoken);
    w = {};
    EXPECT_EQ(classifyWord(w, bands), WordScoreClass::Unspoken);
    EXPECT_STREQ(wordScoreClassName(WordScoreClass::Doubtful), "doubtful");
}

TEST(EvidenceReview, BandsOutOfOrderAreRefusedByName) {
    WordEvidence w;
    try {
        classifyWord(w, ScoreBands{.doubtfulBelow = -2.0, .poorBelow = -1.0});
        FAIL() << "no error";
    } catch (const ParamError& e) {
        EXPECT_NE(std::string(e.what()).find("ScoreBands.poorBelow"), std::string::npos) << e.what();
    }
    EXPECT_THROW(classifyWord(w, ScoreBands{.doubtfulBelow = 0.5}), ParamError);
}

TEST(EvidenceReview, PhoneRowsListExpectedAndHeardWithTheWorstMarked) {
    WordEvidence w;
    w.phones = {{"B", {"B"}, 0.1, 0.2, -0.1}, {"R", {"R"}, 0.2, 0.25, -0.3}, {"EH", {"AO", "L"}, 0.25, 0.4, -3.2},
                {"D", {}, 0.4, 0.45, -3.2}};
    const std::vector<PhoneRow> rows = phoneRows(w);
    ASSERT_EQ(rows.size(), 4u);
    EXPECT_EQ(rows[0].heard, "B");
    EXPECT_TRUE(rows[0].matches);
    EXPECT_EQ(rows[2].heard, "AO L");
    EXPECT_FALSE(rows[2].matches);
    EXPECT_EQ(rows[3].heard, "");
    EXPECT_TRUE(rows[2].worst);  // the first of the two lowest
    EXPECT_EQ(std::count_if(rows.begin(), rows.end(), [](const PhoneRow& r) { return r.worst; }), 1);
    EXPECT_DOUBLE_EQ(rows[2].startS, 0.25);
}

TEST(EvidenceReview, MergedSuspectsKeepStoredOnesAndDropRepeats) {
    const std::vector<Suspect> stored = {{.name = "skipped-word", .startSeconds = 1.0, .endSeconds = 1.2, .reason = ""}};
    const std::vector<Suspect> computed = {{.name = "skipped-word", .startSeconds = 1.1, .endSeconds = 1.1, .reason = ""},
                                           {.name = "skipped-word", .startSeconds = 2.0, .endSeconds = 2.1, .reason = ""},
                                           {.name = "pronunciation", .startSeconds = 1.0, .endSeconds = 1.2, .reason = ""}};
    const std::vector<Suspect> merged = mergeSuspects(stored, computed);
    ASSERT_EQ(merged.size(), 3u);
    EXPECT_DOUBLE_EQ(merged[1].startSeconds, 2.0);
    EXPECT_EQ(merged[2].name, "pronunciation");
}

// The changed vowel ("bread" said as "broad") stands out in every voice:
// the word is not shown as good, a suspect names it, and the inspector's
// rows of that word show a phone heard as something else.
TEST(EvidenceReview, ChangedVowelStandsOutInEveryFestivalVoice) {
    for (const std::string voice : {"slt", "kal", "ked"}) {
        const WordEvidenceResult r = evidenceOf(voice + "-fault-vowel.wav");
        const WordEvidence* bread = findWord(r, "bread");
        ASSERT_NE(bread, nullptr);
        EXPECT_NE(classifyWord(*bread), WordScoreClass::Good) << voice << " score " << bread->score;
        const std::vector<Suspect> suspects = evidenceSuspects(r);
        EXPECT_TRUE(std::any_of(suspects.begin(), suspects.end(), [](const Suspect& s) { return names(s, "bread"); }))
            << voice;
        // It is drawn where it was said (as something else), and found there.
        const std::vector<WordScoreSpan> spans = wordScoreSpans(r);
        const auto drawn = std::find_if(spans.begin(), spans.end(), [&](const WordScoreSpan& s) {
            return r.words[s.index].label == "bread";
        });
        ASSERT_NE(drawn, spans.end()) << voice;
        EXPECT_NE(drawn->cls, WordScoreClass::Good) << voice;
        EXPECT_EQ(r.words[static_cast<std::size_t>(wordAt(r, 0.5 * (drawn->startS + drawn->endS)))].label, "bread");
        if (bread->spoken) {
            const std::vector<PhoneRow> rows = phoneRows(*bread);
            EXPECT_TRUE(std::any_of(rows.begin(), rows.end(), [](const PhoneRow& p) { return !p.matches; })) << voice;
        }
        std::printf("[ figures  ] %s 'bread' (said 'broad'): %s, score %.2f nats/frame\n", voice.c_str(),
                    wordScoreClassName(classifyWord(*bread)), bread->score);
    }
}

// Clean takes: the issue's bar of at most one false suspect over 12 clean takes.
TEST(EvidenceReview, CleanFestivalTakesRaiseAtMostOneSuspectPerTwelve) {
    int takes = 0, suspects = 0, words = 0, poor = 0, doubtful = 0;
    for (const std::string voice : {"slt", "kal", "ked"})
        for (int i = 0; i < 4; ++i) {
            char name[32];
            std::snprintf(name, sizeof name, "%s-%02d.wav", voice.c_str(), i);
            const WordEvidenceResult r = evidenceOf(name);
            ++takes;
            for (const Suspect& s : evidenceSuspects(r)) {
                ++suspects;
                ADD_FAILURE() << name << ": " << s.name << " " << s.reason;
            }
            for (const WordEvidence& w : r.words) {
                ++words;
                poor += classifyWord(w) == WordScoreClass::Poor;
                doubtful += classifyWord(w) == WordScoreClass::Doubtful;
            }
        }
    EXPECT_EQ(takes, 12);
    EXPECT_LE(suspects, 1);
    std::printf("[ figures  ] clean takes: %d suspects over %d takes; %d of %d words poor, %d doubtful\n", suspects,
                takes, poor, words, doubtful);
}

}  // namespace
}  // namespace earmark

namespace earmark {
namespace {

// Festival takes are placed whole (a cut one too, with its early end); a
// script far longer than the take is placed only in part and is doubted
// instead of raising a suspect per word.
TEST(EvidenceTrust, WholeTakesAreShownAScriptMostlyNotInTheTakeIsDoubted) {
    const WordEvidenceResult clean = evidenceOf("kal-02.wav");
    EXPECT_DOUBLE_EQ(placedShare(clean), 1.0);
    EXPECT_EQ(evidenceDoubt(clean), "");
    EXPECT_EQ(evidenceDoubt(evidenceOf("ked-fault-cut.wav")), "");
    const fs::path wav = test::festivalTakes() / "kal-01.wav";
    const std::string script = test::firstLine(fs::path(wav).replace_extension(".txt"));
    const WordEvidenceResult tooLong =
        gatherWordEvidence(loadAudio(wav.string()).signal, script + " " + script + " " + script);
    EXPECT_LT(placedShare(tooLong), kMinPlacedShare);
    EXPECT_NE(evidenceDoubt(tooLong).find("placed only"), std::string::npos);
    EXPECT_DOUBLE_EQ(placedShare(WordEvidenceResult{}), 0.0);
}

}  // namespace
}  // namespace earmark
