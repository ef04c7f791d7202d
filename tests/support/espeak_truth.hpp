// Word times of an espeak-ng rendering as truth for aligners: where the
// renderer itself started and ended each word of the text it read.
#pragma once

#include "earmark/align/speech_render.hpp"

#include <string>
#include <vector>

namespace earmark::test {

// Truth words from the rendering's raw events: a token's first word event
// starts it; it ends at the first event after its last sounding phoneme.
// The renderer sometimes reads a short word with the one before ("on the")
// under one event: such a truth word spans tokens first…last (tokens are
// the text's white-space separated pieces, counted from 0), and only its
// outer boundaries are known. Times in seconds from the rendering's start.
struct TruthWord {
    int firstToken = 0, lastToken = 0;
    double startS = 0.0, endS = 0.0;
};

std::vector<TruthWord> truthWords(const std::string& text, const RenderedSpeech& speech);

// Linear-interpolated quantile q (0…1) of v (not empty).
double percentile(std::vector<double> v, double q);

}  // namespace earmark::test
