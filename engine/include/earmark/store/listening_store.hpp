// Listening tests inside a session file: the design, the plan recorded at
// creation (every rater slot's trials in order), raters bound to slots, and
// answers. Tables are described in docs/listening-tests.md.
//
// Durability: as the rest of the session (session.hpp): every call is one
// transaction committed before it returns, so each trial's answers survive
// a crash the moment recordTrial returns; an import lands whole or not at all.
//
// Errors: InputError (subject = the session file) for an unknown test, a
// test name already used, a rater when all slots are taken, or an answer that
// repeats one already stored (naming rater, line and system); answers are
// checked against the design first (listening::checkAnswers). Error for
// write failures, as in Session.
//
// Thread-safety: as the Session it was made from (one thread at a time).
#pragma once

#include "earmark/listening/answers.hpp"
#include "earmark/listening/plan.hpp"
#include "earmark/listening/test_design.hpp"
#include "earmark/store/session.hpp"

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace earmark {

struct ListeningTestInfo {
    std::int64_t id = 0;
    std::string name;
    listening::TestKind kind = listening::TestKind::Mos;
    std::string createdUtc;
    int raterSlots = 0, ratersJoined = 0, answers = 0;
};

class ListeningStore {
public:
    explicit ListeningStore(Session& session) : session_(session) {}

    // Stores the design and its plan (makePlan) in one transaction.
    ListeningTestInfo createTest(const listening::TestDesign& design);
    std::vector<ListeningTestInfo> tests() const;
    listening::TestDesign design(const std::string& test) const;
    listening::Plan plan(const std::string& test) const;  // as recorded at creation

    // The rater's slot: the one already bound, or the first free one (bound
    // now). InputError when every slot is taken.
    int joinRater(const std::string& test, const std::string& rater);
    std::optional<int> raterSlot(const std::string& test, const std::string& rater) const;
    std::vector<std::string> raters(const std::string& test) const;  // every rater with a slot or an answer

    // One trial's ratings (see listening::answersOfTrial), committed at once.
    void recordTrial(const std::string& test, const std::string& rater, int position, const std::vector<double>& ratings);
    // Positions of the rater's plan not answered yet, in order (resume where they left off).
    std::vector<int> openTrials(const std::string& test, const std::string& rater) const;

    // Answers gathered elsewhere: checked, then stored in one transaction.
    // Returns how many were stored.
    int importAnswers(const std::string& test, std::vector<listening::Answer> answers, const std::string& source);
    std::vector<listening::Answer> answers(const std::string& test) const;

private:
    struct TestRow {
        std::int64_t id;
        listening::TestDesign design;
    };
    TestRow find(const std::string& test) const;
    void insertAnswers(std::int64_t testId, const std::vector<listening::Answer>& answers,
                       std::optional<int> position);
    Session& session_;
};

}  // namespace earmark
