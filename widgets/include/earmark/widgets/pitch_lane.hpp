// The pitch lane: the F0 contour in Hz, or in semitones relative to the
// take's median F0; no line crosses an unvoiced gap; optional shading of the
// pitch tracker's confidence; the y range follows the speaker's range (5th to
// 95th percentile of voiced F0, with a margin).
#pragma once

#include "earmark/widgets/plot_lane.hpp"

class QCPGraph;
class QCPItemStraightLine;
class QCPItemText;

namespace earmark::widgets {

enum class PitchUnit { Hertz, Semitones };

struct PitchLook {
    PitchUnit unit = PitchUnit::Hertz;
    bool confidence = true;
    bool operator==(const PitchLook&) const = default;
};

// The y range that shows a speaker's range in a unit: [low, high].
struct ValueRange {
    double low = 0.0, high = 1.0;
};
ValueRange pitchAxisRange(const PitchSummary& summary, PitchUnit unit);

class PitchLane : public PlotLane {
    Q_OBJECT
public:
    explicit PitchLane(ViewState* view, QWidget* parent = nullptr);
    QSize sizeHint() const override { return QSize(400, 150); }
    const PitchLook& look() const { return look_; }
    void setLook(const PitchLook& look);
    QString describePoint(QPoint pos) const override;

protected:
    void rebuildPlot() override;
    void applyColours() override;

private:
    void fitConfidencePen();

    PitchLook look_;
    double confidenceWidth_ = 1.0;  // px
    QCPGraph* confidence_ = nullptr;
    QCPGraph* contour_ = nullptr;
    QCPItemStraightLine* median_ = nullptr;
    QCPItemText* medianLabel_ = nullptr;
};

}  // namespace earmark::widgets
