#include "earmark/acoustic/senone_scorer.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <limits>

namespace earmark {

CodebookTopCache::CodebookTopCache(const AcousticModel& model, std::size_t frames, int topDensities)
    : codebooks_(static_cast<std::size_t>(model.codebookCount())),
      frames_(frames),
      block_(static_cast<std::size_t>(model.streams() * std::clamp(topDensities, 1, model.densities()))),
      top_(std::clamp(topDensities, 1, model.densities())) {
    const std::size_t cells = frames_ * codebooks_;
    if (cells == 0 || cells * (block_ * sizeof(TopDensity) + 1) > kMaxBytes) return;
    filled_.assign(cells, 0);
    tops_.resize(cells * block_);
}

std::size_t CodebookTopCache::index(std::size_t frame, int codebook) const {
    return frame * codebooks_ + static_cast<std::size_t>(codebook);
}

const TopDensity* CodebookTopCache::find(std::size_t frame, int codebook) const {
    if (!enabled() || frame >= frames_) return nullptr;
    const std::size_t i = index(frame, codebook);
    return filled_[i] ? tops_.data() + i * block_ : nullptr;
}

TopDensity* CodebookTopCache::keep(std::size_t frame, int codebook) {
    if (!enabled() || frame >= frames_) return nullptr;
    const std::size_t i = index(frame, codebook);
    filled_[i] = 1;
    return tops_.data() + i * block_;
}

SenoneScorer::SenoneScorer(const AcousticModel& model, const ModelFeatures& features, int topDensities,
                           CodebookTopCache* cache)
    : model_(model), features_(features), top_(std::clamp(topDensities, 1, model.densities())), cache_(cache) {
    if (cache_ && cache_->topDensities() != top_)
        throw ParamError("SenoneScorer.cache", "was built for a different number of top densities");
    codebookStamp_.assign(static_cast<std::size_t>(model.codebookCount()), 0);
    codebookTop_.resize(static_cast<std::size_t>(model.codebookCount() * model.streams() * top_));
    senoneStamp_.assign(static_cast<std::size_t>(model.senoneCount()), 0);
    senoneScore_.assign(static_cast<std::size_t>(model.senoneCount()), 0.0f);
    scratch_.resize(static_cast<std::size_t>(model.densities()));
}

void SenoneScorer::setFrame(std::size_t frame) { frame_ = frame; }

void SenoneScorer::evaluateCodebook(int cb) {
    const std::size_t block = static_cast<std::size_t>(model_.streams() * top_);
    TopDensity* mine = codebookTop_.data() + static_cast<std::size_t>(cb) * block;
    if (const TopDensity* kept = cache_ ? cache_->find(frame_, cb) : nullptr) {
        std::memcpy(mine, kept, block * sizeof(TopDensity));
    } else {
        computeCodebook(cb, mine);
        if (TopDensity* slot = cache_ ? cache_->keep(frame_, cb) : nullptr)
            std::memcpy(slot, mine, block * sizeof(TopDensity));
    }
    codebookStamp_[static_cast<std::size_t>(cb)] = static_cast<std::uint32_t>(frame_ + 1);
}

void SenoneScorer::computeCodebook(int cb, TopDensity* out) {
    const float* x = features_.frame(frame_);
    const auto& sizes = model_.frontEnd().streamSizes;
    int offset = 0;
    for (int s = 0; s < model_.streams(); ++s) {
        const int dim = sizes[static_cast<std::size_t>(s)];
        const float* xs = x + offset;
        // All densities at once, dimension by dimension (vectorises).
        const AcousticModel::GaussianBlock g = model_.block(cb, s);
        const int nd = model_.densities();
        float* acc = scratch_.data();
        for (int d = 0; d < nd; ++d) acc[d] = 0.0f;
        for (int k = 0; k < dim; ++k) {
            const float xk = xs[k];
            const float* mu = g.meanT + static_cast<std::size_t>(k) * static_cast<std::size_t>(nd);
            const float* prec = g.precisionT + static_cast<std::size_t>(k) * static_cast<std::size_t>(nd);
            for (int d = 0; d < nd; ++d) {
                const float diff = xk - mu[d];
                acc[d] += diff * diff * prec[d];
            }
        }
        for (int d = 0; d < nd; ++d) acc[d] = g.logConst[d] - 0.5f * acc[d];
        TopDensity* top = out + static_cast<std::size_t>(s) * static_cast<std::size_t>(top_);
        for (int k = 0; k < top_; ++k) top[k] = {-1, -std::numeric_limits<float>::infinity()};
        for (int d = 0; d < model_.densities(); ++d) {
            const float v = scratch_[static_cast<std::size_t>(d)];
            if (v <= top[top_ - 1].logLikelihood) continue;
            int k = top_ - 1;
            while (k > 0 && top[k - 1].logLikelihood < v) {
                top[k] = top[k - 1];
                --k;
            }
            top[k] = {d, v};
        }
        offset += dim;
    }
}

float SenoneScorer::score(int senone) {
    const auto si = static_cast<std::size_t>(senone);
    const auto stamp = static_cast<std::uint32_t>(frame_ + 1);
    if (senoneStamp_[si] == stamp) return senoneScore_[si];
    const int cb = model_.codebookOf(senone);
    if (codebookStamp_[static_cast<std::size_t>(cb)] != stamp) evaluateCodebook(cb);
    float total = 0;
    for (int s = 0; s < model_.streams(); ++s) {
        const TopDensity* top = codebookTop_.data() + (static_cast<std::size_t>(cb) * static_cast<std::size_t>(model_.streams()) +
                                                static_cast<std::size_t>(s)) *
                                                   static_cast<std::size_t>(top_);
        float best = -std::numeric_limits<float>::infinity();
        float terms[64];
        const int n = std::min(top_, 64);
        for (int k = 0; k < n; ++k) {
            terms[k] = top[k].density < 0 ? -std::numeric_limits<float>::infinity()
                                          : top[k].logLikelihood + model_.logWeight(senone, s, top[k].density);
            best = std::max(best, terms[k]);
        }
        float sum = 0;
        for (int k = 0; k < n; ++k) sum += std::exp(terms[k] - best);
        total += best + std::log(sum);
    }
    senoneStamp_[si] = stamp;
    senoneScore_[si] = total;
    return total;
}

std::vector<float> contextFreeScores(const AcousticModel& model, const ModelFeatures& features) {
    const std::size_t perFrame = static_cast<std::size_t>(model.basePhoneCount()) * AcousticModel::kStates;
    std::vector<float> out(features.frames * perFrame);
    SenoneScorer scorer(model, features);
    for (std::size_t t = 0; t < features.frames; ++t) {
        scorer.setFrame(t);
        for (int p = 0; p < model.basePhoneCount(); ++p)
            for (int j = 0; j < AcousticModel::kStates; ++j)
                out[t * perFrame + static_cast<std::size_t>(p * AcousticModel::kStates + j)] =
                    scorer.score(model.states(p)[static_cast<std::size_t>(j)]);
    }
    return out;
}

}  // namespace earmark
