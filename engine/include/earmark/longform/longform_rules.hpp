// Thresholds of the long-form findings. They are sections of the scan's
// rules file (rules.hpp; defaults in docs/rules-default.json, meanings in
// docs/longform.md). Every threshold is common practice (a rule of thumb
// with no single published source) unless docs/longform.md names one.
#pragma once

namespace earmark {

struct LongformRules {
    // section "longform"
    double windowSeconds = 20.0;         // window of the per-window measures
    double windowHopSeconds = 5.0;       // its step
    double minTakeSeconds = 30.0;        // shorter takes are refused by the long-form command
    double scanMinTakeSeconds = 120.0;   // the scan adds long-form findings to takes at least this long
    double driftMinSpanSeconds = 60.0;   // a drift must hold over at least this long

    struct Seam {                        // section "seam"
        bool enabled = true;
        double contextSeconds = 8.0;     // speech compared on each side of a join
        double levelStepDb = 3.0;        // speech level step across a join
        double roomToneStepDb = 8.0;     // background level step between the pause halves
        double clickDb = 30.0;           // sample-difference peak over its neighbourhood
        double envelopeJump = 4.0;       // spectral-envelope divergence over the median join's
    } seam;
    struct Drift {
        bool enabled = true;
        double minChange = 0.0;
    };
    Drift levelDrift{true, 3.0};         // section "level_drift": dB (loudness)
    Drift pitchDrift{true, 2.0};         // section "pitch_drift": semitones (F0 median)
    Drift rateDrift{true, 10.0};         // section "rate_drift": percent (articulation rate)
    struct TimbreShift {                 // section "timbre_shift"
        bool enabled = true;
        double minRatio = 3.0;           // a stretch's distance to the take's voice over the typical one
        double minSeconds = 8.0;         // shortest stretch
    } timbreShift;
    struct Monotone {                    // section "monotone_stretch"
        bool enabled = true;
        double maxRangeSt = 4.0;         // 12·log2(p95/p5) of F0 below this is monotone
        double minSeconds = 15.0;        // shortest stretch
    } monotone;
};

}  // namespace earmark
