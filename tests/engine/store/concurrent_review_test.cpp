// Two raters on one session at once: a change based on a stale read of a
// mark is refused (no lost update), and each connection can list what the
// others changed since it last looked. Both backends.
#include "earmark/core/error.hpp"
#include "earmark/store/session.hpp"
#include "store_test_util.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

namespace earmark {
namespace {

using ::testing::HasSubstr;
using test::Backend;
using test::draftAt;

class ConcurrentReview : public test::OnBothBackends {};
INSTANTIATE_TEST_SUITE_P(Backends, ConcurrentReview, ::testing::Values(Backend::File, Backend::Server),
                         test::backendName);

// The message of the ConflictError that `change` throws ("" when it throws none).
template <typename F>
std::string conflictMessage(F&& change) {
    try {
        change();
    } catch (const ConflictError& e) {
        return e.what();
    }
    return "";
}

TEST_P(ConcurrentReview, ChangeBasedOnAStaleReadIsRefusedAndNamesWhoChangedTheMark) {
    test::TwoTakeSession f(GetParam());
    f.session.setRater("ann");
    const MarkId id = f.session.addMark(f.a, draftAt(0.5, 1.0)).markId();
    const Mark annRead = f.session.mark(id);  // what ann's window shows while she edits

    Session ben = Session::open(f.file);
    ben.setRater("ben");
    ben.updateMark(ben.mark(id), draftAt(0.5, 1.5));

    MarkDraft annDraft = draftAt(0.5, 1.0);
    annDraft.note = "ann's note";
    const std::string refused = conflictMessage([&] { f.session.updateMark(annRead, annDraft); });
    EXPECT_THAT(refused, HasSubstr("mark " + std::to_string(id) + " was changed by ben at "));
    EXPECT_THAT(refused, HasSubstr("1.500 s"));  // what the mark is now
    EXPECT_THAT(refused, HasSubstr("nothing was changed"));
    EXPECT_EQ(f.session.mark(id).endSeconds, 1.5);  // ben's change stands
    EXPECT_EQ(f.session.mark(id).note, "note");
    EXPECT_NE(conflictMessage([&] { f.session.deleteMark(annRead); }), "");
    EXPECT_EQ(f.session.marks().size(), 1u);

    // Read again, the same change goes through.
    const MarkEdit applied = f.session.updateMark(f.session.mark(id), annDraft);
    EXPECT_EQ(f.session.mark(id).note, "ann's note");

    // A mark deleted elsewhere: refused, and the message says so.
    ben.deleteMark(ben.mark(id));
    const std::string gone = conflictMessage([&] { f.session.updateMark(*applied.after, draftAt(0.5, 1.2)); });
    EXPECT_THAT(gone, HasSubstr("was deleted by ben at "));
    EXPECT_TRUE(f.session.marks().empty());  // nothing came back
}

TEST_P(ConcurrentReview, EachConnectionListsWhatTheOthersChanged) {
    test::TwoTakeSession f(GetParam());
    f.session.setRater("ann");
    const std::int64_t start = f.session.lastChangeId();
    const MarkId own = f.session.addMark(f.a, draftAt(0.2, 0.4)).markId();

    Session ben = Session::open(f.file);
    ben.setRater("ben");
    const MarkId bens = ben.addMark(f.b, draftAt(1.0, 1.5)).markId();
    ben.setStatus(f.a, ReviewStatus::Clean);
    ben.setTiers(f.b, {{"words", 0.0, 0.5, "one"}, {"words", 0.5, 1.0, "two"}});

    // Everything, in commit order (a first mark also sets its take to has-marks);
    // the other connection's changes without ann's own.
    const auto all = f.session.changesSince(start);
    ASSERT_EQ(all.size(), 6u);
    EXPECT_EQ(all[0].markId, own);
    EXPECT_EQ(f.session.lastChangeId(), all.back().id);
    const auto elsewhere = f.session.changesElsewhereSince(start);
    ASSERT_EQ(elsewhere.size(), 4u);
    EXPECT_EQ(elsewhere[0].action, HistoryAction::MarkAdded);
    EXPECT_EQ(elsewhere[0].markId, bens);
    EXPECT_EQ(elsewhere[0].takeId, f.b);
    EXPECT_EQ(elsewhere[1].action, HistoryAction::Status);
    EXPECT_EQ(elsewhere[1].detail, "has-marks");
    EXPECT_EQ(elsewhere[2].action, HistoryAction::Status);
    EXPECT_EQ(elsewhere[2].takeId, f.a);
    EXPECT_EQ(elsewhere[2].detail, "clean");
    EXPECT_EQ(elsewhere[3].action, HistoryAction::Tiers);
    for (const HistoryEntry& e : elsewhere) EXPECT_EQ(e.rater, "ben");
    // For ben, only ann's mark (and the status it set) were made elsewhere.
    const auto forBen = ben.changesElsewhereSince(start);
    ASSERT_EQ(forBen.size(), 2u);
    EXPECT_EQ(forBen[0].markId, own);
    EXPECT_EQ(forBen[1].rater, "ann");
    EXPECT_TRUE(f.session.changesSince(f.session.lastChangeId()).empty());
}

}  // namespace
}  // namespace earmark
