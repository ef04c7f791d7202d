// Opening a session file of any bytes read-only, and reading what it holds.
#include "fuzz_input.hpp"

#include "earmark/store/session.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace earmark;
    const std::string path = fuzz::asFile(data, size, "-session.earmark");
    fuzz::expectOnlyEarmarkErrors([&] {
        Session session = Session::open(path, OpenMode::ReadOnly);
        for (const auto& take : session.takes()) session.tiers(take.id);
        session.marks();
        session.suspects();
    });
    return 0;
}
