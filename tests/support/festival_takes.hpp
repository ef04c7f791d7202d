// Takes rendered by Debian's festival voices (cmu_us_slt_arctic_hts,
// kal_diphone, ked_diphone) from texts of our own, with the voices' own word
// times as truth: tests/data/evidence/render_festival_takes.py. Rendered once
// per source tree (release and debug builds share them, under a file lock).
#pragma once

#include <filesystem>
#include <string>
#include <vector>

namespace earmark::test {

// The folder holding <voice>-<nn>.wav/.txt/.words and <voice>-fault-<id>.*;
// throws std::runtime_error when rendering fails.
const std::filesystem::path& festivalTakes();

// Takes of one voice ("slt-", "kal-", "ked-"): the clean ones or the planted faults, sorted by name.
std::vector<std::filesystem::path> festivalTakeFiles(const std::string& prefix, bool faults);

// The first line of a text file (a take's script).
std::string firstLine(const std::filesystem::path& path);

}  // namespace earmark::test
