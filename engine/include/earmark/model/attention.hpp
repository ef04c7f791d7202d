// A sequence-to-sequence model's attention (alignment) matrix: for every
// decoder frame, a weight per input token. Read from a NumPy .npy file
// (export/npy.hpp; leading axes of size 1 dropped, model/array_layout.hpp)
// together with the list of input tokens.
//
// Pure functions; calls on different files may run concurrently.
#pragma once

#include <optional>
#include <string>
#include <vector>

namespace earmark {

struct AttentionMatrix {
    int frames = 0;              // decoder frames
    int tokens = 0;              // input tokens
    std::vector<float> weights;  // frames × tokens, frame-major
    float at(int frame, int token) const { return weights[static_cast<std::size_t>(frame) * tokens + token]; }
};

enum class AttentionLayout {
    Auto,            // the axis whose size is the token count holds the tokens
    FramesByTokens,  // shape (frames, tokens)
    TokensByFrames,  // shape (tokens, frames)
};
const char* attentionLayoutName(AttentionLayout layout);  // "auto", "frames-tokens", "tokens-frames"

// Reads the matrix; `tokenCount` is the length of the token list. Throws
// InputError(path, …) for an unreadable file, a shape without an axis of
// `tokenCount` (or, with a layout given, a token axis of another size),
// non-finite values; AmbiguousLayout(path, …) when both axes have
// `tokenCount` entries and no layout is given.
AttentionMatrix readAttentionNpy(const std::string& path, int tokenCount,
                                 AttentionLayout layout = AttentionLayout::Auto);

// The input tokens, in order: a JSON array of strings (the file's first
// non-blank character is '['), or else one token per line (UTF-8; a line
// end "\r\n" or "\n" is not part of the token; an empty line is an empty
// token; a final line end adds no token). Throws InputError(path, …) when
// the file cannot be read, the JSON is malformed or not all strings, or
// there are no tokens.
std::vector<std::string> readTokenList(const std::string& path);

}  // namespace earmark
