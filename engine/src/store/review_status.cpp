#include "earmark/store/take.hpp"

#include <array>

namespace earmark {
namespace {
constexpr std::array kStatuses = {ReviewStatus::Unreviewed, ReviewStatus::InReview, ReviewStatus::Clean,
                                  ReviewStatus::HasMarks, ReviewStatus::Skipped};
}  // namespace

std::string_view reviewStatusName(ReviewStatus status) {
    switch (status) {
    case ReviewStatus::Unreviewed: return "unreviewed";
    case ReviewStatus::InReview: return "in-review";
    case ReviewStatus::Clean: return "clean";
    case ReviewStatus::HasMarks: return "has-marks";
    case ReviewStatus::Skipped: return "skipped";
    }
    return "unreviewed";
}

std::optional<ReviewStatus> parseReviewStatus(std::string_view name) {
    for (ReviewStatus s : kStatuses)
        if (reviewStatusName(s) == name) return s;
    return std::nullopt;
}

std::string reviewStatusNameList() {
    std::string out;
    for (ReviewStatus s : kStatuses) out += (out.empty() ? "" : ", ") + std::string(reviewStatusName(s));
    return out;
}

}  // namespace earmark
