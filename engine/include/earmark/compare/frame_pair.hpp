// One step of an alignment between two takes: frame `a` of take A matched
// with frame `b` of take B (frame i centred at i·hop, DESIGN.md).
#pragma once

namespace earmark {

struct FramePair {
    int a = 0;
    int b = 0;
};

}  // namespace earmark
