// Level matching of the takes of one trial, so raters judge quality rather
// than loudness: each take is played with a gain that brings its integrated
// loudness (ITU-R BS.1770-4, earmark/loudness/bs1770.hpp) to that of the
// quietest take of the trial. Gains are ≤ 0 dB: no take is boosted, so none
// clips more than it already does. A take whose loudness is undefined
// (silence, shorter than one 400 ms block) is played as it is (0 dB).
//
// Pure (matchingGainsDb) or reading files (measureTrialLoudness: InputError
// naming an unreadable file). Thread-safe.
#pragma once

#include <string>
#include <vector>

namespace earmark::listening {

std::vector<double> matchingGainsDb(const std::vector<double>& loudnessLufs);

struct MatchedTake {
    double loudnessLufs = 0;  // −infinity when undefined
    double gainDb = 0;
};
std::vector<MatchedTake> measureTrialLoudness(const std::vector<std::string>& audioPaths);

}  // namespace earmark::listening
