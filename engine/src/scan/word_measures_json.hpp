// Per-word prosody of a scanned take as JSON objects (one per word: word,
// start_s, end_s, duration_s, syllables, the F0 and energy figures, voiced
// fraction, pauses either side, prominence; undefined figures as null), and
// back, so `merge` keeps them. Private to the engine.
#pragma once

#include "earmark/prosody/word_measures.hpp"

#include <nlohmann/json.hpp>

#include <string>
#include <vector>

namespace earmark::detail {

nlohmann::ordered_json wordMeasuresToJson(const std::vector<WordMeasures>& words);

// Throws InputError(path, …) naming the take when an entry is not an object
// with a word, start_s and end_s.
std::vector<WordMeasures> wordMeasuresFromJson(const nlohmann::ordered_json& json, const std::string& path,
                                               const std::string& takeId);

}  // namespace earmark::detail
