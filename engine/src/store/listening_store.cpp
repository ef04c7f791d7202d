#include "earmark/store/listening_store.hpp"

#include "earmark/core/error.hpp"
#include "earmark/listening/design_files.hpp"
#include "earmark/store/utc_clock.hpp"
#include "session_impl.hpp"

#include <nlohmann/json.hpp>

#include <set>

namespace earmark {
namespace {

using listening::Answer;
using listening::TrialKind;
using nlohmann::json;

std::optional<TrialKind> parseTrialKind(const std::string& s) {
    for (TrialKind k : {TrialKind::Main, TrialKind::Repeat, TrialKind::Attention})
        if (listening::trialKindName(k) == s) return k;
    return std::nullopt;
}

}  // namespace

ListeningStore::TestRow ListeningStore::find(const std::string& test) const {
    const store::Db& db = session_.impl_->db;
    store::Statement st(db, "SELECT id, design FROM listening_tests WHERE name = ?1", "reading a listening test");
    st.bind(1, test);
    if (!st.step()) throw InputError(db.path, "has no listening test named '" + test + "'");
    return {st.integer(0), listening::designFromJson(st.text(1), db.path)};
}

ListeningTestInfo ListeningStore::createTest(const listening::TestDesign& design) {
    session_.impl_->requireWritable("create a listening test");
    const listening::Plan plan = listening::makePlan(design);
    const store::Db& db = session_.impl_->db;
    store::WriteTransaction tx(db, "creating a listening test");
    {
        store::Statement exists(db, "SELECT 1 FROM listening_tests WHERE name = ?1", "creating a listening test");
        exists.bind(1, design.name);
        if (exists.step()) throw InputError(db.path, "already has a listening test named '" + design.name + "'");
    }
    store::Statement insert(db, "INSERT INTO listening_tests (name, kind, design, created_utc) VALUES (?1, ?2, ?3, ?4)",
                            "creating a listening test");
    const std::string now = store::utcNowIso8601();
    insert.bind(1, design.name).bind(2, listening::kindName(design.kind)).bind(3, listening::designToJson(design));
    insert.bind(4, now).run();
    const std::int64_t id = db.lastInsertId();
    store::Statement trial(db,
                           "INSERT INTO listening_trials (test_id, slot, position, line_id, kind, repeat_of, stimuli) "
                           "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7)",
                           "recording the plan");
    for (const listening::RaterPlan& rp : plan.raters)
        for (std::size_t i = 0; i < rp.trials.size(); ++i) {
            const listening::Trial& t = rp.trials[i];
            json stimuli = json::array();
            for (const auto& s : t.stimuli) stimuli.push_back({design.systems[static_cast<std::size_t>(s.system)].name, s.label});
            trial.bind(1, id).bind(2, rp.slot).bind(3, static_cast<int>(i));
            trial.bind(4, design.lines[static_cast<std::size_t>(t.line)].id).bind(5, listening::trialKindName(t.kind));
            trial.bind(6, t.repeatOf).bind(7, stimuli.dump()).run();
            trial.reset();
        }
    tx.commit();
    return {id, design.name, design.kind, now, design.plan.raters, 0, 0};
}

std::vector<ListeningTestInfo> ListeningStore::tests() const {
    store::Statement st(session_.impl_->db,
                        "SELECT t.id, t.name, t.kind, t.created_utc, t.design, "
                        "(SELECT count(*) FROM listening_raters r WHERE r.test_id = t.id AND r.slot IS NOT NULL), "
                        "(SELECT count(*) FROM listening_answers a WHERE a.test_id = t.id) "
                        "FROM listening_tests t ORDER BY t.id",
                        "listing listening tests");
    std::vector<ListeningTestInfo> out;
    while (st.step()) {
        const auto design = listening::designFromJson(st.text(4), session_.path());
        out.push_back({st.integer(0), st.text(1), design.kind, st.text(3), design.plan.raters,
                       static_cast<int>(st.integer(5)), static_cast<int>(st.integer(6))});
    }
    return out;
}

listening::TestDesign ListeningStore::design(const std::string& test) const { return find(test).design; }

listening::Plan ListeningStore::plan(const std::string& test) const {
    const TestRow row = find(test);
    const listening::TestDesign& d = row.design;
    listening::Plan plan;
    plan.seed = d.plan.seed;
    plan.raters.resize(static_cast<std::size_t>(d.plan.raters));
    for (int s = 0; s < d.plan.raters; ++s) plan.raters[static_cast<std::size_t>(s)].slot = s;
    store::Statement st(session_.impl_->db,
                        "SELECT slot, line_id, kind, repeat_of, stimuli FROM listening_trials "
                        "WHERE test_id = ?1 ORDER BY slot, position",
                        "reading the plan");
    st.bind(1, row.id);
    while (st.step()) {
        const auto slot = static_cast<std::size_t>(st.integer(0));
        const int line = d.lineIndex(st.text(1));
        const auto kind = parseTrialKind(st.text(2));
        if (slot >= plan.raters.size() || line < 0 || !kind)
            throw InputError(session_.path(), "the plan of listening test '" + test + "' is damaged");
        listening::Trial t;
        t.line = line;
        t.kind = *kind;
        t.repeatOf = static_cast<int>(st.integer(3));
        for (const json& s : json::parse(st.text(4))) {
            const int system = d.systemIndex(s.at(0).get<std::string>());
            if (system < 0) throw InputError(session_.path(), "the plan of listening test '" + test + "' is damaged");
            t.stimuli.push_back({system, s.at(1).get<std::string>()});
        }
        plan.raters[slot].trials.push_back(std::move(t));
    }
    return plan;
}

std::optional<int> ListeningStore::raterSlot(const std::string& test, const std::string& rater) const {
    const TestRow row = find(test);
    store::Statement st(session_.impl_->db,
                        "SELECT slot FROM listening_raters WHERE test_id = ?1 AND rater = ?2 AND slot IS NOT NULL",
                        "reading raters");
    st.bind(1, row.id).bind(2, rater);
    if (!st.step()) return std::nullopt;
    return static_cast<int>(st.integer(0));
}

int ListeningStore::joinRater(const std::string& test, const std::string& rater) {
    session_.impl_->requireWritable("add a rater");
    if (rater.empty()) throw ParamError("ListeningStore.rater", "the rater's name must not be empty");
    const store::Db& db = session_.impl_->db;
    store::WriteTransaction tx(db, "adding a rater");
    const TestRow row = find(test);
    if (auto slot = raterSlot(test, rater)) return *slot;
    std::set<int> taken;
    store::Statement st(db, "SELECT slot FROM listening_raters WHERE test_id = ?1 AND slot IS NOT NULL", "adding a rater");
    st.bind(1, row.id);
    while (st.step()) taken.insert(static_cast<int>(st.integer(0)));
    int slot = 0;
    while (taken.count(slot)) ++slot;
    if (slot >= row.design.plan.raters)
        throw InputError(db.path, "listening test '" + test + "' has no free rater slot (all " +
                                      std::to_string(row.design.plan.raters) + " are taken)");
    store::Statement insert(db,
                            "INSERT INTO listening_raters (test_id, rater, slot, joined_utc) VALUES (?1, ?2, ?3, ?4) "
                            "ON CONFLICT (test_id, rater) DO UPDATE SET slot = excluded.slot",
                            "adding a rater");
    insert.bind(1, row.id).bind(2, rater).bind(3, slot).bind(4, store::utcNowIso8601()).run();
    tx.commit();
    return slot;
}

std::vector<std::string> ListeningStore::raters(const std::string& test) const {
    const TestRow row = find(test);
    store::Statement st(session_.impl_->db,
                        "SELECT rater FROM listening_raters WHERE test_id = ?1 UNION "
                        "SELECT rater FROM listening_answers WHERE test_id = ?1 ORDER BY 1",
                        "reading raters");
    st.bind(1, row.id);
    std::vector<std::string> out;
    while (st.step()) out.push_back(st.text(0));
    return out;
}

void ListeningStore::insertAnswers(std::int64_t testId, const std::vector<Answer>& answers, std::optional<int> position) {
    const store::Db& db = session_.impl_->db;
    store::Statement clash(db,
                           "SELECT origin FROM listening_answers WHERE test_id = ?1 AND rater = ?2 AND line_id = ?3 "
                           "AND system = ?4 AND versus = ?5 AND kind = ?6",
                           "storing answers");
    store::Statement insert(db,
                            "INSERT INTO listening_answers (test_id, rater, line_id, system, versus, kind, score, "
                            "trial_position, origin, answered_utc) VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10)",
                            "storing answers");
    const std::string now = store::utcNowIso8601();
    for (const Answer& a : answers) {
        const std::string kind(listening::trialKindName(a.kind == TrialKind::Repeat ? TrialKind::Repeat : TrialKind::Main));
        clash.bind(1, testId).bind(2, a.rater).bind(3, a.line).bind(4, a.system).bind(5, a.versus).bind(6, kind);
        if (clash.step()) {
            const std::string before = clash.text(0);
            throw InputError(db.path, (a.origin.empty() ? "" : a.origin + ": ") + "rater '" + a.rater + "' already answered line '" +
                                          a.line + "', system '" + a.system + "'" +
                                          (before.empty() ? "" : " (" + before + ")") + "; nothing was stored");
        }
        clash.reset();
        insert.bind(1, testId).bind(2, a.rater).bind(3, a.line).bind(4, a.system).bind(5, a.versus).bind(6, kind);
        if (a.score) insert.bind(7, *a.score);
        if (position) insert.bind(8, *position);
        insert.bind(9, a.origin).bind(10, now).run();
        insert.reset();
    }
}

void ListeningStore::recordTrial(const std::string& test, const std::string& rater, int position,
                                 const std::vector<double>& ratings) {
    session_.impl_->requireWritable("record an answer");
    const store::Db& db = session_.impl_->db;
    store::WriteTransaction tx(db, "recording an answer");
    const TestRow row = find(test);
    const auto slot = raterSlot(test, rater);
    if (!slot) throw InputError(db.path, "rater '" + rater + "' has not joined listening test '" + test + "'");
    const listening::Plan p = plan(test);
    const auto& trials = p.raters[static_cast<std::size_t>(*slot)].trials;
    if (position < 0 || position >= static_cast<int>(trials.size()))
        throw ParamError("ListeningStore.position", "trial " + std::to_string(position + 1) + " is not in the rater's plan");
    std::vector<Answer> answers =
        listening::answersOfTrial(row.design, trials[static_cast<std::size_t>(position)], rater, ratings);
    listening::checkAnswers(row.design, answers, db.path);
    insertAnswers(row.id, answers, position);
    tx.commit();
}

std::vector<int> ListeningStore::openTrials(const std::string& test, const std::string& rater) const {
    const TestRow row = find(test);
    const auto slot = raterSlot(test, rater);
    if (!slot) throw InputError(session_.path(), "rater '" + rater + "' has not joined listening test '" + test + "'");
    std::set<int> done;
    store::Statement st(session_.impl_->db,
                        "SELECT DISTINCT trial_position FROM listening_answers "
                        "WHERE test_id = ?1 AND rater = ?2 AND trial_position IS NOT NULL",
                        "reading answers");
    st.bind(1, row.id).bind(2, rater);
    while (st.step()) done.insert(static_cast<int>(st.integer(0)));
    std::vector<int> open;
    const int count = static_cast<int>(plan(test).raters[static_cast<std::size_t>(*slot)].trials.size());
    for (int i = 0; i < count; ++i)
        if (!done.count(i)) open.push_back(i);
    return open;
}

int ListeningStore::importAnswers(const std::string& test, std::vector<Answer> answers, const std::string& source) {
    session_.impl_->requireWritable("import answers");
    const store::Db& db = session_.impl_->db;
    const TestRow row = find(test);
    listening::checkAnswers(row.design, answers, source);
    for (Answer& a : answers) a.origin = source + (a.origin.empty() ? "" : " " + a.origin);
    store::WriteTransaction tx(db, "importing answers");
    insertAnswers(row.id, answers, std::nullopt);
    tx.commit();
    return static_cast<int>(answers.size());
}

std::vector<Answer> ListeningStore::answers(const std::string& test) const {
    const TestRow row = find(test);
    store::Statement st(session_.impl_->db,
                        "SELECT rater, line_id, system, versus, kind, coalesce(score, 0), origin, score IS NULL "
                        "FROM listening_answers WHERE test_id = ?1 ORDER BY id",
                        "reading answers");
    st.bind(1, row.id);
    std::vector<Answer> out;
    while (st.step()) {
        Answer a;
        a.rater = st.text(0);
        a.line = st.text(1);
        a.system = st.text(2);
        a.versus = st.text(3);
        a.kind = st.text(4) == "repeat" ? TrialKind::Repeat : TrialKind::Main;
        if (st.integer(7) == 0) a.score = st.real(5);
        a.origin = st.text(6);
        out.push_back(std::move(a));
    }
    return out;
}

}  // namespace earmark
