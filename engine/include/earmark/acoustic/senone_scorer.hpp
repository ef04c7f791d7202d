// Log-likelihoods of tied states (senones) of an acoustic model for one
// feature frame: per stream, the log-sum over the `topDensities` best
// Gaussians of the state's codebook weighted by its mixture weights
// (the usual top-N approximation of a Gaussian mixture), summed over streams.
// Codebooks are evaluated lazily, once per frame.
//
// Not thread-safe (it caches per frame); use one scorer per thread.
#pragma once

#include "earmark/acoustic/acoustic_model.hpp"
#include "earmark/acoustic/model_features.hpp"

#include <cstddef>
#include <cstdint>
#include <vector>

namespace earmark {

class SenoneScorer {
public:
    SenoneScorer(const AcousticModel& model, const ModelFeatures& features, int topDensities = 8);

    void setFrame(std::size_t frame);
    std::size_t frame() const { return frame_; }
    // log p(x_frame | senone), nats.
    float score(int senone);

private:
    struct Top {
        int density;
        float logLikelihood;
    };
    void evaluateCodebook(int codebook);

    const AcousticModel& model_;
    const ModelFeatures& features_;
    int top_;
    std::size_t frame_ = 0;
    std::vector<std::uint32_t> codebookStamp_;  // frame+1 when evaluated
    std::vector<Top> codebookTop_;               // [codebook][stream][top]
    std::vector<std::uint32_t> senoneStamp_;
    std::vector<float> senoneScore_;
    std::vector<float> scratch_;
};

// log-likelihoods of every context-independent state (the first
// 3 × base-phone states of the model) for every frame: frames × (3·phones).
std::vector<float> contextFreeScores(const AcousticModel& model, const ModelFeatures& features);

}  // namespace earmark
