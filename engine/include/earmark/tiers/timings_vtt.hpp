// WebVTT cues as one tier (W3C "WebVTT: The Web Video Text Tracks Format").
//
// Reading: the file must start with "WEBVTT" (after an optional byte-order
// mark); the header block is skipped, and so are NOTE, STYLE and REGION
// blocks. A cue is an optional identifier line, a timing line
// "start --> end [settings]" and payload lines. Timestamps are hh:mm:ss.ttt
// or mm:ss.ttt (hours any number of digits, minutes and seconds 00–59,
// exactly three decimals). Cue settings are ignored. The label is the
// payload with its lines joined by single spaces, tags such as <b> or
// <00:00:01.000> removed and character references (&amp; &lt; &gt; &nbsp;
// &lrm; &rlm; &#NN; &#xHH;) decoded.
#pragma once

#include "earmark/tiers/timings.hpp"

#include <string>
#include <string_view>

namespace earmark {

// Cues go to the tier options.defaultTier. Throws InputError(source,
// "line N: …") naming the cue's timing line: a missing WEBVTT signature, a
// bad timestamp, a block without a timing line, and every check of tier.hpp
// (so overlapping cues are an error).
LoadedTimings parseTimingsVtt(std::string_view text, const std::string& source,
                              const TimingsReadOptions& options = {});

// "WEBVTT", then one cue per interval of `tier` with hh:mm:ss.ttt times
// (rounded to the millisecond) and no identifier. '&', '<', '>' in labels
// are escaped; line breaks become spaces. Ends with a newline.
std::string tierToVtt(const Tier& tier);

}  // namespace earmark
