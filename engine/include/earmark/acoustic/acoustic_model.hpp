// A trained HMM acoustic model in the CMU Sphinx file layout, read directly.
//
// Debian's `pocketsphinx-en-us` ships a US-English model trained on recorded
// speech (BSD licence) in this layout: a model folder holding `mdef` (phone
// set, triphones and their tied states, binary "BMDF" form), `means` and
// `variances` (Gaussian codebooks), `sendump` (8-bit quantised mixture
// weights) or `mixture_weights` (float), `transition_matrices` and
// `feat.params` (the front end it was trained with). We read the files
// ourselves instead of driving the recogniser's decoder so that forced
// alignment, phone segmentation and per-frame scores for pronunciation
// scoring are plain engine code with bounded memory (see forced_alignment.hpp).
//
// Model kinds: continuous (one codebook per tied state), phonetically tied
// (one codebook per base phone, "ptm") and semi-continuous (one shared
// codebook) are told apart by the number of codebooks. Each HMM has three
// emitting states, left to right, with the transitions of its matrix.
//
// Units: log-likelihoods in nats (natural log). Thread-safety: immutable
// after loading; share one instance between threads.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>
#include <unordered_map>
#include <vector>

namespace earmark {

// The front end a model was trained with (from `feat.params`, with the
// recogniser's documented defaults for what the file leaves out).
struct ModelFrontEnd {
    double sampleRateHz = 16000.0;
    double lowerHz = 133.33334;
    double upperHz = 6855.4976;
    int filters = 40;
    int cepstra = 13;
    int lifter = 0;                 // sinusoidal liftering parameter, 0 = none
    double windowSeconds = 0.025625;
    int framesPerSecond = 100;
    int fftSize = 512;
    double preemphasis = 0.97;
    bool dither = true;             // add ±1 step of 16-bit noise (seeded) so digital silence stays finite
    bool batchCmn = true;           // subtract the take's mean cepstrum ("current"/"batch")
    std::vector<int> streamSizes{13, 13, 13};  // feature streams: cepstra, deltas, double deltas
};

// Word position of a triphone, as the model's triphone table tells them apart.
enum class WordPosition : std::uint8_t { Internal = 0, Begin = 1, End = 2, Single = 3 };

class AcousticModel {
public:
    static constexpr int kStates = 3;  // emitting states per phone

    // Reads the model in `folder`. Throws InputError naming the file for a
    // missing file, a wrong header, a size that does not match, or numbers
    // that are not finite.
    static AcousticModel load(const std::filesystem::path& folder);

    // The folder of Debian's pocketsphinx-en-us model, if installed.
    static std::optional<std::filesystem::path> installedEnglishModel();
    // The pronouncing dictionary shipped beside it, if installed.
    static std::optional<std::filesystem::path> installedEnglishDictionary();

    const ModelFrontEnd& frontEnd() const { return frontEnd_; }
    const std::filesystem::path& folder() const { return folder_; }

    // Base (context-independent) phones.
    int basePhoneCount() const { return static_cast<int>(basePhones_.size()); }
    const std::string& basePhoneName(int phone) const { return basePhones_.at(static_cast<std::size_t>(phone)); }
    std::optional<int> basePhone(const std::string& name) const;
    bool isFiller(int basePhone) const { return filler_.at(static_cast<std::size_t>(basePhone)); }
    int silencePhone() const { return silence_; }

    // The model (triphone or, failing that, base phone) for `base` between
    // `left` and `right` (base phone ids; -1 = unknown context) at `position`.
    // Backs off to other word positions, then to the base phone.
    int phoneModel(int base, int left, int right, WordPosition position) const;
    int phoneModelCount() const { return static_cast<int>(phoneStates_.size()); }
    const std::array<int, kStates>& states(int model) const { return phoneStates_.at(static_cast<std::size_t>(model)); }
    int basePhoneOf(int model) const { return phoneBase_.at(static_cast<std::size_t>(model)); }
    // log transition probabilities of a model: row = from emitting state
    // (0..2), column = to state (0..2, 3 = exit); -inf where not allowed.
    const std::array<std::array<float, kStates + 1>, kStates>& transitions(int model) const;

    // Tied states (senones).
    int senoneCount() const { return static_cast<int>(senoneCodebook_.size()); }
    int codebookCount() const { return codebooks_; }
    int codebookOf(int senone) const { return senoneCodebook_[static_cast<std::size_t>(senone)]; }
    int densities() const { return densities_; }
    int streams() const { return static_cast<int>(frontEnd_.streamSizes.size()); }
    int featureSize() const { return featureSize_; }

    // Gaussian parameters of (codebook, stream, density), prepared for
    // scoring: log N(x) = logConst - 0.5 * sum_k (x_k - mean_k)^2 * precision_k.
    const float* mean(int codebook, int stream, int density) const;
    const float* precision(int codebook, int stream, int density) const;
    float logConst(int codebook, int stream, int density) const;
    // The same parameters laid out for scoring all densities of a codebook's
    // stream at once: element [k · densities + d] is dimension k of density d.
    struct GaussianBlock {
        const float* meanT;
        const float* precisionT;
        const float* logConst;  // per density
    };
    GaussianBlock block(int codebook, int stream) const {
        const std::size_t off = gaussianOffset(codebook, stream, 0);
        const std::size_t c = (static_cast<std::size_t>(codebook) * static_cast<std::size_t>(streams()) +
                               static_cast<std::size_t>(stream)) *
                              static_cast<std::size_t>(densities_);
        return {meansT_.data() + off, precisionsT_.data() + off, logConsts_.data() + c};
    }
    // log mixture weight of `density` in `stream` of `senone`.
    float logWeight(int senone, int stream, int density) const {
        return logWeights_[(static_cast<std::size_t>(senone) * streams() + static_cast<std::size_t>(stream)) *
                               static_cast<std::size_t>(densities_) + static_cast<std::size_t>(density)];
    }

private:
    std::filesystem::path folder_;
    ModelFrontEnd frontEnd_;
    std::vector<std::string> basePhones_;
    std::vector<bool> filler_;
    int silence_ = -1;
    std::unordered_map<std::uint64_t, int> triphones_;
    std::vector<std::array<int, kStates>> phoneStates_;
    std::vector<int> phoneBase_;
    std::vector<int> phoneTmat_;
    std::vector<std::array<std::array<float, kStates + 1>, kStates>> tmats_;
    std::vector<int> senoneCodebook_;
    int codebooks_ = 0;
    int densities_ = 0;
    int featureSize_ = 0;
    std::vector<int> streamOffset_;
    std::vector<float> means_;       // [codebook][stream][density][dim of stream]
    std::vector<float> precisions_;  // same layout
    std::vector<float> logConsts_;   // [codebook][stream][density]
    std::vector<float> meansT_, precisionsT_;  // [codebook][stream][dim of stream][density]
    std::vector<float> logWeights_;  // [senone][stream][density]

    std::size_t gaussianOffset(int codebook, int stream, int density) const;
    friend struct AcousticModelReader;
};

}  // namespace earmark
