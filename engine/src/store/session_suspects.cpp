// Suspects raised by the scan.
#include "session_impl.hpp"

#include "earmark/core/error.hpp"
#include "earmark/marks/utf8.hpp"

#include <cmath>

namespace earmark {
namespace {

void checkSuspect(const Suspect& s) {
    if (s.name.empty() || !isValidUtf8(s.name))
        throw ParamError("Suspect.name", "must be non-empty UTF-8 text");
    if (!isValidUtf8(s.reason)) throw ParamError("Suspect.reason", "is not valid UTF-8");
    if (!std::isfinite(s.value) || !std::isfinite(s.threshold))
        throw ParamError("Suspect.value", "value and threshold of '" + s.name + "' must be finite");
    if (!std::isfinite(s.startSeconds) || !std::isfinite(s.endSeconds) || s.startSeconds < 0 ||
        s.endSeconds < s.startSeconds)
        throw ParamError("Suspect.endSeconds", "span of '" + s.name + "' must have 0 <= start <= end");
}

}  // namespace

void Session::replaceSuspects(TakeId take, const std::vector<Suspect>& suspects) {
    impl_->requireWritable("write suspects");
    for (const Suspect& s : suspects) checkSuspect(s);
    store::WriteTransaction tx(impl_->db, "writing suspects");
    impl_->readTake(take);
    store::Statement clear(impl_->db, "DELETE FROM suspects WHERE take_id = ?1", "writing suspects");
    clear.bind(1, take).run();
    store::Statement insert(impl_->db,
                            "INSERT INTO suspects (take_id, name, value, threshold, start_s, end_s, reason) "
                            "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7)",
                            "writing suspects");
    for (const Suspect& s : suspects) {
        insert.bind(1, take).bind(2, s.name).bind(3, s.value).bind(4, s.threshold);
        insert.bind(5, s.startSeconds).bind(6, s.endSeconds).bind(7, s.reason).run();
        insert.reset();
    }
    tx.commit();
}

std::vector<Suspect> Session::suspects(std::optional<TakeId> take) const {
    store::Statement st(impl_->db,
                        std::string("SELECT s.id, s.take_id, s.name, s.value, s.threshold, s.start_s, s.end_s, "
                                    "s.reason FROM suspects s JOIN takes t ON t.id = s.take_id ") +
                            (take ? "WHERE s.take_id = ?1 " : "") + "ORDER BY t.queue_pos, s.start_s, s.id",
                        "listing suspects");
    if (take) st.bind(1, *take);
    std::vector<Suspect> out;
    while (st.step())
        out.push_back({st.integer(0), st.integer(1), st.text(2), st.real(3), st.real(4), st.real(5),
                       st.real(6), st.text(7)});
    return out;
}

}  // namespace earmark
