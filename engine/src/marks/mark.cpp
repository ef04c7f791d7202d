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

// Text typed by a person: valid UTF-8, bounded, and no control characters
// other than tab and line breaks (they would corrupt one-line displays).
void checkText(const char* field, const std::string& text, std::size_t maxBytes, bool multiLine) {
    const std::string subject = std::string("Mark.") + field;
    if (auto bad = firstInvalidUtf8(text))
        throw ParamError(subject, "is not valid UTF-8 (bad byte at offset " + std::to_string(*bad) +
                                      "); save the text as UTF-8");
    if (text.size() > maxBytes)
        throw ParamError(subject, "is " + std::to_string(text.size()) + " bytes long; at most " +
                                      std::to_string(maxBytes) + " are allowed");
    for (std::size_t i = 0; i < text.size(); ++i) {
        const auto c = static_cast<unsigned char>(text[i]);
        const bool allowed = c >= 0x20 || c == '\t' || (multiLine && (c == '\n' || c == '\r'));
        if (!allowed || c == 0x7F)
            throw ParamError(subject, "contains a control character (byte " + std::to_string(c) +
                                          " at offset " + std::to_string(i) + ")");
    }
}

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
    checkText("subtype", subtype, 64, false);
    checkText("words", words, kMaxWordsBytes, false);
    checkText("note", note, kMaxNoteBytes, true);
    checkText("rater", rater, kMaxRaterBytes, false);
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
