// The words a mark is made of: its category, the category's subtypes and the
// severity (DESIGN.md, "Mark categories"). Names are the lower-case, hyphenated
// words stored in session files and written to defect lists; they are part of
// the file formats, so renaming one needs a session schema migration.
#pragma once

#include <optional>
#include <span>
#include <string>
#include <string_view>

namespace earmark {

enum class MarkCategory { Emphasis, Intonation, Timing, Pronunciation, Artifact, Other };

enum class Severity { Minor, Major, Blocker };

// All categories / severities in display order.
std::span<const MarkCategory> allMarkCategories();
std::span<const Severity> allSeverities();

// "emphasis", "intonation", …; "minor", "major", "blocker".
std::string_view categoryName(MarkCategory category);
std::string_view severityName(Severity severity);

// Exact, case-sensitive match of the names above; empty when unknown.
std::optional<MarkCategory> parseCategory(std::string_view name);
std::optional<Severity> parseSeverity(std::string_view name);

// The subtypes a category allows, e.g. intonation → flat, wrong-contour,
// pitch-jump. Empty for MarkCategory::Other (which takes no subtype).
std::span<const std::string_view> subtypesOf(MarkCategory category);

// True for "" (no subtype) and for one of subtypesOf(category).
bool isValidSubtype(MarkCategory category, std::string_view subtype);

// Comma-separated lists for error messages: "emphasis, intonation, …".
std::string categoryNameList();
std::string severityNameList();
std::string subtypeNameList(MarkCategory category);

}  // namespace earmark
