// One artefact found by a detector (clicks.hpp, noise_bursts.hpp, buzz.hpp,
// dropouts.hpp): where it is and how strong, in the detector's own unit.
#pragma once

namespace earmark {

struct ArtefactEvent {
    double startS = 0.0;  // seconds from the start of the take
    double endS = 0.0;    // > startS
    double value = 0.0;   // the detector's measure (its header names the unit)
};

}  // namespace earmark
