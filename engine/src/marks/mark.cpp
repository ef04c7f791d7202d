#include "earmark/marks/mark.hpp"

#include "earmark/core/error.hpp"
#include "earmark/core/format.hpp"
#include "earmark/marks/utf8.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace earmark {
namespace {

std::string seconds(double s) { return formatSeconds(s); }

}  // namespace

void MarkDraft::validate(double takeDurationSeconds) const {
    // Guards against out-of-range values cast into the enums.
    const auto categories = allMarkCategories();
    if (std::find(categories.begin(), categories.end(), category) == categories.end())
        throw ParamError("Mark.category", "is not one of " + categoryNameList());
    const auto severities = allSeverities();
    if (std::find(severities.begin(), severities.end(), severity) == severities.end())
        throw ParamError("Mark.severity", "is not one of " + severityNameList());
    if (!isValidSubtype(category, subtype)) {
        const std::string known = subtypeNameList(category);
        throw ParamError("Mark.subtype", "'" + subtype + "' is not a subtype of " +
                                             std::string(categoryName(category)) +
                                             (known.empty() ? " (it takes none)" : " (known: " + known + ")"));
    }
    if (!std::isfinite(startSeconds) || startSeconds < 0)
        throw ParamError("Mark.startSeconds", "must be a time >= 0 s, got " + seconds(startSeconds));
    if (!std::isfinite(endSeconds))
        throw ParamError("Mark.endSeconds", "must be a finite time");
    if (endSeconds < startSeconds)
        throw ParamError("Mark.endSeconds", "end " + seconds(endSeconds) + " is before the start " +
                                                seconds(startSeconds));
    if (endSeconds == startSeconds)
        throw ParamError("Mark.endSeconds", "the span " + seconds(startSeconds) + " to " +
                                                seconds(endSeconds) + " is empty");
    if (!(takeDurationSeconds > 0) || endSeconds > takeDurationSeconds + kEndToleranceSeconds)
        throw ParamError("Mark.endSeconds", "the span " + seconds(startSeconds) + " to " +
                                                seconds(endSeconds) + " runs past the end of the take (" +
                                                seconds(takeDurationSeconds) + ")");
    checkTypedText("Mark.subtype", subtype, 64, false);
    checkTypedText("Mark.words", words, kMaxWordsBytes, false);
    checkTypedText("Mark.note", note, kMaxNoteBytes, true);
    checkTypedText("Mark.rater", rater, kMaxRaterBytes, false);
    for (const auto& [name, value] : measures) {
        if (name.empty() || name.size() > 64)
            throw ParamError("Mark.measures", "a measure name must have 1 to 64 characters");
        for (char c : name)
            if (!((c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '_'))
                throw ParamError("Mark.measures", "measure name '" + name +
                                                      "' may only use a-z, 0-9 and '_'");
        if (!std::isfinite(value))
            throw ParamError("Mark.measures", "measure '" + name + "' is not a finite number");
    }
}

}  // namespace earmark
