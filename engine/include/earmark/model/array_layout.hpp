// Telling which way round a model's 2-D output is stored.
//
// A model's arrays are often saved with a leading batch axis of size 1;
// those axes are dropped, what remains must be 2-D. The orientation is told
// from a known size (band count, token count); when both axes have that
// size the file alone cannot say, and readers throw AmbiguousLayout so the
// caller can ask the user to choose.
#pragma once

#include "earmark/core/error.hpp"

namespace earmark {

// An InputError whose subject is the file; the problem names the shape and
// both readings. Callers offer a way to choose (a command-line flag).
class AmbiguousLayout : public InputError {
public:
    using InputError::InputError;
};

}  // namespace earmark
