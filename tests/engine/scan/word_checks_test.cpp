// Word evidence in the scan: planted faults found and named by their word,
// few false word suspects on clean takes, the pronunciation calibration, the
// new columns read back, shards with a supplied calibration, the session.
//
// Takes: Debian's festival voices (cmu_us_slt_arctic_hts, kal_diphone,
// ked_diphone) reading texts of our own, and the planted faults of
// tests/data/evidence/faults.txt (a word swapped for a similar one, a vowel
// changed, a word skipped, a word said twice, a take cut inside a word and
// padded with 0.25 s of silence), rendered by
// tests/data/evidence/render_festival_takes.py. Bar (issue 10): every fault
// named by its word; at most 1 false pronunciation/coverage suspect per
// voice over its 12 clean takes.
#include "earmark/scan/scan_report.hpp"
#include "earmark/scan/scan_session.hpp"
#include "earmark/store/session.hpp"
#include "scan_rows.hpp"
#include "support/festival_takes.hpp"
#include "support/temp_dir.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <map>
#include <set>

namespace earmark {
namespace {

namespace fs = std::filesystem;

bool isWordSuspect(SuspectKind k) {
    return k == SuspectKind::Pronunciation || k == SuspectKind::SkippedWord || k == SuspectKind::RepeatedWord ||
           k == SuspectKind::ExtraSpeech || k == SuspectKind::SubstitutedWord || k == SuspectKind::EarlyEnd;
}

// The items of one voice: 12 clean takes and 5 planted faults, ids = file names.
std::vector<ScanItem> voiceSet(const std::string& voice) {
    std::vector<ScanItem> items;
    for (bool faults : {false, true})
        for (const fs::path& wav : test::festivalTakeFiles(voice + "-", faults)) {
            ScanItem item;
            item.index = items.size();
            item.id = wav.stem().string();
            item.audioPath = wav.string();
            item.text = test::firstLine(fs::path(wav).replace_extension(".txt"));
            items.push_back(std::move(item));
        }
    return items;
}

// One scan per voice, made once for all tests of this file.
const ScanReport& reportOf(const std::string& voice) {
    static std::map<std::string, ScanReport> cache;
    auto it = cache.find(voice);
    if (it == cache.end()) {
        ScanSettings settings;
        settings.jobs = 2;
        it = cache.emplace(voice, makeReport(runScan(voiceSet(voice), settings), settings.rules)).first;
    }
    return it->second;
}

// True when `reason` holds `word` as a whole word inside quotes ('word' or 'the word').
bool namesWord(const std::string& reason, const std::string& word) {
    for (std::size_t at = reason.find(word); at != std::string::npos; at = reason.find(word, at + 1)) {
        const char before = at ? reason[at - 1] : ' ', after = at + word.size() < reason.size() ? reason[at + word.size()] : ' ';
        if ((before == '\'' || before == ' ') && (after == '\'' || after == ' ') &&
            reason.rfind('\'', at) != std::string::npos)
            return true;
    }
    return false;
}

// The cells of the word-evidence columns, row by row.
std::vector<std::string> wordColumnsOf(const std::string& csv) {
    std::vector<std::string> out;
    std::size_t from = 0;
    while (from < csv.size()) {
        const std::size_t end = csv.find("\r\n", from);
        const std::string line = csv.substr(from, end - from);
        const std::size_t a = line.find(",model,"), b = a == std::string::npos ? a : line.find(',', a + 1);
        if (a != std::string::npos) {
            std::size_t c = b;
            for (int k = 0; k < 7 && c != std::string::npos; ++k) c = line.find(',', c + 1);
            out.push_back(line.substr(a, c - a));
        }
        from = end == std::string::npos ? csv.size() : end + 2;
    }
    return out;
}

using test::rowOf;

class WordChecksPerVoice : public ::testing::TestWithParam<std::string> {};

TEST_P(WordChecksPerVoice, PlantedFaultsAreNamedByTheirWordAndCleanTakesStayQuiet) {
    const std::string voice = GetParam();
    const ScanReport& report = reportOf(voice);
    ASSERT_EQ(report.rows.size(), 17u);
    // The suspects that name each fault (any of them, with the word in its reason).
    const std::map<std::string, std::pair<std::string, std::set<std::string>>> expected = {
        {"swap", {"tickets", {"substituted-word", "pronunciation", "extra-speech"}}},
        {"vowel", {"bread", {"substituted-word", "pronunciation", "extra-speech"}}},
        {"skip", {"all", {"skipped-word"}}},
        {"repeat", {"open", {"repeated-word"}}},
        {"cut", {"car", {"early-end"}}},
    };
    for (const auto& [id, want] : expected) {
        const ScanRow& row = rowOf(report, voice + "-fault-" + id);
        EXPECT_EQ(row.words.method, "model") << row.status;
        bool named = false;
        std::string seen;
        for (const auto& s : row.suspects) {
            seen += s.reason + "\n";
            named = named || (want.second.count(suspectName(s.kind)) && namesWord(s.reason, want.first));
        }
        EXPECT_TRUE(named) << voice << " " << id << ": '" << want.first << "' not named; suspects:\n" << seen;
    }
    int falseSuspects = 0, clean = 0;
    std::string flagged;
    for (const auto& row : report.rows) {
        if (row.id.find("-fault-") != std::string::npos) continue;
        ++clean;
        EXPECT_EQ(row.words.method, "model") << row.id << ": " << row.status;
        for (const auto& s : row.suspects)
            if (isWordSuspect(s.kind)) {
                ++falseSuspects;
                flagged += row.id + ": " + s.reason + "\n";
            }
    }
    ASSERT_EQ(clean, 12);
    ASSERT_TRUE(report.wordCalibration.has_value());
    std::printf("[ figures  ] %s: %d false word suspect(s) over %d clean takes; set median %.3f, MAD %.3f over %zu words\n%s",
                voice.c_str(), falseSuspects, clean, report.wordCalibration->medianScore, report.wordCalibration->mad,
                report.wordCalibration->words, flagged.c_str());
    EXPECT_LE(falseSuspects, 1) << flagged;
}

INSTANTIATE_TEST_SUITE_P(FestivalVoices, WordChecksPerVoice, ::testing::Values("slt", "kal", "ked"));

// Median and MAD by their definitions (Hampel 1974, JASA 69:383–393): of
// {−3, −0.4, −0.3, −0.2, −0.1} the median is −0.3 and the absolute deviations
// {2.7, 0.1, 0, 0.1, 0.2} have median 0.1.
TEST(WordScoreCalibration, MedianAndMadOfTheSet) {
    PronunciationRule rule;
    rule.minWords = 5;
    const auto c = calibrateWordScores({-0.2, -3.0, -0.1, -0.4, -0.3}, rule);
    ASSERT_TRUE(c.has_value());
    EXPECT_DOUBLE_EQ(c->medianScore, -0.3);
    EXPECT_NEAR(c->mad, 0.1, 1e-12);
    EXPECT_NEAR(c->limit(rule), -0.3 - rule.maxMadsBelow * 0.1, 1e-12);
    rule.minWords = 6;
    EXPECT_FALSE(calibrateWordScores({-0.2, -3.0, -0.1, -0.4, -0.3}, rule).has_value());
    // Equal scores: the MAD is 0 and the floor keeps the limit below the median.
    rule.minWords = 2;
    const auto flat = calibrateWordScores({-0.5, -0.5, -0.5}, rule);
    EXPECT_NEAR(flat->limit(rule), -0.5 - rule.maxMadsBelow * rule.minMad, 1e-12);
}

// A word's score is a mean over its frames; a mean of n frames spreads as
// 1/sqrt(n) (the standard error of a mean), so a word half as long as the
// set's median word is held to sqrt(2) times the distance from the median.
// A take whose spoken words have known model scores.
TakeWords scoredTake(std::vector<ScannedWord> words) {
    TakeWords take;
    take.method = "model";
    take.scoresKnown = true;
    take.words = std::move(words);
    return take;
}

// A word said often whose own scores spread wider than the set's is held to
// its own spread; one said always wrong (low, narrow) keeps the set's limit.
// MAD as in Hampel 1974 (unscaled), computed by hand below.
TEST(WordScoreCalibration, OftenSaidWordsWithAWideSpreadWidenTheirOwnLimit) {
    PronunciationRule rule;
    rule.minWords = 5;
    rule.maxMadsBelow = 8;
    rule.minSameWord = 4;
    // Set: 28 words, median -0.3, MAD 0.1 (limit -1.1). 'the' x4 (-0.2, -0.4, -1.0, -3.0):
    // median -0.7, MAD 0.4 (limit -0.3 - 8 x 0.4 = -3.5). 'pier' x4 (-2.0, -2.1, -2.1, -2.2):
    // MAD 0.05, under the set's.
    std::vector<double> scores = {-0.2, -0.4, -1.0, -3.0, -2.0, -2.1, -2.1, -2.2};
    std::vector<std::string> labels = {"the", "The", "the", "THE", "pier", "pier", "pier", "pier"};
    for (int i = 0; i < 20; ++i) {
        scores.push_back(i % 2 ? -0.2 : -0.3);
        labels.push_back("word" + std::to_string(i));
    }
    const auto c = calibrateWordScores(scores, rule, {}, labels);
    ASSERT_TRUE(c.has_value());
    ASSERT_EQ(c->sameWords.size(), 2u);
    EXPECT_NEAR(c->medianScore, -0.3, 1e-12);
    EXPECT_NEAR(c->mad, 0.1, 1e-12);
    EXPECT_NEAR(c->sameWords.at("the").mad, 0.4, 1e-12);
    EXPECT_EQ(c->sameWords.at("the").count, 4u);
    EXPECT_NEAR(c->limitFor(rule, 0.3, "The"), -3.5, 1e-12);
    EXPECT_DOUBLE_EQ(c->limitFor(rule, 0.3, "pier"), c->limit(rule));
    EXPECT_DOUBLE_EQ(c->limitFor(rule, 0.3, "harbour"), c->limit(rule));
    ScanRules rules;
    rules.pronunciation = rule;
    TakeWords take = scoredTake({{"the", 1.0, 1.3, -3.0, ""}, {"harbour", 1.3, 1.7, -0.3, ""}});
    EXPECT_FALSE(pronunciationSuspect(take, *c, rules).has_value());
    take.words = {{"pier", 1.0, 1.3, -2.2, ""}};
    const auto s = pronunciationSuspect(take, *c, rules);
    ASSERT_TRUE(s.has_value());
    take.words = {{"the", 1.0, 1.3, -4.5, ""}};
    const auto t = pronunciationSuspect(take, *c, rules);
    ASSERT_TRUE(t.has_value());
    EXPECT_NE(t->reason.find("of 'the', said 4 times in the set"), std::string::npos) << t->reason;
}

TEST(WordScoreCalibration, ShortWordsAreHeldToAWiderLimit) {
    PronunciationRule rule;
    rule.minWords = 5;
    rule.maxMadsBelow = 8;
    const auto c = calibrateWordScores({-0.2, -3.0, -0.1, -0.4, -0.3}, rule, {0.2, 0.4, 0.3, 0.3, 0.5});
    ASSERT_TRUE(c.has_value());
    EXPECT_DOUBLE_EQ(c->typicalWordSeconds, 0.3);
    EXPECT_NEAR(c->limitFor(rule, 0.15), -0.3 - 8 * 0.1 * std::sqrt(2.0), 1e-12);
    EXPECT_DOUBLE_EQ(c->limitFor(rule, 0.3), c->limit(rule));
    EXPECT_DOUBLE_EQ(c->limitFor(rule, 0.9), c->limit(rule));  // longer words are not held tighter
    // −1.3 is below the set's limit (−1.1) but not below a 0.15 s word's (−1.43).
    ScanRules rules;
    rules.pronunciation = rule;
    TakeWords take = scoredTake({{"the", 1.0, 1.15, -1.3, ""}, {"harbour", 1.15, 1.55, -0.3, ""}});
    EXPECT_FALSE(pronunciationSuspect(take, *c, rules).has_value());
    take.words.front().endS = 1.3;  // the same score over 0.3 s is off
    const auto s = pronunciationSuspect(take, *c, rules);
    ASSERT_TRUE(s.has_value());
    EXPECT_NE(s->reason.find("'the'"), std::string::npos) << s->reason;
    // Of two words below their limits, the one furthest below (relative to its limit) is named.
    // 'a' (0.075 s) scores lowest, −2.0 against its −1.9: 1.06 times its allowed distance;
    // 'harbour' −1.2 against −1.1: 1.125 times.
    take.words = {{"a", 1.0, 1.075, -2.0, ""}, {"harbour", 1.1, 1.5, -1.2, ""}};
    const auto t = pronunciationSuspect(take, *c, rules);
    ASSERT_TRUE(t.has_value());
    EXPECT_EQ(t->reason.rfind("pronunciation: 'harbour'", 0), 0u) << t->reason;
    EXPECT_NE(t->reason.find("also below: 'a'"), std::string::npos) << t->reason;
    // Without known durations (a calibration from an older report) every word keeps the set's limit.
    WordScoreCalibration old = *c;
    old.typicalWordSeconds = 0;
    EXPECT_DOUBLE_EQ(old.limitFor(rule, 0.05), old.limit(rule));
}

// The pronunciation limit follows the set: a tighter k flags more words,
// and the suspect names the word, its time and the phones most off.
TEST(WordScoreCalibration, PronunciationSuspectNamesTheWordAndFollowsK) {
    const ScanReport& report = reportOf("kal");
    const ScanRow& row = rowOf(report, "kal-fault-vowel");
    ScanRules rules;
    rules.pronunciation.maxMadsBelow = 0.5;
    const auto s = pronunciationSuspect(row.words, *report.wordCalibration, rules);
    ASSERT_TRUE(s.has_value());
    const ScannedWord* low = row.words.lowest();
    EXPECT_EQ(s->value, low->score);
    EXPECT_NE(s->reason.find("'" + low->label + "'"), std::string::npos) << s->reason;
    EXPECT_DOUBLE_EQ(s->startS, low->startS);
    EXPECT_EQ(s->reason.find(';'), std::string::npos);
    rules.pronunciation.maxMadsBelow = 1000;
    EXPECT_FALSE(pronunciationSuspect(row.words, *report.wordCalibration, rules).has_value());
}

// The new columns survive CSV and JSON; a shard given the whole set's
// calibration judges pronunciation exactly as the whole run does.
TEST(WordChecksReport, ColumnsReadBackAndShardsUseASuppliedCalibration) {
    const ScanReport& whole = reportOf("ked");
    test::TempDir dir;
    const std::string csv = (dir.path() / "ked.csv").string(), json = (dir.path() / "ked.json").string();
    ScanRules rules;
    std::ofstream(csv, std::ios::binary) << reportToCsv(whole);
    std::ofstream(json, std::ios::binary) << reportToJson(whole, rules);
    EXPECT_NE(reportToCsv(whole).find("alignment_method,lowest_word_score,lowest_word,missing_words,repeated_words,"
                                      "extra_near,early_end_s,early_end_words"),
              std::string::npos);
    // JSON keeps every word score: merged again it is the same report. A CSV keeps the columns.
    EXPECT_TRUE(reportToCsv(mergeReports({readReport(json)}, rules)) == reportToCsv(whole));
    const ScanReport fromCsv = readReport(csv);
    EXPECT_EQ(wordColumnsOf(reportToCsv(fromCsv)), wordColumnsOf(reportToCsv(whole)));
    EXPECT_EQ(wordColumnsOf(reportToCsv(whole)).size(), 17u);
    EXPECT_EQ(rowOf(fromCsv, "ked-fault-skip").words.wordsOf(CoverageFinding::Kind::Skipped),
              std::vector<std::string>{"all"});

    const WordScoreCalibration supplied = readWordCalibration(json);
    EXPECT_TRUE(supplied.supplied);
    EXPECT_EQ(supplied.words, whole.wordCalibration->words);
    // Part 1 of 2 with the whole set's calibration: the same pronunciation suspects as the whole run.
    ScanRun part;
    for (const auto& row : whole.rows)
        if (Shard{1, 2}.holds(ScanItem{0, row.id, row.file, "", "", ""})) part.rows.push_back(row);
    part.total = part.rows.size();
    ASSERT_GT(part.rows.size(), 3u);
    ASSERT_LT(part.rows.size(), whole.rows.size());
    const ScanReport shard = makeReport(part, rules, supplied);
    ASSERT_TRUE(shard.wordCalibration && shard.wordCalibration->supplied);
    EXPECT_DOUBLE_EQ(shard.wordCalibration->medianScore, whole.wordCalibration->medianScore);
    for (const auto& row : shard.rows) {
        auto pronunciation = [](const ScanRow& r) {
            std::string out;
            for (const auto& s : r.suspects)
                if (s.kind == SuspectKind::Pronunciation) out += s.reason;
            return out;
        };
        EXPECT_EQ(pronunciation(row), pronunciation(rowOf(whole, row.id))) << row.id;
    }
    // Without it, the shard calibrates on its own words.
    const ScanReport own = makeReport(part, rules);
    ASSERT_FALSE(own.wordCalibration && own.wordCalibration->supplied);
}

TEST(WordChecksReport, SessionStoresTheWordSuspects) {
    const ScanReport& report = reportOf("slt");
    test::TempDir dir;
    const std::string path = (dir.path() / "s.earmark").string();
    writeScanSession(path, report, voiceSet("slt"));
    const Session session = Session::open(path);
    std::set<std::string> names;
    for (const Suspect& s : session.suspects()) names.insert(s.name);
    EXPECT_TRUE(names.count("skipped-word"));
    EXPECT_TRUE(names.count("early-end"));
}

TEST(WordChecksRun, TextWithoutAWordIsNotedInTheStatusAndOtherVoicesAreNotAligned) {
    const fs::path wav = test::festivalTakes() / "kal-01.wav";
    ScanSettings settings;
    const ScanRow noWord = scanTake(ScanItem{0, "a", wav.string(), " ... !! ", "", ""}, settings);
    EXPECT_FALSE(noWord.failed);
    EXPECT_FALSE(noWord.words.gathered());
    EXPECT_NE(noWord.status.find("words not checked"), std::string::npos) << noWord.status;
    const ScanRow german = scanTake(ScanItem{0, "b", wav.string(), "Guten Morgen", "", "de"}, settings);
    EXPECT_EQ(german.status, "ok");
    EXPECT_FALSE(german.words.gathered());
    settings.rules.skippedWord.enabled = settings.rules.repeatedWord.enabled = settings.rules.extraSpeech.enabled =
        settings.rules.substitutedWord.enabled = settings.rules.earlyEnd.enabled =
            settings.rules.pronunciation.enabled = false;
    EXPECT_FALSE(scanTake(ScanItem{0, "c", wav.string(), "Passengers", "", ""}, settings).words.gathered());
}

}  // namespace
}  // namespace earmark
