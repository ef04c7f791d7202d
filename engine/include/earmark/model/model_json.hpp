// The JSON forms written by `earmark-cli model mel-diff --json` and
// `earmark-cli model attention --json`. Fields and units:
// docs/model-outputs.md. Pure functions; two-space indentation, no final
// newline.
#pragma once

#include "earmark/model/attention_alignment.hpp"
#include "earmark/model/mel_difference.hpp"

#include <string>
#include <vector>

namespace earmark {

std::string melDifferenceToJson(const PredictedMel& predicted, const MelDifference& difference,
                                const std::string& predictionPath, const std::string& audioPath);

std::string attentionToJson(const AttentionAlignment& alignment, const std::vector<std::string>& labels,
                            const AttentionParams& params, const std::string& matrixPath);

}  // namespace earmark
