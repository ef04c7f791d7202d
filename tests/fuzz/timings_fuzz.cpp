// Timings readers: Earmark JSON, CSV, WebVTT and token durations, each on the
// same bytes, with and without a take length to check against.
#include "fuzz_input.hpp"

#include "earmark/tiers/timings_csv.hpp"
#include "earmark/tiers/timings_json.hpp"
#include "earmark/tiers/timings_vtt.hpp"
#include "earmark/tiers/token_durations.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace earmark;
    const auto text = fuzz::asText(data, size);
    for (const bool withLength : {false, true}) {
        TimingsReadOptions options;
        if (withLength) options.takeDurationS = 3.0;
        fuzz::expectOnlyEarmarkErrors([&] { parseTimingsJson(text, "fuzz.json", options); });
        fuzz::expectOnlyEarmarkErrors([&] { parseTimingsCsv(text, "fuzz.csv", options); });
        fuzz::expectOnlyEarmarkErrors([&] { parseTimingsVtt(text, "fuzz.vtt", options); });
        fuzz::expectOnlyEarmarkErrors([&] { parseTokenDurations(text, "fuzz.json", options); });
    }
    return 0;
}
