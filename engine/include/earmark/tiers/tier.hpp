// Tiers: named rows of labelled time intervals over one take (words, phones,
// later syllables), and the checks every tier passes on load.
//
// Times are seconds from the start of the take (DESIGN.md time convention).
// A valid tier is sorted, its intervals do not overlap (gaps are allowed: a
// gap is a pause or an unlabelled stretch), every interval has end > start,
// and all of it lies inside the take when the take's length is known. An
// empty label is allowed but reported as a warning.
//
// Plain values; no shared state. Thread-safe as values are.
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace earmark {

inline constexpr std::string_view kWordsTier = "words";
inline constexpr std::string_view kPhonesTier = "phones";

struct Interval {
    double startS = 0.0;  // seconds from the start of the take
    double endS = 0.0;    // seconds; > startS
    std::string label;    // UTF-8; may be empty (warned)
    std::optional<double> confidence;  // 0 (no trust) … 1 (sure); absent when not measured
};

struct Tier {
    std::string name;  // e.g. "words", "phones"; unique within a TierSet
    std::vector<Interval> intervals;
};

// All tiers of one take.
struct TierSet {
    std::optional<double> durationS;  // length of the take in seconds, when known
    std::vector<Tier> tiers;          // in the order they were added / read

    // The tier of that name, or nullptr.
    const Tier* find(std::string_view name) const;
    Tier* find(std::string_view name);
    // The tier of that name, appended empty if it does not exist yet. The
    // reference (like find's pointers) is valid until the next tier is added.
    Tier& getOrAdd(std::string_view name);
};

// Slack for times written with limited precision (e.g. milliseconds in a
// file): overlaps up to this much are accepted, and an end this far past the
// take's end is clamped to it. Common practice: half the smallest unit a
// timing file usually carries (1 ms).
inline constexpr double kTimeSlackS = 0.0005;

// One finding about one interval of a tier; `index` is its 0-based position.
struct TierIssue {
    std::size_t index = 0;
    std::string problem;  // e.g. "ends at 4.200 s, past the end of the audio (3.900 s)"
};

struct TierCheck {
    std::optional<TierIssue> error;   // the first bad interval, if any
    std::vector<TierIssue> warnings;  // every empty label (up to the first error)
};

// Checks one tier: finite times, start >= 0, end > start (equal start and end
// is reported as a duplicate boundary), sorted by start, no overlap beyond
// kTimeSlackS, end <= takeDurationS (+ slack) when given, confidence in [0, 1].
// Pure; never throws.
TierCheck checkTier(const Tier& tier, std::optional<double> takeDurationS);

// Clamps ends that lie within kTimeSlackS past the take's end (and starts
// within the slack before 0) onto the take. Call after a successful check.
void clampToTake(Tier& tier, std::optional<double> takeDurationS);

// Checks every tier of `set` (against set.durationS when `takeDurationS` is
// not given) and clamps within the slack. Throws InputError(subject,
// "tier 'words', interval 4 ('ferry'): …") for the first bad interval, or for
// two tiers with the same name. Returns the warnings, one line each.
std::vector<std::string> validateTierSet(TierSet& set, const std::string& subject,
                                         std::optional<double> takeDurationS = std::nullopt);

}  // namespace earmark
