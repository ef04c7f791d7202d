// The energy lane: short-time RMS level in dBFS over time.
#pragma once

#include "earmark/widgets/plot_lane.hpp"

class QCPGraph;

namespace earmark::widgets {

class EnergyLane : public PlotLane {
    Q_OBJECT
public:
    explicit EnergyLane(ViewState* view, QWidget* parent = nullptr);
    QSize sizeHint() const override { return QSize(400, 100); }
    QString describePoint(QPoint pos) const override;

    static constexpr double lowestDb = -80.0;  // bottom of the axis (dBFS)

protected:
    void rebuildPlot() override;
    void applyColours() override;

private:
    QCPGraph* floor_ = nullptr;
    QCPGraph* level_ = nullptr;
};

}  // namespace earmark::widgets
