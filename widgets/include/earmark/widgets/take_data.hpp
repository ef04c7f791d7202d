// What the lanes show of one take, as immutable values shared between the
// loader's worker thread and the lanes (std::shared_ptr<const …>).
//
// TakeAudio arrives first (samples and the waveform summary: the waveform can
// be drawn at once); TakeTracks follows when the analysis is done.
#pragma once

#include "earmark/analysis/take_analysis.hpp"
#include "earmark/spectral/spectrogram.hpp"
#include "earmark/view/waveform_summary.hpp"

#include <QImage>
#include <QMetaType>
#include <QString>

#include <memory>
#include <optional>

namespace earmark::widgets {

struct TakeAudio {
    QString path;
    AudioInfo info;
    Signal signal;             // mono
    WaveformSummary summary;   // built from signal.samples

    double duration() const { return signal.durationSeconds(); }
};

// A spectrogram ready to draw: its values (for read-outs) and an 8-bit indexed
// image of them. Image column i is frame i; row 0 is the highest bin. Index k
// stands for the level (k / 2 − 127.5) dB relative to `peakDb`, so a colour
// table maps levels to colours and the floor and range of the colour scale
// change without touching the pixels.
struct SpectrogramView {
    Spectrogram data;  // values in dB
    double peakDb = 0.0;
    QImage image;      // Format_Indexed8, frames × bins
    // Narrower copies for zoomed-out views: level k is 2^k frames per column,
    // each column the maximum of the columns it covers (so short bursts stay
    // visible), levels[0] is `image`. A repaint scales at most 2 columns into
    // a pixel instead of thousands.
    std::vector<QImage> levels;

    static constexpr double dbPerIndex = 0.5;
    static constexpr double lowestRelativeDb = -127.5;
    static SpectrogramView make(Spectrogram s);  // throws nothing; empty input → null image

    // Level at time t (s) in bin `bin`, in dB re peakDb; empty outside the data.
    std::optional<double> relativeDbAt(double t, int bin) const;
    int frameAt(double t) const;  // nearest frame, or −1 outside
};

struct TakeTracks {
    std::optional<PitchTrack> pitch;
    PitchSummary pitchSummary;
    std::optional<EnergyTrack> energy;
    std::optional<SpectrogramView> mel;
    std::optional<SpectrogramView> linear;
    QString melProblem;  // why there is no mel spectrogram (e.g. too many bands for the FFT)
    std::optional<double> loudnessLufs;
    SampleStats sampleStats;

    // Nearest-frame look-ups for read-outs; empty when unvoiced or outside.
    std::optional<double> f0At(double t) const;
    std::optional<double> confidenceAt(double t) const;
    std::optional<double> energyDbAt(double t) const;
};

using TakeAudioPtr = std::shared_ptr<const TakeAudio>;
using TakeTracksPtr = std::shared_ptr<const TakeTracks>;

}  // namespace earmark::widgets

Q_DECLARE_METATYPE(earmark::widgets::TakeAudioPtr)
Q_DECLARE_METATYPE(earmark::widgets::TakeTracksPtr)
