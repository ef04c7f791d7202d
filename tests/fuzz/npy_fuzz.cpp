// .npy arrays alone, as a predicted mel with and without a sidecar, and as an
// attention matrix. The input's first byte says how long the sidecar part is
// (x 4 bytes); the rest is split into sidecar JSON and .npy bytes.
#include "fuzz_input.hpp"

#include "earmark/export/npy.hpp"
#include "earmark/model/attention.hpp"
#include "earmark/model/mel_settings.hpp"
#include "earmark/model/predicted_mel.hpp"

#include <algorithm>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace earmark;
    if (size == 0) return 0;
    const std::size_t sidecarBytes = std::min<std::size_t>(size - 1, std::size_t{data[0]} * 4);
    const std::string sidecar = fuzz::asFile(data + 1, sidecarBytes, "-mel.npy.json");
    const std::string npy = fuzz::asFile(data + 1 + sidecarBytes, size - 1 - sidecarBytes, "-mel.npy");
    fuzz::expectOnlyEarmarkErrors([&] { readNpy(npy); });
    fuzz::expectOnlyEarmarkErrors([&] { readMelSidecar(sidecar); });
    fuzz::expectOnlyEarmarkErrors([&] { readPredictedMel(npy); });
    PredictedMelOptions withSidecar;
    withSidecar.sidecarPath = sidecar;
    fuzz::expectOnlyEarmarkErrors([&] { readPredictedMel(npy, withSidecar); });
    fuzz::expectOnlyEarmarkErrors([&] { readAttentionNpy(npy, 3); });
    return 0;
}
