// Goodness of pronunciation (GOP) of aligned phones, after Witt & Young
// (2000), Speech Communication 30(2–3):95–108: the log-likelihood of a
// phone's frames under the expected phone, less the log-likelihood of the
// best free phone sequence over the same frames, divided by the number of
// frames. Both terms use the model's context-free phones: the expected
// phone's HMM forced through the stretch, and a phone loop (any phone after
// any other, a fixed insertion penalty per phone) for the best free match.
//
// Score in nats per frame, <= 0 up to the loop's insertion penalties: 0 means
// no phone explains the frames better than the expected one; the more
// negative, the further off. The loop's best phones are returned too, so a
// listener can see what was heard instead.
#pragma once

#include "earmark/acoustic/acoustic_model.hpp"

#include <cstddef>
#include <vector>

namespace earmark {

struct PhoneScore {
    double score = 0.0;        // GOP, nats per frame
    std::vector<int> heard;    // base phones of the best free sequence over the stretch
};

// Scores phone `expected` over frames [start, end) of `contextFree`
// (contextFreeScores of the take). An empty stretch scores 0.
PhoneScore scorePhone(const AcousticModel& model, const std::vector<float>& contextFree, int expected,
                      std::size_t start, std::size_t end, double insertionPenalty = 3.0);

// The same for a sequence of phones (a word's) forced through [start, end)
// one after the other, against the free loop given back one insertion
// penalty per expected phone. A stretch too short for the sequence scores
// -infinity.
PhoneScore scorePhones(const AcousticModel& model, const std::vector<float>& contextFree,
                       const std::vector<int>& expected, std::size_t start, std::size_t end,
                       double insertionPenalty = 3.0);

}  // namespace earmark
