#include "earmark/marks/mark_kinds.hpp"

#include <algorithm>
#include <array>

namespace earmark {
namespace {

constexpr std::array kCategories = {MarkCategory::Emphasis,      MarkCategory::Intonation,
                                    MarkCategory::Timing,        MarkCategory::Pronunciation,
                                    MarkCategory::Artifact,      MarkCategory::Other};
constexpr std::array kSeverities = {Severity::Minor, Severity::Major, Severity::Blocker};

constexpr std::array<std::string_view, 3> kEmphasis = {"misplaced", "missing", "excessive"};
constexpr std::array<std::string_view, 3> kIntonation = {"flat", "wrong-contour", "pitch-jump"};
constexpr std::array<std::string_view, 5> kTiming = {"rushed", "dragged", "pause-missing",
                                                     "pause-extra", "pause-too-long"};
constexpr std::array<std::string_view, 4> kPronunciation = {"wrong-sound", "wrong-stress",
                                                            "dropped-sound", "added-sound"};
constexpr std::array<std::string_view, 5> kArtifact = {"click", "buzz", "noise", "truncation",
                                                       "clipping"};

template <typename Range, typename Name>
std::string joinNames(const Range& items, Name name) {
    std::string out;
    for (const auto& item : items) {
        if (!out.empty()) out += ", ";
        out += name(item);
    }
    return out;
}

}  // namespace

std::span<const MarkCategory> allMarkCategories() { return kCategories; }
std::span<const Severity> allSeverities() { return kSeverities; }

std::string_view categoryName(MarkCategory category) {
    switch (category) {
    case MarkCategory::Emphasis: return "emphasis";
    case MarkCategory::Intonation: return "intonation";
    case MarkCategory::Timing: return "timing";
    case MarkCategory::Pronunciation: return "pronunciation";
    case MarkCategory::Artifact: return "artifact";
    case MarkCategory::Other: return "other";
    }
    return "other";
}

std::string_view severityName(Severity severity) {
    switch (severity) {
    case Severity::Minor: return "minor";
    case Severity::Major: return "major";
    case Severity::Blocker: return "blocker";
    }
    return "minor";
}

std::optional<MarkCategory> parseCategory(std::string_view name) {
    for (MarkCategory c : kCategories)
        if (categoryName(c) == name) return c;
    return std::nullopt;
}

std::optional<Severity> parseSeverity(std::string_view name) {
    for (Severity s : kSeverities)
        if (severityName(s) == name) return s;
    return std::nullopt;
}

std::span<const std::string_view> subtypesOf(MarkCategory category) {
    switch (category) {
    case MarkCategory::Emphasis: return kEmphasis;
    case MarkCategory::Intonation: return kIntonation;
    case MarkCategory::Timing: return kTiming;
    case MarkCategory::Pronunciation: return kPronunciation;
    case MarkCategory::Artifact: return kArtifact;
    case MarkCategory::Other: return {};
    }
    return {};
}

bool isValidSubtype(MarkCategory category, std::string_view subtype) {
    if (subtype.empty()) return true;
    const auto list = subtypesOf(category);
    return std::find(list.begin(), list.end(), subtype) != list.end();
}

std::string categoryNameList() {
    return joinNames(kCategories, [](MarkCategory c) { return std::string(categoryName(c)); });
}

std::string severityNameList() {
    return joinNames(kSeverities, [](Severity s) { return std::string(severityName(s)); });
}

std::string subtypeNameList(MarkCategory category) {
    return joinNames(subtypesOf(category), [](std::string_view s) { return std::string(s); });
}

}  // namespace earmark
