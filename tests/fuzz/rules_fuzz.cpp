// The scan's rules file (JSON thresholds).
#include "fuzz_input.hpp"

#include "earmark/prosody/rules.hpp"

#include <string>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace earmark;
    fuzz::expectOnlyEarmarkErrors([&] { parseRules(std::string(fuzz::asText(data, size)), "fuzz-rules.json"); });
    return 0;
}
