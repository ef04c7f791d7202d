// A lane that hosts a QCustomPlot: the plot's axis rect is pinned to the
// lane's plotting area (same gutter as every other lane, so time axes line
// up), its x range follows the view state, its grid follows the ruler's ticks,
// and its colours follow the palette. Mouse events go to the lane (the plot
// is transparent to them), so clicking, selecting and zooming work as in every
// other lane.
#pragma once

#include "earmark/widgets/lane.hpp"

class QCustomPlot;
class QCPItemText;

namespace earmark::widgets {

class PlotLane : public Lane {
    Q_OBJECT
public:
    PlotLane(const QString& id, const QString& title, ViewState* view, QWidget* parent = nullptr);
    QCustomPlot* plot() const { return plot_; }
    void setTake(TakeAudioPtr audio) override;
    void setTracks(TakeTracksPtr tracks) override;

protected:
    // Fill the plot's graphs from tracks() (null: clear them) and set the y axis.
    virtual void rebuildPlot() = 0;
    virtual void applyColours();
    void setTitleText(const QString& text);
    void changeEvent(QEvent* event) override;
    void replotSoon();

private:
    void followRange();

    QCustomPlot* plot_ = nullptr;  // child widget
    QCPItemText* titleItem_ = nullptr;
};

}  // namespace earmark::widgets
