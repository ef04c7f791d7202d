// Word evidence in the window, on takes rendered by Debian's festival voices
// (tests/data/evidence/render_festival_takes.py): with a planted changed
// vowel ("bread" said as "broad") the word tier marks "bread", the word
// inspector lists its phones, and the suspect lane names it; a clean take
// raises no suspect; a voice the model does not cover is said so quietly.
#include "earmark/widgets/elided_label.hpp"
#include "earmark/widgets/suspect_lane.hpp"
#include "earmark/widgets/tier_lane.hpp"
#include "earmark/widgets/view_state.hpp"
#include "earmark/widgets/word_evidence_panel.hpp"
#include "main_window.hpp"
#include "support/festival_takes.hpp"

#include <QLabel>
#include <QSignalSpy>
#include <QStatusBar>
#include <QTableWidget>
#include <QTest>

#include <algorithm>

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

namespace fs = std::filesystem;

struct EvidenceWindow : ::testing::Test {
    gui::MainWindow window;

    void SetUp() override {
        window.resize(1400, 900);
        window.show();
    }
    // Opens a rendered take with its script; true when its evidence is shown.
    bool open(const std::string& name) {
        const fs::path wav = test::festivalTakes() / name;
        QSignalSpy settled(&window, &gui::MainWindow::evidenceSettled);
        window.openTakes({TakeEntry{QString::fromStdString(name), QString::fromStdString(wav.string()),
                                    QString::fromStdString(test::firstLine(fs::path(wav).replace_extension(".txt")))}});
        return settled.wait(60000) && settled.last().at(0).toBool();
    }
};

TEST_F(EvidenceWindow, ChangedVowelStandsOutInTierInspectorAndSuspects) {
    ASSERT_TRUE(open("slt-fault-vowel.wav"));
    TierLane* words = window.tierLane("words");
    ASSERT_NE(words, nullptr);
    const auto& marks = words->scoreMarks();
    const auto bread = std::find_if(marks.begin(), marks.end(), [](const WordScoreMark& m) { return m.label == "bread"; });
    ASSERT_NE(bread, marks.end());
    EXPECT_NE(bread->cls, WordScoreClass::Good);
    // Every other word is drawn too, and most of them are good.
    EXPECT_GT(std::count_if(marks.begin(), marks.end(), [](const WordScoreMark& m) { return m.cls == WordScoreClass::Good; }), 6);

    const auto& suspects = window.suspectLane()->suspects();
    EXPECT_TRUE(std::any_of(suspects.begin(), suspects.end(),
                            [](const Suspect& s) { return s.reason.find("'bread'") != std::string::npos; }));

    // The inspector follows the cursor: on "bread", then on a spoken word with its phone rows.
    window.viewState()->setCursor(0.5 * (bread->startS + bread->endS));
    EXPECT_NE(window.wordPanel()->headerText().indexOf("bread"), -1);
    const auto fresh = std::find_if(marks.begin(), marks.end(), [](const WordScoreMark& m) { return m.label == "fresh"; });
    ASSERT_NE(fresh, marks.end());
    window.viewState()->setCursor(0.5 * (fresh->startS + fresh->endS));
    EXPECT_NE(window.wordPanel()->headerText().indexOf("fresh"), -1);
    EXPECT_GE(window.wordPanel()->table()->rowCount(), 4);  // F R EH SH
    EXPECT_NE(window.wordPanel()->rowsText().indexOf("SH"), -1) << window.wordPanel()->rowsText().toStdString();
}

TEST_F(EvidenceWindow, CleanTakeRaisesNoSuspect) {
    ASSERT_TRUE(open("slt-00.wav"));
    EXPECT_TRUE(window.suspectLane()->suspects().empty());
    EXPECT_FALSE(window.tierLane("words")->scoreMarks().empty());
    EXPECT_FALSE(window.currentTiers().find(kWordsTier)->intervals.empty());  // the model's tier, for a take without one
}

TEST_F(EvidenceWindow, VoiceTheModelDoesNotCoverIsSaidQuietly) {
    window.setVoice("de");
    EXPECT_FALSE(open("slt-00.wav"));
    EXPECT_TRUE(window.tierLane("words")->scoreMarks().empty());
    EXPECT_NE(window.wordPanel()->headerText().indexOf("does not cover"), -1);
    const auto* message = window.statusBar()->findChild<ElidedLabel*>("statusMessage");
    ASSERT_NE(message, nullptr);
    EXPECT_TRUE(message->text().contains("does not cover"));
}

}  // namespace
}  // namespace earmark::widgets
