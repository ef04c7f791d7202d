// Reference speech: text read aloud by libespeak-ng, with the renderer's own
// word and phoneme events (where each word and phone starts).
//
// This is the "reference" of text-to-audio alignment: the aligner renders the
// text, then warps the reference onto the take (see text_aligner.hpp).
//
// libespeak-ng keeps global state and is not re-entrant: every call here
// runs under one process-wide mutex, so renderSpeech is thread-safe but
// calls are serialised. The library is started once per process (synchronous
// output, phoneme events with IPA names) and never stopped.
#pragma once

#include "earmark/core/signal.hpp"

#include <cstddef>
#include <string>
#include <vector>

namespace earmark {

struct SpeechParams {
    // An espeak-ng voice name or language tag, optionally with a variant
    // after '+': "en-us", "en-gb-x-rp", "en+f3", "de".
    std::string voice = "en-us";
    int rateWpm = 175;  // speaking rate, words per minute, 80…450 (175 is espeak-ng's normal)
    int pitch = 50;     // base pitch, 0…99 (50 is the voice's normal)
    int pitchRange = 50;  // intonation range, 0…99 (0 = monotone, 50 = the voice's normal)
    // Throws ParamError("SpeechParams.rateWpm" / ".pitch" / ".pitchRange" / ".voice") when out of range or empty.
    void validate() const;
};

struct SpeechEvent {
    enum class Kind {
        Word,     // start of a word as the renderer reads it ("42" gives two: forty, two)
        Phoneme,  // start of a phone; an empty name is a pause
    };
    Kind kind = Kind::Word;
    double timeS = 0.0;         // seconds from the start of `audio` (1 ms resolution, the renderer's)
    std::size_t textBegin = 0;  // byte offset in the UTF-8 text of the character the event points at
    std::size_t textEnd = 0;    // Word: byte offset just past the word's characters; Phoneme: = textBegin
    std::string phoneme;        // Phoneme: IPA (UTF-8, at most 8 bytes), empty for a pause
};

struct RenderedSpeech {
    Signal audio;                     // mono, the renderer's rate (22 050 Hz for the stock voices), full scale 1.0
    std::vector<SpeechEvent> events;  // in the order reported (time order)
    std::string voiceName;            // as espeak-ng names the voice it chose, e.g. "English (America)"
    std::string language;             // its language tag, e.g. "en-us"
};

// Renders `text` (UTF-8, plain text: no SSML, no phoneme input). Word events
// of zero length (clause ends) are dropped. Throws ParamError for invalid
// params or a voice espeak-ng does not have, InputError("text", …) for text
// that is not valid UTF-8, and Error("espeak-ng", …) when the library cannot
// start (its data files are missing) or fails.
RenderedSpeech renderSpeech(const std::string& text, const SpeechParams& params = {});

// The phonemes espeak-ng reads for `text` in `voice`, as IPA (UTF-8), words
// separated by spaces, with stress marks. Numbers and abbreviations come out
// as the renderer speaks them. Same errors and locking as renderSpeech.
std::string textToIpa(const std::string& text, const std::string& voice);

}  // namespace earmark
