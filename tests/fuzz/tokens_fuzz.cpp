// Attention token lists (one token per line, or a JSON list of strings).
#include "fuzz_input.hpp"

#include "earmark/model/attention.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace earmark;
    const std::string path = fuzz::asFile(data, size, "-tokens.txt");
    fuzz::expectOnlyEarmarkErrors([&] { readTokenList(path); });
    return 0;
}
