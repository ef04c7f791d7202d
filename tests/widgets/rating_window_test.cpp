// The rating mode: keyboard rating commits each trial at once, a rater
// resumes where they left off, nothing shown names a system or a file, and a
// MUSHRA trial stores one answer per take.
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/store/listening_store.hpp"
#include "earmark/widgets/rating_window.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <QAbstractButton>
#include <QLabel>
#include <QSignalSpy>
#include <QTest>

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

using listening::SystemRole;
using listening::TestKind;

struct RatingSession {
    test::TempDir dir;
    std::string file = dir.file("rate.earmark");
    RatingSession(TestKind kind, std::vector<std::pair<std::string, SystemRole>> systems) {
        listening::TestDesign d;
        d.name = "round";
        d.kind = kind;
        d.instructions = "Rate each sentence.";
        for (std::size_t s = 0; s < systems.size(); ++s) d.systems.push_back({systems[s].first, systems[s].second, "", 0, 0});
        for (const char* id : {"l1", "l2"}) {
            listening::Line line{id, "A short sentence.", {}};
            for (std::size_t s = 0; s < systems.size(); ++s) {
                const std::string path = dir.file(systems[s].first + "-" + id + ".wav");
                writeWav(path, test::sine(300.0 + 100.0 * s, 0.6, 16000, 0.1 * (s + 1)));
                line.audio.push_back(path);
            }
            d.lines.push_back(line);
        }
        d.plan.raters = 2;
        Session session = Session::create(file);
        ListeningStore(session).createTest(d);
    }
    std::vector<listening::Answer> answers() {
        Session session = Session::open(file, OpenMode::ReadOnly);
        return ListeningStore(session).answers("round");
    }
};

QStringList visibleTexts(const QWidget& w) {
    QStringList out;
    for (const QLabel* l : w.findChildren<QLabel*>()) out << l->text();
    for (const QAbstractButton* b : w.findChildren<QAbstractButton*>()) out << b->text();
    out << w.windowTitle();
    return out;
}

TEST(RatingWindow, KeyboardRatingCommitsAtOnceAndResumes) {
    RatingSession s(TestKind::Mos, {{"kestrel-build", SystemRole::Candidate}, {"plover-build", SystemRole::Candidate}});
    {
        RatingWindow w(QString::fromStdString(s.file), QStringLiteral("round"));
        w.show();
        ASSERT_TRUE(w.begin(QStringLiteral("ann")));
        EXPECT_EQ(w.trialsTotal(), 4);
        EXPECT_FALSE(w.next());  // nothing rated yet
        EXPECT_TRUE(w.statusText().contains(QStringLiteral("Rate every take")));
        QSignalSpy committed(&w, &RatingWindow::committed);
        QTest::keyClick(&w, Qt::Key_4);
        QTest::keyClick(&w, Qt::Key_Return);
        ASSERT_EQ(committed.count(), 1);
        const auto stored = s.answers();  // read through another connection: already on disk
        ASSERT_EQ(stored.size(), 1u);
        EXPECT_EQ(*stored[0].score, 4.0);
        EXPECT_EQ(stored[0].rater, "ann");
        for (const QString& text : visibleTexts(w)) {
            EXPECT_FALSE(text.contains(QStringLiteral("kestrel")) || text.contains(QStringLiteral("plover")) ||
                         text.contains(QStringLiteral(".wav")))
                << text.toStdString();
        }
    }
    RatingWindow again(QString::fromStdString(s.file), QStringLiteral("round"));
    again.show();
    ASSERT_TRUE(again.begin(QStringLiteral("ann")));
    EXPECT_EQ(again.trialsDone(), 1);
    QSignalSpy done(&again, &RatingWindow::allDone);
    for (int key : {Qt::Key_1, Qt::Key_2, Qt::Key_5}) {
        QTest::keyClick(&again, static_cast<Qt::Key>(key));
        QTest::keyClick(&again, Qt::Key_Return);
    }
    EXPECT_EQ(done.count(), 1);
    EXPECT_EQ(s.answers().size(), 4u);
    EXPECT_FALSE(again.next());  // nothing left
}

TEST(RatingWindow, MushraTrialStoresOneAnswerPerTake) {
    RatingSession s(TestKind::Mushra, {{"studio", SystemRole::Reference}, {"lp", SystemRole::LowAnchor},
                                       {"wren", SystemRole::Candidate}});
    RatingWindow w(QString::fromStdString(s.file), QStringLiteral("round"));
    w.show();
    ASSERT_TRUE(w.begin(QStringLiteral("bo")));
    w.rate(0, 100);
    w.rate(1, 20);
    EXPECT_FALSE(w.next());  // the third take is not rated yet
    w.rate(2, 65);
    ASSERT_TRUE(w.next()) << w.statusText().toStdString();
    EXPECT_EQ(s.answers().size(), 3u);
    EXPECT_EQ(w.trialsDone(), 1);
}

TEST(RatingWindow, AbKeyOnePrefersTheFirstTake) {
    RatingSession s(TestKind::Ab, {{"a", SystemRole::Candidate}, {"b", SystemRole::Candidate}});
    RatingWindow w(QString::fromStdString(s.file), QStringLiteral("round"));
    w.show();
    ASSERT_TRUE(w.begin(QStringLiteral("cy")));
    Session session = Session::open(s.file, OpenMode::ReadOnly);
    const auto plan = ListeningStore(session).plan("round");
    const auto& first = plan.raters[0].trials[0];
    const int heardFirst = first.stimuli[0].system;  // 0 = "a", 1 = "b"
    QTest::keyClick(&w, Qt::Key_1);
    QTest::keyClick(&w, Qt::Key_Return);
    const auto stored = s.answers();
    ASSERT_EQ(stored.size(), 1u);
    // Stored canonically as "a" against "b": +1 when "a" was the preferred (first) take.
    EXPECT_EQ(stored[0].system, "a");
    EXPECT_EQ(*stored[0].score, heardFirst == 0 ? 1.0 : -1.0);
}

TEST(RatingWindow, UnknownTestIsRefusedWithItsName) {
    RatingSession s(TestKind::Ab, {{"a", SystemRole::Candidate}, {"b", SystemRole::Candidate}});
    try {
        RatingWindow w(QString::fromStdString(s.file), QStringLiteral("nope"));
        FAIL() << "no error";
    } catch (const InputError& e) {
        EXPECT_NE(std::string(e.what()).find("no listening test named 'nope'"), std::string::npos);
    }
}

}  // namespace
}  // namespace earmark::widgets
