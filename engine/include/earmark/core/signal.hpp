// A mono float32 signal with its sample rate: what every analysis takes.
#pragma once

#include <cstddef>
#include <vector>

namespace earmark {

struct Signal {
    std::vector<float> samples;  // nominal range [-1, 1]; full scale = 1.0
    double sampleRate = 0.0;     // Hz

    std::size_t size() const { return samples.size(); }
    bool empty() const { return samples.empty(); }
    double durationSeconds() const {
        return sampleRate > 0 ? static_cast<double>(samples.size()) / sampleRate : 0.0;
    }
};

}  // namespace earmark
