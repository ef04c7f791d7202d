// Word and phone tiers of a rendered reference, with word labels taken from
// the original text.
//
// The renderer reports where each word it speaks starts and which characters
// of the text it came from. The text is split into tokens (runs of
// non-space characters); every word event falls in one token, and the words
// the renderer makes of one token ("42" → forty two, "3.5" → three point
// five, "km/h") become one word labelled with that token, stripped of
// leading and trailing punctuation ("morning," → "morning"). Tokens the
// renderer does not speak (a lone dash) make no word. The renderer sometimes
// reads a short word together with the word before ("on the", "at it") and
// reports one word event for both; the phones of such a word are then
// shared out among its tokens in proportion to their letters (a heuristic:
// the renderer does not report that inner boundary).
//
// Times: a word starts at its first word event and ends where its last
// sounding phone ends; a phone ends at the next event of any kind (the next
// phone, a pause, the next word). The first phone of a word starts with the
// word, so a stop's closure belongs to it. Pauses (phoneme events without a
// name) are gaps in both tiers.
#pragma once

#include "earmark/align/speech_render.hpp"
#include "earmark/tiers/tier.hpp"

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace earmark {

struct ReferenceTiers {
    Tier words{std::string(kWordsTier), {}};
    Tier phones{std::string(kPhonesTier), {}};
    std::vector<std::size_t> phoneWord;  // index into words.intervals of each phone's word
};

// The label of a text token: the token without leading and trailing
// punctuation (ASCII punctuation and the common Unicode quotes, dashes,
// ellipsis, inverted marks), or the token itself if nothing would remain.
std::string tokenLabel(std::string_view token);

// Builds the tiers of `speech`, which must be renderSpeech(text, …).
// Words without any sounding phone are left out. Pure; never throws for
// output of renderSpeech.
ReferenceTiers referenceTiers(const std::string& text, const RenderedSpeech& speech);

}  // namespace earmark
