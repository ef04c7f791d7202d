// The JSON form of a take's analysis, as printed by `earmark-cli analyze --json`.
// Schema and field meanings: docs/analysis-json.md. Non-finite numbers (an
// unvoiced frame's F0, loudness of silence) are written as null.
#pragma once

#include "earmark/analysis/take_analysis.hpp"

#include <string>

namespace earmark {

struct AnalysisJsonOptions {
    bool includeTracks = true;  // the per-frame arrays (f0.hz, energy.db, …)
    int indent = -1;            // -1 = compact, else spaces per level
};

std::string analysisToJson(const TakeAnalysis& analysis, const AnalysisParams& params,
                           const AnalysisJsonOptions& options = {});

}  // namespace earmark
