// Per-token durations: the form a synthesis model's duration output takes —
// a list of tokens, each lasting a whole number of frames of `hop_size`
// samples at `sample_rate` Hz (docs/timings-formats.md):
//
//   {"hop_size": 256, "sample_rate": 22050, "tier": "phones",
//    "tokens": [{"text": "h", "frames": 12}, {"text": "", "frames": 30}, ...]}
//
// Tokens are contiguous from time 0: token k starts at (Σ frames before k) ·
// hop_size / sample_rate seconds. A token with empty text is a pause: it
// takes time but makes no interval. A token of 0 frames makes no interval
// either (warned). "tier" is optional (default "tokens").
#pragma once

#include "earmark/tiers/timings.hpp"

#include <string>
#include <string_view>

namespace earmark {

inline constexpr std::string_view kTokensTier = "tokens";

struct TokenDurationsParams {
    int hopSize = 256;           // samples per frame, >= 1
    double sampleRate = 22050;   // Hz, > 0
    // Throws ParamError("TokenDurationsParams.hopSize" / ".sampleRate").
    void validate() const;
};

// Reads the form above into one tier. Throws InputError(source, "tokens[4]:
// …") for a bad token (missing text, frames not a whole number >= 0) and
// InputError(source, "…") for a missing or invalid hop_size / sample_rate,
// plus every check of tier.hpp (e.g. tokens running past the take).
LoadedTimings parseTokenDurations(std::string_view text, const std::string& source,
                                  const TimingsReadOptions& options = {});

// Writes `tier` in the form above. Boundaries are rounded to the frame grid
// cumulatively (each boundary to its nearest frame, so rounding never builds
// up); gaps between intervals, and the stretch up to `takeDurationS` when
// given, become pause tokens with empty text. An interval shorter than half a
// frame rounds to 0 frames and is kept as a 0-frame token. Throws ParamError
// for invalid params. Ends with a newline.
std::string tierToTokenDurations(const Tier& tier, const TokenDurationsParams& params,
                                 std::optional<double> takeDurationS = std::nullopt);

}  // namespace earmark
