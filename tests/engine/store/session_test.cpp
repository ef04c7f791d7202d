// The session store: takes, queue, statuses, tiers, marks with undo/redo,
// suspects, and two connections on one file.
#include "earmark/core/error.hpp"
#include "earmark/store/session.hpp"
#include "store_test_util.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <filesystem>
#include <regex>

namespace earmark {
namespace {

namespace fs = std::filesystem;
using ::testing::ElementsAre;
using ::testing::HasSubstr;
using test::draftAt;
using test::TempDir;
using test::writeTake;

using Fixture = test::TwoTakeSession;
using test::Backend;

// The tests that hold for a session file and a server session alike.
class SessionStore : public test::OnBothBackends {};
INSTANTIATE_TEST_SUITE_P(Backends, SessionStore, ::testing::Values(Backend::File, Backend::Server), test::backendName);

TEST(Session, CreateRefusesAnExistingFile) {
    TempDir dir;
    Session::create(dir.file("s.earmark"));
    try {
        Session::create(dir.file("s.earmark"));
        FAIL() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_THAT(e.what(), HasSubstr("s.earmark: already exists"));
    }
}

TEST(Session, TakesKeepQueueOrderAndPathsRelativeToTheSession) {
    Fixture f;
    const auto takes = f.session.takes();
    ASSERT_EQ(takes.size(), 2u);
    EXPECT_EQ(takes[0].storedAudioPath, "takes/a.wav");
    EXPECT_EQ(takes[0].audioPath, (f.dir.path() / "takes/a.wav").string());
    EXPECT_EQ(takes[0].lineId, "line-a");
    EXPECT_EQ(takes[1].text, "Text B?");
    EXPECT_EQ(takes[1].build, "b1");
    EXPECT_NEAR(takes[1].durationSeconds, 3.0, 1e-9);
    EXPECT_EQ(takes[1].sampleRate, 16000);
    EXPECT_EQ(takes[0].status, ReviewStatus::Unreviewed);
    EXPECT_TRUE(std::regex_match(takes[0].addedUtc, std::regex(R"(\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z)")));

    EXPECT_THAT(f.session.setQueueOrder({f.b, f.a}), ElementsAre(f.a, f.b));
    EXPECT_EQ(f.session.takes()[0].id, f.b);
    EXPECT_THROW(f.session.setQueueOrder({f.b}), ParamError);
}

TEST_P(SessionStore, RefusesTheSameAudioTwiceAndAddsNothing) {
    Fixture f(GetParam());
    const std::string c = writeTake(f.dir.file("takes/c.wav"));
    EXPECT_THROW(f.session.addTakes({{c, "", "", ""}, {f.dir.file("takes/a.wav"), "", "", ""}}), InputError);
    EXPECT_EQ(f.session.takes().size(), 2u);  // c was not added either: one transaction
    EXPECT_THROW(f.session.addTakes({{c, "", "", ""}, {c, "", "", ""}}), InputError);
    EXPECT_THROW(f.session.addTakes({{f.dir.file("takes/none.wav"), "", "", ""}}), InputError);
    EXPECT_THROW(f.session.addTakes({{c, "", "bad \xFF text", ""}}), ParamError);
}

TEST_P(SessionStore, FindsTakesByIdLineIdOrFileName) {
    Fixture f(GetParam());
    EXPECT_EQ(f.session.findTake(std::to_string(f.b)), f.b);
    EXPECT_EQ(f.session.findTake("line-a"), f.a);
    EXPECT_EQ(f.session.findTake("b.wav"), f.b);
    EXPECT_EQ(f.session.findTake("takes/b.wav"), f.b);
    EXPECT_FALSE(f.session.findTake("nothing.wav"));
    // Same file name in two folders: ambiguous, so the caller must use the id.
    fs::create_directories(f.dir.path() / "other");
    f.session.addTakes({{writeTake(f.dir.file("other/a.wav")), "", "", ""}});
    try {
        f.session.findTake("a.wav");
        FAIL() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_THAT(e.what(), HasSubstr("matches several takes"));
    }
}

TEST(Session, PathsWithSpacesAndNonAsciiLetters) {
    TempDir dir;
    const fs::path folder = dir.path() / "Sessions d'été" / "Über Aufnahmen";
    fs::create_directories(folder / "takes ü");
    const std::string file = (folder / "Prüfung 1.earmark").string();
    const std::string audio = writeTake((folder / "takes ü" / "Ansage Nr. 3 – ß.wav").string());
    {
        Session s = Session::create(file);
        s.addTakes({{audio, "ansage-3", "Bitte einsteigen – Türen schließen.", "Stimme Ä"}});
        s.addMark(s.takes()[0].id, draftAt(0.1, 0.5));
    }
    const Session s = Session::open(file, OpenMode::ReadOnly);
    const Take t = s.takes().at(0);
    EXPECT_EQ(t.storedAudioPath, "takes ü/Ansage Nr. 3 – ß.wav");
    EXPECT_TRUE(s.audioExists(t.id));
    EXPECT_EQ(s.findTake("Ansage Nr. 3 – ß.wav"), t.id);
    EXPECT_EQ(t.text, "Bitte einsteigen – Türen schließen.");
    EXPECT_EQ(s.marks().size(), 1u);
}

TEST(Session, MovedFolderKeepsWorkingAndMissingAudioCanBeRelocated) {
    TempDir dir;
    fs::create_directories(dir.path() / "one/takes");
    const std::string audio = writeTake(dir.file("one/takes/x.wav"), 2.0);
    MarkId mark = 0;
    {
        Session s = Session::create(dir.file("one/s.earmark"));
        const TakeId id = s.addTakes({{audio, "x", "", ""}})[0];
        mark = s.addMark(id, draftAt(0.2, 1.8)).markId();
    }
    // The session and its audio move together: relative paths still resolve.
    fs::rename(dir.path() / "one", dir.path() / "two");
    {
        Session s = Session::open(dir.file("two/s.earmark"));
        EXPECT_TRUE(s.audioExists(s.takes()[0].id));
    }
    // Only the audio moves: the take shows as missing, its marks stay.
    fs::create_directories(dir.path() / "elsewhere");
    fs::rename(dir.path() / "two/takes/x.wav", dir.path() / "elsewhere/x.wav");
    Session s = Session::open(dir.file("two/s.earmark"));
    const TakeId id = s.takes()[0].id;
    EXPECT_FALSE(s.audioExists(id));
    EXPECT_EQ(s.take(id).markCount, 1);
    EXPECT_EQ(s.mark(mark).endSeconds, 1.8);
    EXPECT_EQ(s.relocateMissingTakes(dir.file("elsewhere")), 1);
    EXPECT_TRUE(s.audioExists(id));
    EXPECT_EQ(s.take(id).storedAudioPath, "../elsewhere/x.wav");
    EXPECT_EQ(s.marks().size(), 1u);
    // A file shorter than the take's marks is refused; the take stays as it was.
    const std::string shortFile = writeTake(dir.file("elsewhere/short.wav"), 1.0);
    EXPECT_THROW(s.relocateTake(id, shortFile), InputError);
    EXPECT_EQ(s.take(id).storedAudioPath, "../elsewhere/x.wav");
    const std::string longer = writeTake(dir.file("two/takes/x2.wav"), 2.5);
    EXPECT_EQ(s.relocateTake(id, longer), "../elsewhere/x.wav");
    EXPECT_NEAR(s.take(id).durationSeconds, 2.5, 1e-9);
}

TEST_P(SessionStore, TiersRoundTripAndFillTheWordsOfMarks) {
    Fixture f(GetParam());
    const std::vector<TierRow> rows = {{"words", 0.10, 0.40, "mind"}, {"words", 0.40, 0.55, "the"},
                                       {"words", 0.55, 1.20, "gangway"}, {"phones", 0.10, 0.20, "m"}};
    EXPECT_TRUE(f.session.setTiers(f.a, rows).empty());
    const auto stored = f.session.tiers(f.a);
    ASSERT_EQ(stored.size(), 4u);
    EXPECT_EQ(stored[0], (TierRow{"phones", 0.10, 0.20, "m"}));  // by tier name, then given order
    EXPECT_EQ(stored[3], (TierRow{"words", 0.55, 1.20, "gangway"}));

    MarkDraft d = draftAt(0.35, 0.90);
    d.words = "ignored when a word tier exists";
    const Mark m = *f.session.addMark(f.a, d).after;
    EXPECT_EQ(m.words, "the gangway");  // middles at 0.475 and 0.875 lie inside
    const Mark inside = *f.session.addMark(f.a, draftAt(0.6, 0.7)).after;
    EXPECT_EQ(inside.words, "gangway");  // inside one word
    // Without a word tier the draft's words are kept.
    d.words = "typed by hand";
    EXPECT_EQ(f.session.addMark(f.b, d).after->words, "typed by hand");
    EXPECT_THROW(f.session.setTiers(f.a, {{"words", 0.5, 0.4, "x"}}), ParamError);
}

TEST_P(SessionStore, MarkEditsUndoAndRedoExactly) {
    Fixture f(GetParam());
    const MarkEdit added = f.session.addMark(f.a, draftAt(0.5, 1.0));
    ASSERT_TRUE(added.after);
    const MarkId id = added.markId();
    EXPECT_FALSE(added.before);
    EXPECT_EQ(added.statusBefore, ReviewStatus::Unreviewed);
    EXPECT_EQ(added.statusAfter, ReviewStatus::HasMarks);
    EXPECT_EQ(f.session.take(f.a).status, ReviewStatus::HasMarks);
    EXPECT_EQ(f.session.mark(id), *added.after);

    MarkDraft changed = draftAt(0.6, 1.2, MarkCategory::Intonation, "flat");
    changed.note = "flatter than the rest";
    const MarkEdit updated = f.session.updateMark(id, changed);
    EXPECT_EQ(*updated.before, *added.after);
    EXPECT_EQ(updated.after->createdUtc, added.after->createdUtc);
    EXPECT_EQ(f.session.mark(id).note, "flatter than the rest");

    const MarkEdit deleted = f.session.deleteMark(id);
    EXPECT_EQ(*deleted.before, *updated.after);
    EXPECT_TRUE(f.session.marks().empty());
    EXPECT_EQ(deleted.statusAfter, ReviewStatus::InReview);  // its last mark is gone
    EXPECT_THROW(f.session.mark(id), InputError);

    // Undo all three, newest first, then redo them.
    f.session.revert(deleted);
    EXPECT_EQ(f.session.mark(id), *updated.after);  // same id, same times of change
    EXPECT_EQ(f.session.take(f.a).status, ReviewStatus::HasMarks);
    f.session.revert(updated);
    EXPECT_EQ(f.session.mark(id), *added.after);
    f.session.revert(added);
    EXPECT_TRUE(f.session.marks().empty());
    EXPECT_EQ(f.session.take(f.a).status, ReviewStatus::Unreviewed);
    f.session.apply(added);
    f.session.apply(updated);
    EXPECT_EQ(f.session.mark(id), *updated.after);
    f.session.apply(deleted);
    EXPECT_TRUE(f.session.marks().empty());

    // Ids are never reused, so undo can always put a mark back under its own id.
    const MarkId next = f.session.addMark(f.a, draftAt(0.1, 0.2)).markId();
    EXPECT_GT(next, id);
}

TEST_P(SessionStore, UndoRefusesWhenTheMarkChangedElsewhere) {
    Fixture f(GetParam());
    const MarkEdit added = f.session.addMark(f.a, draftAt(0.5, 1.0));
    Session other = Session::open(f.file);
    other.updateMark(added.markId(), draftAt(0.5, 1.5));
    try {
        f.session.revert(added);
        FAIL() << "expected Error";
    } catch (const Error& e) {
        EXPECT_THAT(e.what(), HasSubstr("was changed elsewhere"));
    }
    EXPECT_EQ(f.session.mark(added.markId()).endSeconds, 1.5);
}

TEST_P(SessionStore, StatusRulesOnlyTouchWhatAMarkImplies) {
    Fixture f(GetParam());
    EXPECT_EQ(f.session.setStatus(f.b, ReviewStatus::Skipped), ReviewStatus::Unreviewed);
    const MarkEdit e = f.session.addMark(f.b, draftAt(0.5, 1.0));
    EXPECT_EQ(f.session.take(f.b).status, ReviewStatus::HasMarks);
    f.session.setStatus(f.b, ReviewStatus::Clean);  // the rater decided otherwise later
    f.session.revert(e);
    EXPECT_EQ(f.session.take(f.b).status, ReviewStatus::Clean);  // a later choice is kept
    EXPECT_FALSE(f.session.take(f.b).statusUtc.empty());
}

TEST_P(SessionStore, MarksAreValidatedAgainstTheirTake) {
    Fixture f(GetParam());
    EXPECT_THROW(f.session.addMark(f.a, draftAt(1.5, 2.5)), ParamError);  // take a lasts 2 s
    EXPECT_NO_THROW(f.session.addMark(f.b, draftAt(1.5, 2.5)));           // take b lasts 3 s
    EXPECT_THROW(f.session.addMark(999, draftAt(0.1, 0.2)), InputError);
    EXPECT_THROW(f.session.deleteMark(999), InputError);
    MarkDraft d = draftAt(0.1, 0.2);
    d.note = "\xC3\x28";
    EXPECT_THROW(f.session.addMark(f.a, d), ParamError);
    EXPECT_EQ(f.session.marks().size(), 1u);
}

TEST_P(SessionStore, MarksComeInQueueOrderThenTime) {
    Fixture f(GetParam());
    const MarkId m1 = f.session.addMark(f.a, draftAt(1.0, 1.5)).markId();
    const MarkId m2 = f.session.addMark(f.b, draftAt(0.2, 0.5)).markId();
    const MarkId m3 = f.session.addMark(f.a, draftAt(0.1, 0.3)).markId();
    auto ids = [](const std::vector<Mark>& marks) {
        std::vector<MarkId> out;
        for (const Mark& m : marks) out.push_back(m.id);
        return out;
    };
    EXPECT_THAT(ids(f.session.marks()), ElementsAre(m3, m1, m2));
    f.session.setQueueOrder({f.b, f.a});
    EXPECT_THAT(ids(f.session.marks()), ElementsAre(m2, m3, m1));
    EXPECT_THAT(ids(f.session.marks(f.a)), ElementsAre(m3, m1));
    EXPECT_EQ(f.session.takes()[1].markCount, 2);
}

TEST_P(SessionStore, MeasuresRoundTripBitExactly) {
    Fixture f(GetParam());
    MarkDraft d = draftAt(0.1, 0.7);
    d.measures = {{"f0_mean_hz", 0.1 + 0.2}, {"energy_mean_db", -23.456789012345678}, {"tiny", 1e-300}};
    const MarkId id = f.session.addMark(f.a, d).markId();
    const Session other = Session::open(f.file, OpenMode::ReadOnly);
    EXPECT_EQ(other.mark(id).measures, d.measures);
    EXPECT_EQ(other.mark(id).startSeconds, 0.1);
}

TEST_P(SessionStore, SuspectsAreReplacedPerTake) {
    Fixture f(GetParam());
    f.session.replaceSuspects(f.a, {{0, 0, "f0_range_st", 0.5, 2.0, 0.2, 1.8, "flat: 0.5 st"},
                                    {0, 0, "pause_s", 1.5, 1.0, 0.9, 1.0, "long pause"}});
    f.session.replaceSuspects(f.b, {{0, 0, "clipped", 120, 0, 0, 3.0, "clipping"}});
    ASSERT_EQ(f.session.suspects(f.a).size(), 2u);
    EXPECT_EQ(f.session.suspects(f.a)[0].name, "f0_range_st");  // by start time
    EXPECT_EQ(f.session.suspects(f.a)[1].reason, "long pause");
    EXPECT_EQ(f.session.suspects().size(), 3u);
    f.session.replaceSuspects(f.a, {});
    EXPECT_TRUE(f.session.suspects(f.a).empty());
    EXPECT_THROW(f.session.replaceSuspects(f.a, {{0, 0, "x", 1, 1, 2.0, 1.0, ""}}), ParamError);
}

TEST_P(SessionStore, SecondConnectionSeesEveryCommittedChangeAtOnce) {
    Fixture f(GetParam());
    const Session reader = Session::open(f.file, OpenMode::ReadOnly);
    EXPECT_TRUE(reader.marks().empty());
    const MarkId id = f.session.addMark(f.a, draftAt(0.5, 1.0)).markId();
    EXPECT_EQ(reader.marks().size(), 1u);  // no save step: the change is already in the file
    f.session.deleteMark(id);
    EXPECT_TRUE(reader.marks().empty());
}

TEST_P(SessionStore, ReadOnlySessionRefusesChanges) {
    Fixture f(GetParam());
    const MarkId id = f.session.addMark(f.a, draftAt(0.5, 1.0)).markId();
    Session reader = Session::open(f.file, OpenMode::ReadOnly);
    EXPECT_TRUE(reader.readOnly());
    try {
        reader.deleteMark(id);
        FAIL() << "expected Error";
    } catch (const Error& e) {
        EXPECT_THAT(e.what(), HasSubstr("is open read-only"));
    }
    EXPECT_EQ(reader.marks().size(), 1u);
    EXPECT_EQ(reader.integrityCheck(), "ok");
}

TEST(Session, ClosingTheLastConnectionLeavesOneFile) {
    Fixture f;
    f.session.addMark(f.a, draftAt(0.5, 1.0));
    { Session reader = Session::open(f.file, OpenMode::ReadOnly); }
    f.session = Session::open(f.file);  // closes the first connection
    f.session = Session::create(f.dir.file("other.earmark"));
    EXPECT_FALSE(fs::exists(f.file + "-wal"));
    EXPECT_FALSE(fs::exists(f.file + "-shm"));
}

}  // namespace
}  // namespace earmark
