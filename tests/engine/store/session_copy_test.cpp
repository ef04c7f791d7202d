// Session::copy between an SQLite file and a PostgreSQL server: a round trip
// file → server → file keeps every row, id and counter, so the defect list
// exports byte for byte the same.
#include "earmark/core/error.hpp"
#include "earmark/export/defect_list.hpp"
#include "earmark/store/session.hpp"
#include "store_test_util.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

namespace earmark {
namespace {

using ::testing::HasSubstr;
using test::Backend;
using test::draftAt;

class SessionCopy : public ::testing::Test {
protected:
    void SetUp() override {
        std::string why;
        if (!test::PgTestServer::shared(&why)) GTEST_SKIP() << why;
    }
};

std::string csvOf(const Session& s) { return defectListToCsv(collectDefects(s)); }

// Everything a session holds that the public API shows, as one comparable text.
std::string contentOf(const Session& s) {
    std::string out;
    for (const Take& t : s.takes())
        out += std::to_string(t.id) + "|" + t.audioPath + "|" + t.lineId + "|" + t.text + "|" +
               std::string(reviewStatusName(t.status)) + "|" + t.statusUtc + "|" + t.statusRater + "|" +
               t.addedUtc + "|" + std::to_string(t.markCount) + "\n";
    for (const auto& h : s.history())
        out += std::to_string(h.id) + "|" + h.atUtc + "|" + h.rater + "|" + std::to_string(h.takeId) + "|" +
               (h.markId ? std::to_string(*h.markId) : "-") + "|" + h.detail + "\n";
    for (const auto& a : s.assignments()) out += std::to_string(a.takeId) + "|" + a.rater + "\n";
    for (const auto& x : s.suspects()) out += x.name + "|" + x.reason + "\n";
    return out;
}

TEST_F(SessionCopy, FileToServerToFileKeepsTheDefectListExactly) {
    test::TwoTakeSession f;
    Session& s = f.session;
    s.setRater("ann");
    s.setTiers(f.a, {{"words", 0.10, 0.40, "mind"}, {"words", 0.40, 1.20, "the gangway"}});
    MarkDraft d = draftAt(0.35, 0.90, MarkCategory::Intonation, "flat");
    d.note = "Tür – «no rise», 0.1+0.2";
    d.measures = {{"f0_mean_hz", 0.1 + 0.2}, {"tiny", 1e-300}, {"neg", -23.456789012345678}};
    s.addMark(f.a, d);
    const MarkId gone = s.addMark(f.b, draftAt(0.2, 0.4)).markId();
    s.addMark(f.b, draftAt(1.0, 2.5, MarkCategory::Timing, "pause-too-long"));
    s.deleteMark(gone);
    s.setStatus(f.a, ReviewStatus::HasMarks);
    s.replaceSuspects(f.b, {{0, 0, "pause_s", 1.5, 1.0, 0.9, 1.0, "long pause"}});
    s.setAssignments({{f.a, "ann"}, {f.b, "ann"}, {f.b, "bo"}});
    const MarkId highest = s.addMark(f.a, draftAt(1.5, 1.9)).markId();
    s.deleteMark(highest);  // the highest id handed out is no longer in the table

    auto* server = test::PgTestServer::shared(nullptr);
    const std::string remote = server->newDatabase();
    const auto counts = Session::copy(f.file, remote);
    EXPECT_EQ(counts.at("takes"), 2);
    EXPECT_EQ(counts.at("marks"), 2);
    EXPECT_EQ(counts.at("tier_intervals"), 2);
    EXPECT_EQ(counts.at("assignments"), 3);
    const std::string back = f.dir.file("back.earmark");
    Session::copy(remote, back);

    const std::string original = csvOf(s);
    ASSERT_THAT(original, HasSubstr("no rise"));
    {
        const Session onServer = Session::open(remote, OpenMode::ReadOnly);
        // The export shows the audio as stored: absolute on the server, so only the resolved paths compare.
        EXPECT_EQ(onServer.marks(), s.marks());
        EXPECT_EQ(contentOf(onServer), contentOf(s));
    }
    Session returned = Session::open(back);
    EXPECT_EQ(csvOf(returned), original);
    EXPECT_EQ(contentOf(returned), contentOf(s));
    EXPECT_EQ(returned.take(f.a).storedAudioPath, "takes/a.wav");  // relative to the file again
    EXPECT_EQ(returned.integrityCheck(), "ok");
    // Ids handed out stay handed out, on the server and back in a file.
    Session writable = Session::open(remote);
    EXPECT_GT(writable.addMark(f.a, draftAt(0.1, 0.2)).markId(), highest);
    EXPECT_GT(returned.addMark(f.a, draftAt(0.1, 0.2)).markId(), highest);
    // The target must be new.
    EXPECT_THROW(Session::copy(f.file, remote), InputError);
    EXPECT_THROW(Session::copy(remote, back), InputError);
}

}  // namespace
}  // namespace earmark
