#include "earmark/view/waveform_summary.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {

void WaveformSummaryParams::validate() const {
    if (firstBlockSamples < 2)
        throw ParamError("WaveformSummaryParams.firstBlockSamples", "must be at least 2");
    if (factor < 2) throw ParamError("WaveformSummaryParams.factor", "must be at least 2");
}

WaveformSummary WaveformSummary::build(std::span<const float> samples, const WaveformSummaryParams& params) {
    params.validate();
    WaveformSummary s;
    s.sampleCount_ = static_cast<std::int64_t>(samples.size());
    if (samples.empty()) return s;

    Level first;
    first.blockSamples = params.firstBlockSamples;
    const std::size_t block = static_cast<std::size_t>(params.firstBlockSamples);
    first.blocks.resize((samples.size() + block - 1) / block);
    for (std::size_t b = 0; b < first.blocks.size(); ++b) {
        const std::size_t end = std::min(samples.size(), (b + 1) * block);
        MinMax m;
        for (std::size_t i = b * block; i < end; ++i) m.add(samples[i]);
        first.blocks[b] = m;
    }
    s.levels_.push_back(std::move(first));

    const std::size_t factor = static_cast<std::size_t>(params.factor);
    while (s.levels_.back().blocks.size() > 1) {
        const Level& below = s.levels_.back();
        Level next;
        next.blockSamples = below.blockSamples * params.factor;
        next.blocks.resize((below.blocks.size() + factor - 1) / factor);
        for (std::size_t b = 0; b < next.blocks.size(); ++b) {
            const std::size_t end = std::min(below.blocks.size(), (b + 1) * factor);
            MinMax m;
            for (std::size_t i = b * factor; i < end; ++i) m.add(below.blocks[i]);
            next.blocks[b] = m;
        }
        s.levels_.push_back(std::move(next));
    }
    return s;
}

MinMax WaveformSummary::range(std::span<const float> samples, std::int64_t first, std::int64_t last) const {
    const std::int64_t n = std::min<std::int64_t>(sampleCount_, static_cast<std::int64_t>(samples.size()));
    std::int64_t lo = std::max<std::int64_t>(first, 0);
    std::int64_t hi = std::min(last, n);
    MinMax out;
    if (lo >= hi) return out;

    // Aligns [lo, hi) to the next coarser block size B, reading the ragged
    // edges at the current resolution. `hi == n` counts as aligned: the last
    // block of every level ends at the signal's end.
    auto alignTo = [&](std::int64_t B, auto&& readSpan) -> bool {
        const std::int64_t nlo = (lo + B - 1) / B * B;
        const std::int64_t nhi = hi == n ? n : hi / B * B;
        if (nlo >= nhi) {
            readSpan(lo, hi);
            return false;  // everything consumed
        }
        readSpan(lo, nlo);
        readSpan(nhi, hi);
        lo = nlo;
        hi = nhi;
        return true;
    };

    auto readSamples = [&](std::int64_t a, std::int64_t b) {
        for (std::int64_t i = a; i < b; ++i) out.add(samples[static_cast<std::size_t>(i)]);
    };
    if (levels_.empty() || !alignTo(levels_.front().blockSamples, readSamples)) {
        if (levels_.empty()) readSamples(lo, hi);
        return out;
    }
    for (std::size_t k = 0; k < levels_.size(); ++k) {
        const Level& level = levels_[k];
        const std::int64_t B = level.blockSamples;
        auto readBlocks = [&](std::int64_t a, std::int64_t b) {
            // a is a multiple of B; b is a multiple of B or the signal's end.
            for (std::int64_t i = a / B; i < (b + B - 1) / B; ++i)
                out.add(level.blocks[static_cast<std::size_t>(i)]);
        };
        if (k + 1 == levels_.size()) {
            readBlocks(lo, hi);
            return out;
        }
        if (!alignTo(levels_[k + 1].blockSamples, readBlocks)) return out;
    }
    return out;
}

std::vector<MinMax> WaveformSummary::envelope(std::span<const float> samples, double startSample,
                                              double samplesPerColumn, int columns) const {
    if (!(samplesPerColumn > 0.0))
        throw ParamError("WaveformSummary.envelope.samplesPerColumn", "must be positive");
    std::vector<MinMax> out(static_cast<std::size_t>(std::max(columns, 0)));
    for (int c = 0; c < columns; ++c) {
        const auto a = static_cast<std::int64_t>(std::floor(startSample + c * samplesPerColumn));
        const auto b = static_cast<std::int64_t>(std::floor(startSample + (c + 1) * samplesPerColumn));
        out[static_cast<std::size_t>(c)] = range(samples, a, b);
    }
    return out;
}

}  // namespace earmark
