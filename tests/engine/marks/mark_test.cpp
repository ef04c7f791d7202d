// Validation of a mark before it is stored: spans, subtypes, text.
#include "earmark/core/error.hpp"
#include "earmark/marks/mark.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <cmath>
#include <limits>

namespace earmark {
namespace {

using ::testing::HasSubstr;

MarkDraft good() {
    MarkDraft d;
    d.category = MarkCategory::Intonation;
    d.subtype = "flat";
    d.severity = Severity::Major;
    d.startSeconds = 0.5;
    d.endSeconds = 1.5;
    d.note = "sounds flat — a question read as a statement";
    d.rater = "Åsa Ö.";
    d.measures = {{"duration_s", 1.0}, {"f0_mean_hz", 141.5}};
    return d;
}

// Returns "subject: problem" of the ParamError, or "" if none was thrown.
std::string failure(const MarkDraft& d, double duration = 3.0) {
    try {
        d.validate(duration);
    } catch (const ParamError& e) {
        return e.what();
    }
    return "";
}

TEST(MarkDraft, AcceptsAValidMark) { EXPECT_EQ(failure(good()), ""); }

TEST(MarkDraft, SpanRules) {
    MarkDraft d = good();
    d.startSeconds = 1.2, d.endSeconds = 0.4;
    EXPECT_THAT(failure(d), HasSubstr("Mark.endSeconds: end 0.400 s is before the start 1.200 s"));
    d.startSeconds = d.endSeconds = 1.0;
    EXPECT_THAT(failure(d), HasSubstr("is empty"));
    d.startSeconds = -0.1, d.endSeconds = 1.0;
    EXPECT_THAT(failure(d), HasSubstr("Mark.startSeconds"));
    d.startSeconds = 2.5, d.endSeconds = 3.2;
    EXPECT_THAT(failure(d, 3.0), HasSubstr("runs past the end of the take (3.000 s)"));
    d.startSeconds = std::numeric_limits<double>::quiet_NaN();
    EXPECT_THAT(failure(d), HasSubstr("Mark.startSeconds"));
    d.startSeconds = 0.0, d.endSeconds = std::numeric_limits<double>::infinity();
    EXPECT_THAT(failure(d), HasSubstr("Mark.endSeconds"));
}

TEST(MarkDraft, EndMayTouchTheTakesEndWithinHalfAMillisecond) {
    MarkDraft d = good();
    d.startSeconds = 2.0, d.endSeconds = 3.0004;
    EXPECT_EQ(failure(d, 3.0), "");
    d.endSeconds = 3.0006;
    EXPECT_NE(failure(d, 3.0), "");
}

TEST(MarkDraft, SubtypeMustBelongToCategory) {
    MarkDraft d = good();
    d.category = MarkCategory::Timing;
    EXPECT_THAT(failure(d), HasSubstr("Mark.subtype: 'flat' is not a subtype of timing (known: rushed"));
    d.category = MarkCategory::Other;
    EXPECT_THAT(failure(d), HasSubstr("it takes none"));
    d.subtype = "";
    EXPECT_EQ(failure(d), "");
    d.category = static_cast<MarkCategory>(42);
    EXPECT_THAT(failure(d), HasSubstr("Mark.category"));
    d = good();
    d.severity = static_cast<Severity>(-1);
    EXPECT_THAT(failure(d), HasSubstr("Mark.severity"));
}

TEST(MarkDraft, RejectsTextThatIsNotUtf8) {
    MarkDraft d = good();
    d.note = "caf\xE9 au lait";  // Latin-1 é: not UTF-8
    EXPECT_THAT(failure(d), HasSubstr("Mark.note: is not valid UTF-8 (bad byte at offset 3)"));
    d = good();
    d.rater = "\xC0\xAF";  // overlong '/'
    EXPECT_THAT(failure(d), HasSubstr("Mark.rater"));
    d = good();
    d.words = "ok\xED\xA0\x80";  // a UTF-16 surrogate encoded as UTF-8
    EXPECT_THAT(failure(d), HasSubstr("Mark.words"));
}

TEST(MarkDraft, NotesMaySpanLinesButHoldNoOtherControlCharacters) {
    MarkDraft d = good();
    d.note = "line one\r\nline two\tand a tab";
    EXPECT_EQ(failure(d), "");
    d.note = std::string("nul\0here", 8);
    EXPECT_THAT(failure(d), HasSubstr("control character"));
    d = good();
    d.rater = "two\nlines";
    EXPECT_THAT(failure(d), HasSubstr("Mark.rater: contains a control character"));
    d = good();
    d.note.assign(MarkDraft::kMaxNoteBytes + 1, 'x');
    EXPECT_THAT(failure(d), HasSubstr("at most 16384"));
}

TEST(MarkDraft, MeasuresAreFiniteAndPlainlyNamed) {
    MarkDraft d = good();
    d.measures["f0 mean"] = 1.0;
    EXPECT_THAT(failure(d), HasSubstr("may only use"));
    d = good();
    d.measures["f0_mean_hz"] = std::nan("");
    EXPECT_THAT(failure(d), HasSubstr("not a finite number"));
}

}  // namespace
}  // namespace earmark
