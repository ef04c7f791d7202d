// Log-likelihoods of tied states (senones) of an acoustic model for one
// feature frame: per stream, the log-sum over the `topDensities` best
// Gaussians of the state's codebook weighted by its mixture weights
// (the usual top-N approximation of a Gaussian mixture), summed over streams.
// Codebooks are evaluated lazily, once per frame.
//
// A CodebookTopCache keeps those evaluations across scorers of the same
// features (the aligner's second pass reads what its first pass computed),
// within a fixed memory bound.
//
// Not thread-safe (it caches per frame); use one scorer per thread.
#pragma once

#include "earmark/acoustic/acoustic_model.hpp"
#include "earmark/acoustic/model_features.hpp"

#include <cstddef>
#include <cstdint>
#include <vector>

namespace earmark {

// One of the best densities of a codebook for a frame.
struct TopDensity {
    int density;          // -1: none
    float logLikelihood;  // nats
};

// The best densities of every codebook for every frame of one take, kept
// once evaluated. Holds nothing (enabled() false) when frames × codebooks
// would need more than kMaxBytes — about 250 s of take for the bundled
// model — so memory stays bounded on hour-long takes.
class CodebookTopCache {
public:
    static constexpr std::size_t kMaxBytes = std::size_t{64} << 20;
    CodebookTopCache(const AcousticModel& model, std::size_t frames, int topDensities);
    bool enabled() const { return !filled_.empty(); }
    int topDensities() const { return top_; }
    // The kept [stream][top] block of (frame, codebook), or nullptr.
    const TopDensity* find(std::size_t frame, int codebook) const;
    // Where to write that block; it counts as kept from now on.
    TopDensity* keep(std::size_t frame, int codebook);

private:
    std::size_t index(std::size_t frame, int codebook) const;
    std::size_t codebooks_ = 0, frames_ = 0, block_ = 0;
    int top_ = 0;
    std::vector<std::uint8_t> filled_;  // [frame][codebook]
    std::vector<TopDensity> tops_;      // [frame][codebook][stream][top]
};

class SenoneScorer {
public:
    static constexpr int kDefaultTopDensities = 8;
    // `cache` (optional, built with the same top) outlives the scorer.
    SenoneScorer(const AcousticModel& model, const ModelFeatures& features, int topDensities = kDefaultTopDensities,
                 CodebookTopCache* cache = nullptr);

    void setFrame(std::size_t frame);
    std::size_t frame() const { return frame_; }
    // log p(x_frame | senone), nats.
    float score(int senone);

private:
    void evaluateCodebook(int codebook);
    void computeCodebook(int codebook, TopDensity* out);

    const AcousticModel& model_;
    const ModelFeatures& features_;
    int top_;
    CodebookTopCache* cache_;
    std::size_t frame_ = 0;
    std::vector<std::uint32_t> codebookStamp_;  // frame+1 when evaluated
    std::vector<TopDensity> codebookTop_;        // [codebook][stream][top]
    std::vector<std::uint32_t> senoneStamp_;
    std::vector<float> senoneScore_;
    std::vector<float> scratch_;
};

// log-likelihoods of every context-independent state (the first
// 3 × base-phone states of the model) for every frame: frames × (3·phones).
std::vector<float> contextFreeScores(const AcousticModel& model, const ModelFeatures& features);

}  // namespace earmark
