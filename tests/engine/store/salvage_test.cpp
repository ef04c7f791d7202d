// A damaged session (issue 11, item 2): opening it for writing is refused,
// naming the file and the way out, and Session::salvage copies every row that
// can still be read into a new session, unchanged and under the same ids.
#include "damage.hpp"
#include "earmark/core/error.hpp"
#include "earmark/store/session.hpp"
#include "store_test_util.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <map>

namespace earmark {
namespace {

using ::testing::HasSubstr;
using test::draftAt;
using test::TempDir;
using test::writeTake;

struct DamagedSession {
    TempDir dir;
    std::string file = dir.file("damaged.earmark");
    std::vector<Mark> marks;
    std::vector<TierRow> tiers = {{"words", 0.1, 0.6, "all"}, {"words", 0.6, 1.2, "aboard"}, {"phones", 0.1, 0.3, "ɔ"}};
    std::vector<Suspect> suspects;
    DamagedSession() {
        Session s = Session::create(file);
        const auto ids = s.addTakes({{writeTake(dir.file("a.wav"), 3.0), "a", "All aboard.", "b1"},
                                     {writeTake(dir.file("b.wav"), 2.0), "b", "", "b1"}});
        s.inOneTransaction("filling", [&] {
            s.setTiers(ids[0], tiers);
            s.replaceSuspects(ids[1], {{0, 0, "flat", 1.2, 2.0, 0.0, 2.0, "F0 range 1.2 st"}});
            // Enough marks with long notes to fill several pages of the marks table.
            for (int i = 0; i < 300; ++i) {
                MarkDraft d = draftAt(0.005 * i, 0.005 * i + 0.4);
                d.note = "note " + std::to_string(i) + std::string(120, 'x');
                s.addMark(ids[i % 2], d);
            }
        });
        marks = s.marks();
        suspects = s.suspects();
        tiers = s.tiers(ids[0]);  // in the order the store gives them back
    }
};

TEST(Salvage, WritingToADamagedSessionIsRefusedNamingTheFileAndTheWayOut) {
    DamagedSession d;
    test::damageFirstLeafOf(d.file, "marks");
    const std::string bytes = test::slurp(d.file);
    try {
        Session::open(d.file);
        FAIL() << "a damaged session was opened for writing";
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), d.file);
        EXPECT_THAT(e.problem(), HasSubstr("is damaged"));
        EXPECT_THAT(e.problem(), HasSubstr("session salvage"));
    }
    EXPECT_EQ(test::slurp(d.file), bytes);  // refused before anything was written
}

TEST(Salvage, CopiesEveryReadableRowUnderItsOwnId) {
    DamagedSession d;
    test::damageFirstLeafOf(d.file, "marks");
    const std::string bytes = test::slurp(d.file);
    const std::string fresh = d.dir.file("salvaged.earmark");
    const Session::SalvageReport r = Session::salvage(d.file, fresh);
    EXPECT_EQ(test::slurp(d.file), bytes);  // the damaged file is only read
    EXPECT_EQ(r.takes, 2);
    EXPECT_EQ(r.tierIntervals, 3);
    EXPECT_EQ(r.suspects, 1);
    // One leaf page lost: some marks, not all, and every lost id reported
    // (the marks' index still lists them).
    EXPECT_GT(r.marks, 150);
    EXPECT_LT(r.marks, 300);
    EXPECT_EQ(r.marks + r.marksUnreadable, 300);

    Session s = Session::open(fresh);
    EXPECT_EQ(s.integrityCheck(), "ok");
    EXPECT_EQ(s.tiers(1), d.tiers);
    ASSERT_EQ(s.suspects().size(), 1u);
    EXPECT_EQ(s.suspects()[0].name, "flat");
    std::map<MarkId, Mark> original;
    for (const Mark& m : d.marks) original[m.id] = m;
    const auto copied = s.marks();
    ASSERT_EQ(copied.size(), static_cast<std::size_t>(r.marks));
    for (const Mark& m : copied) EXPECT_EQ(m, original.at(m.id)) << "mark " << m.id;
    EXPECT_EQ(s.take(1).status, ReviewStatus::HasMarks);
    // Ids handed out in the damaged file are not handed out again.
    EXPECT_GT(s.addMark(1, draftAt(0.1, 0.2)).markId(), 300);
    // Salvage never overwrites.
    EXPECT_THROW(Session::salvage(d.file, fresh), InputError);
}

TEST(Salvage, AnUndamagedSessionIsCopiedWhole) {
    DamagedSession d;
    const std::string fresh = d.dir.file("copy.earmark");
    const auto r = Session::salvage(d.file, fresh);
    EXPECT_EQ(r.marks, 300);
    EXPECT_EQ(r.marksUnreadable, 0);
    EXPECT_EQ(Session::open(fresh, OpenMode::ReadOnly).marks(), d.marks);
}

}  // namespace
}  // namespace earmark
