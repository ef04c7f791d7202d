// Listening tests in the session file: the recorded plan, raters bound to
// slots, answers committed one trial at a time (surviving a killed process),
// imports that land whole or not at all, and upgrades of older sessions.
#include "earmark/core/error.hpp"
#include "earmark/store/listening_store.hpp"
#include "earmark/store/session.hpp"
#include "store_test_util.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <csignal>

namespace earmark {
namespace {

using ::testing::HasSubstr;
using listening::SystemRole;
using listening::TestKind;
using test::Backend;
using test::TempDir;

class ListeningOnBoth : public test::OnBothBackends {};
INSTANTIATE_TEST_SUITE_P(Backends, ListeningOnBoth, ::testing::Values(Backend::File, Backend::Server),
                         test::backendName);

listening::TestDesign mosDesign(int raters = 2) {
    listening::TestDesign d;
    d.name = "round-1";
    d.kind = TestKind::Mos;
    d.systems = {{"north", SystemRole::Candidate, "", 0, 0}, {"south", SystemRole::Candidate, "", 0, 0}};
    for (const char* id : {"l1", "l2", "l3"}) d.lines.push_back({id, "text", {"n.wav", "s.wav"}});
    d.plan.raters = raters;
    d.plan.repeatsPerRater = 1;
    d.plan.seed = 5;
    return d;
}

std::string planSignature(const listening::Plan& p) {
    std::string out;
    for (const auto& rp : p.raters)
        for (const auto& t : rp.trials) {
            out += std::to_string(t.line);
            out += listening::trialKindName(t.kind);
            out += std::to_string(t.repeatOf);
            for (const auto& s : t.stimuli) {
                out += std::to_string(s.system);
                out += s.label;
            }
            out += ';';
        }
    return out;
}

TEST_P(ListeningOnBoth, RecordsThePlanAndBindsRatersToSlots) {
    TempDir dir;
    Session s = Session::create(test::newSessionAddress(dir, GetParam()));
    ListeningStore store(s);
    const auto info = store.createTest(mosDesign());
    EXPECT_EQ(info.raterSlots, 2);
    EXPECT_EQ(planSignature(store.plan("round-1")), planSignature(listening::makePlan(mosDesign())));
    EXPECT_EQ(store.design("round-1").systems[1].name, "south");
    EXPECT_EQ(store.joinRater("round-1", "ann"), 0);
    EXPECT_EQ(store.joinRater("round-1", "bob"), 1);
    EXPECT_EQ(store.joinRater("round-1", "ann"), 0);
    EXPECT_THAT([&] { store.joinRater("round-1", "cy"); },
                ::testing::ThrowsMessage<InputError>(HasSubstr("no free rater slot (all 2 are taken)")));
    EXPECT_THROW(store.createTest(mosDesign()), InputError);
    EXPECT_THAT([&] { store.design("nope"); }, ::testing::ThrowsMessage<InputError>(HasSubstr("no listening test named 'nope'")));
    EXPECT_EQ(store.tests().at(0).ratersJoined, 2);
}

TEST_P(ListeningOnBoth, EachTrialIsCommittedAtOnceAndSurvivesAKill) {
    TempDir dir;
    const std::string file = test::newSessionAddress(dir, GetParam());
    {
        Session s = Session::create(file);
        ListeningStore(s).createTest(mosDesign());
    }
    // A rater answers two trials, then the process is killed mid-test.
    const auto child = test::runInChild([&](int) {
        Session s = Session::open(file);
        ListeningStore store(s);
        store.joinRater("round-1", "ann");
        store.recordTrial("round-1", "ann", 0, {4});
        store.recordTrial("round-1", "ann", 1, {2});
        std::raise(SIGKILL);
        return 0;
    });
    EXPECT_EQ(child.exitCode, 128 + SIGKILL);
    Session s = Session::open(file);
    ListeningStore store(s);
    const auto answers = store.answers("round-1");
    ASSERT_EQ(answers.size(), 2u);
    EXPECT_EQ(*answers[0].score, 4);
    EXPECT_EQ(*answers[1].score, 2);
    const auto open = store.openTrials("round-1", "ann");
    ASSERT_FALSE(open.empty());
    EXPECT_EQ(open.front(), 2);  // resumes at the third trial
    EXPECT_EQ(open.size(), store.plan("round-1").raters[0].trials.size() - 2);
    // Answering the same trial twice is refused and stores nothing.
    EXPECT_THAT([&] { store.recordTrial("round-1", "ann", 0, {5}); },
                ::testing::ThrowsMessage<InputError>(HasSubstr("already answered")));
    EXPECT_EQ(store.answers("round-1").size(), 2u);
    EXPECT_THROW(store.recordTrial("round-1", "ann", 2, {7}), InputError);  // off the 1–5 scale
    EXPECT_THROW(store.recordTrial("round-1", "zed", 2, {3}), InputError);  // not joined
}

TEST_P(ListeningOnBoth, ImportLandsWholeOrNotAtAll) {
    TempDir dir;
    Session s = Session::create(test::newSessionAddress(dir, GetParam()));
    ListeningStore store(s);
    store.createTest(mosDesign());
    using listening::Answer;
    std::vector<Answer> first = {{"ext-1", "l1", "north", "", 3.0, listening::TrialKind::Main, "row 2"},
                                 {"ext-1", "l1", "south", "", 2.0, listening::TrialKind::Main, "row 3"}};
    EXPECT_EQ(store.importAnswers("round-1", first, "a.csv"), 2);
    std::vector<Answer> second = {{"ext-2", "l1", "north", "", 5.0, listening::TrialKind::Main, "row 2"},
                                  {"ext-1", "l1", "south", "", 4.0, listening::TrialKind::Main, "row 3"}};
    EXPECT_THAT([&] { store.importAnswers("round-1", second, "b.csv"); },
                ::testing::ThrowsMessage<InputError>(HasSubstr("b.csv row 3: rater 'ext-1' already answered line 'l1', system 'south' (a.csv row 3)")));
    EXPECT_EQ(store.answers("round-1").size(), 2u);  // ext-2's row did not land either
    EXPECT_EQ(store.raters("round-1"), (std::vector<std::string>{"ext-1"}));
}

TEST_P(ListeningOnBoth, OlderSessionsUpgradeAndKeepTheirContent) {
    TempDir dir;
    const std::string file = test::newSessionAddress(dir, GetParam());
    createSessionAtSchemaVersion(file, 2);
    Session s = Session::open(file);
    ListeningStore store(s);
    store.createTest(mosDesign(1));
    EXPECT_EQ(store.tests().size(), 1u);
    EXPECT_EQ(s.integrityCheck(), "ok");
}

}  // namespace
}  // namespace earmark
