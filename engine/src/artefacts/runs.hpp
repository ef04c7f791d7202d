// Runs of flagged frames, for the frame-based artefact detectors. Internal.
#pragma once

#include <cstddef>
#include <vector>

namespace earmark::detail {

struct Run {
    std::size_t first = 0, last = 0;  // inclusive frame indices
    std::size_t length() const { return last - first + 1; }
};

// Maximal runs of true flags; holes of up to `bridge` false frames between
// two runs are closed.
inline std::vector<Run> flaggedRuns(const std::vector<bool>& flags, std::size_t bridge = 0) {
    std::vector<Run> runs;
    for (std::size_t i = 0; i < flags.size(); ++i) {
        if (!flags[i]) continue;
        if (!runs.empty() && i - runs.back().last <= bridge + 1) runs.back().last = i;
        else runs.push_back({i, i});
    }
    return runs;
}

}  // namespace earmark::detail
