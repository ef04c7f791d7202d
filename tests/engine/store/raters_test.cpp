// Raters in the session store: who made each mark, status and tier change
// (review history), who reviewed which take, assignments, and the upgrade of
// a schema-3 session (made here with the schema-3 migration steps) that keeps
// every mark.
#include "earmark/core/error.hpp"
#include "earmark/store/session.hpp"
#include "store_test_util.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

namespace earmark {
namespace {

using ::testing::HasSubstr;
using test::draftAt;
using test::rawSql;
using test::TempDir;
using test::writeTake;

using Fixture = test::TwoTakeSession;
using test::Backend;

// The tests that hold for a session file and a server session alike.
class RatersStore : public test::OnBothBackends {};
INSTANTIATE_TEST_SUITE_P(Backends, RatersStore, ::testing::Values(Backend::File, Backend::Server), test::backendName);

TEST_P(RatersStore, EveryChangeIsRecordedWithItsRaterAndTime) {
    Fixture f(GetParam());
    f.session.setRater("ann");
    MarkDraft d = draftAt(0.5, 1.0);
    d.rater.clear();  // takes the session's rater
    const MarkEdit added = f.session.addMark(f.a, d);
    EXPECT_EQ(added.after->rater, "ann");
    f.session.setRater("bo");
    MarkDraft changed = added.after->draft();
    changed.note = "longer";
    f.session.updateMark(added.markId(), changed);
    f.session.setStatus(f.b, ReviewStatus::Clean);
    f.session.setTiers(f.b, {{"words", 0.0, 1.0, "text"}, {"words", 1.0, 2.0, "bee"}});
    f.session.deleteMark(added.markId());

    const auto h = f.session.history();
    ASSERT_EQ(h.size(), 7u);
    const std::vector<std::pair<HistoryAction, std::string>> expected{
        {HistoryAction::MarkAdded, "ann"},   {HistoryAction::Status, "ann"},       {HistoryAction::MarkChanged, "bo"},
        {HistoryAction::Status, "bo"},       {HistoryAction::Tiers, "bo"},         {HistoryAction::MarkDeleted, "bo"},
        {HistoryAction::Status, "bo"}};
    for (std::size_t i = 0; i < h.size(); ++i) {
        SCOPED_TRACE(i);
        EXPECT_EQ(h[i].action, expected[i].first);
        EXPECT_EQ(h[i].rater, expected[i].second);
        EXPECT_EQ(h[i].atUtc.size(), 24u);  // 2025-03-01T09:30:12.345Z
        if (i > 0) {
            EXPECT_GE(h[i].atUtc, h[i - 1].atUtc);
        }
    }
    EXPECT_EQ(h[0].markId, added.markId());
    EXPECT_EQ(h[0].detail, "timing/rushed 0.500-1.000 s");
    EXPECT_EQ(h[1].detail, "has-marks");  // adding the mark set the status
    EXPECT_EQ(h[3].detail, "clean");
    EXPECT_FALSE(h[3].markId.has_value());
    EXPECT_EQ(h[4].detail, "2 intervals");
    EXPECT_EQ(f.session.history(f.b).size(), 2u);
    EXPECT_EQ(f.session.take(f.b).statusRater, "bo");
    EXPECT_EQ(f.session.take(f.a).statusRater, "bo");  // deleting the last mark set it back to in-review
}

TEST_P(RatersStore, UndoAndRedoAreRecordedAsTheActingRater) {
    Fixture f(GetParam());
    f.session.setRater("ann");
    const MarkEdit added = f.session.addMark(f.a, draftAt(0.2, 0.4));
    f.session.setRater("cy");
    f.session.revert(added);
    f.session.apply(added);
    // added, has-marks; undone: deleted, in-review; redone: added, has-marks.
    const auto h = f.session.history(f.a);
    ASSERT_EQ(h.size(), 6u);
    EXPECT_EQ(h[2].action, HistoryAction::MarkDeleted);
    EXPECT_EQ(h[2].rater, "cy");
    EXPECT_EQ(h[4].action, HistoryAction::MarkAdded);
    EXPECT_EQ(h[4].rater, "cy");
    EXPECT_EQ(h[5].detail, "has-marks");
    EXPECT_EQ(f.session.mark(added.markId()).rater, "tester");  // the mark keeps who made it
}

TEST_P(RatersStore, ReviewersAreWhoMarkedOrJudgedATake) {
    Fixture f(GetParam());
    f.session.setRater("ann");
    f.session.addMark(f.a, draftAt(0.2, 0.4));  // draft's rater: "tester"
    f.session.setStatus(f.b, ReviewStatus::InReview);  // started, not judged
    f.session.setRater("bo");
    f.session.setStatus(f.b, ReviewStatus::Clean);
    f.session.setRater("cy");
    f.session.setStatus(f.b, ReviewStatus::Skipped);
    const auto r = f.session.reviewers();
    EXPECT_EQ(r.at(f.a), (std::set<std::string>{"ann", "tester"}));
    EXPECT_EQ(r.at(f.b), (std::set<std::string>{"bo"}));
}

TEST_P(RatersStore, AssignmentsReplaceAndRefuseBadRows) {
    Fixture f(GetParam());
    f.session.setAssignments({{f.b, "bo"}, {f.a, "bo"}, {f.a, "ann"}});
    EXPECT_EQ(f.session.assignments(), (std::vector<Assignment>{{f.a, "ann"}, {f.a, "bo"}, {f.b, "bo"}}));
    EXPECT_THROW(f.session.setAssignments({{f.a, "ann"}, {f.a, "ann"}}), ParamError);
    EXPECT_THROW(f.session.setAssignments({{f.a, ""}}), ParamError);
    EXPECT_THROW(f.session.setAssignments({{f.a, "ann"}, {999, "bo"}}), InputError);
    EXPECT_EQ(f.session.assignments().size(), 3u);  // a refused call changes nothing
    f.session.setAssignments({});
    EXPECT_TRUE(f.session.assignments().empty());
}

TEST_P(RatersStore, BadRaterNamesAreRefused) {
    Fixture f(GetParam());
    EXPECT_THROW(f.session.setRater(std::string(MarkDraft::kMaxRaterBytes + 1, 'x')), ParamError);
    EXPECT_THROW(f.session.setRater("tab\nnewline"), ParamError);
    EXPECT_THROW(f.session.setRater("\xff"), ParamError);
    EXPECT_EQ(f.session.rater(), "");
}

TEST(Raters, SchemaThreeSessionUpgradesAndKeepsEveryMark) {
    TempDir dir;
    const std::string file = dir.file("v3.earmark");
    createSessionAtSchemaVersion(file, 3);
    writeTake(dir.file("a.wav"), 2.0);
    writeTake(dir.file("b.wav"), 2.0);
    // Two takes and five marks, written as the schema-3 store writes them.
    rawSql(file,
           "INSERT INTO takes (queue_pos, audio_path, line_id, text, build, status, status_utc, duration_s, "
           "sample_rate, channels, added_utc) VALUES "
           "(0, 'a.wav', 'a', 'A.', 'v3', 'has-marks', '2026-01-01T00:00:00.000Z', 2.0, 16000, 1, '2026-01-01T00:00:00.000Z'),"
           "(1, 'b.wav', 'b', 'B.', 'v3', 'has-marks', '2026-01-01T00:00:01.000Z', 2.0, 16000, 1, '2026-01-01T00:00:00.000Z');"
           "INSERT INTO marks (take_id, category, subtype, severity, start_s, end_s, words, note, rater, "
           "created_utc, updated_utc, measures) VALUES "
           "(1, 'timing', 'rushed', 'major', 0.5, 1.25, 'w', 'one', 'ann', '2026-01-01T00:00:02.000Z', '2026-01-01T00:00:02.000Z', '{\"duration_s\":0.75}'),"
           "(1, 'artifact', 'click', 'minor', 0.1, 0.2, '', 'two', 'bo', '2026-01-01T00:00:03.000Z', '2026-01-01T00:00:03.000Z', '{}'),"
           "(2, 'intonation', 'flat', 'blocker', 0.0, 2.0, '', 'three', 'ann', '2026-01-01T00:00:04.000Z', '2026-01-01T00:00:05.000Z', '{\"f0_range_st\":1.5}'),"
           "(2, 'other', '', 'minor', 1.0, 1.5, '', 'four', '', '2026-01-01T00:00:06.000Z', '2026-01-01T00:00:06.000Z', '{}'),"
           "(2, 'emphasis', 'missing', 'major', 0.3, 0.9, '', 'five', 'bo', '2026-01-01T00:00:07.000Z', '2026-01-01T00:00:07.000Z', '{}');");
    std::vector<Mark> before;
    {
        // Read with the schema-3 columns before the upgrade (plain SQLite, as schema 3 stores them).
        sqlite3* db = nullptr;
        ASSERT_EQ(sqlite3_open(file.c_str(), &db), SQLITE_OK);
        sqlite3_stmt* st = nullptr;
        sqlite3_prepare_v2(db, "SELECT id, note, rater, start_s, end_s, updated_utc FROM marks ORDER BY id", -1, &st,
                           nullptr);
        while (sqlite3_step(st) == SQLITE_ROW) {
            Mark m;
            m.id = sqlite3_column_int64(st, 0);
            m.note = reinterpret_cast<const char*>(sqlite3_column_text(st, 1));
            m.rater = reinterpret_cast<const char*>(sqlite3_column_text(st, 2));
            m.startSeconds = sqlite3_column_double(st, 3);
            m.endSeconds = sqlite3_column_double(st, 4);
            m.updatedUtc = reinterpret_cast<const char*>(sqlite3_column_text(st, 5));
            before.push_back(m);
        }
        sqlite3_finalize(st);
        sqlite3_close(db);
    }
    ASSERT_EQ(before.size(), 5u);
    Session s = Session::open(file);
    std::vector<Mark> after = s.marks();
    ASSERT_EQ(after.size(), before.size());
    std::sort(after.begin(), after.end(), [](const Mark& x, const Mark& y) { return x.id < y.id; });
    for (std::size_t i = 0; i < after.size(); ++i) {
        SCOPED_TRACE(i);
        EXPECT_EQ(after[i].id, before[i].id);
        EXPECT_EQ(after[i].note, before[i].note);
        EXPECT_EQ(after[i].rater, before[i].rater);
        EXPECT_EQ(after[i].startSeconds, before[i].startSeconds);
        EXPECT_EQ(after[i].endSeconds, before[i].endSeconds);
        EXPECT_EQ(after[i].updatedUtc, before[i].updatedUtc);
    }
    EXPECT_EQ(after[2].measures.at("f0_range_st"), 1.5);
    EXPECT_TRUE(s.history().empty());
    EXPECT_EQ(s.take(1).statusRater, "");
    EXPECT_EQ(s.reviewers().at(1), (std::set<std::string>{"ann", "bo"}));  // from the marks' raters
    s.setRater("cy");
    s.setStatus(2, ReviewStatus::Clean);
    EXPECT_EQ(s.history().size(), 1u);
    EXPECT_EQ(s.integrityCheck(), "ok");
}

TEST(Raters, ASessionFromANewerSchemaIsRefused) {
    TempDir dir;
    const std::string file = dir.file("next.earmark");
    { Session::create(file); }
    rawSql(file, ("PRAGMA user_version = " + std::to_string(Session::kSchemaVersion + 1)).c_str());
    EXPECT_THAT([&] { Session::open(file); },
                ::testing::ThrowsMessage<InputError>(HasSubstr("was written by a newer Earmark (session schema 5")));
}

}  // namespace
}  // namespace earmark
