// Scan manifests (CSV id,audio[,text][,timings]) and scan outputs read back by
// merge (CSV or JSON, told apart by content).
#include "fuzz_input.hpp"

#include "earmark/scan/scan_input.hpp"
#include "earmark/scan/scan_report.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace earmark;
    const std::string path = fuzz::asFile(data, size, "-listing.csv");
    fuzz::expectOnlyEarmarkErrors([&] { listScanInput(path); });
    fuzz::expectOnlyEarmarkErrors([&] { readReport(path); });
    return 0;
}
