#include "earmark/widgets/plot_lane.hpp"

#include "earmark/widgets/axis_painting.hpp"

#include <QVBoxLayout>

#include <qcustomplot.h>

namespace earmark::widgets {

PlotLane::PlotLane(const QString& id, const QString& title, ViewState* view, QWidget* parent)
    : Lane(id, title, view, parent) {
    setHostsChild(true);
    setMinimumHeight(70);
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    plot_ = new QCustomPlot(this);
    plot_->setAttribute(Qt::WA_TransparentForMouseEvents);
    plot_->setNoAntialiasingOnDrag(true);
    plot_->setPlottingHints(QCP::phCacheLabels);
    layout->addWidget(plot_);
    QCPAxisRect* rect = plot_->axisRect();
    rect->setAutoMargins(QCP::msNone);
    // Room above and below so the end tick labels are not cut off.
    rect->setMargins(QMargins(gutterWidth, 6, rightMargin, 6));
    plot_->xAxis->setTickLabels(false);
    plot_->xAxis->setTicker(QSharedPointer<QCPAxisTickerFixed>::create());
    plot_->xAxis2->setVisible(false);
    plot_->yAxis->setPadding(2);
    plot_->yAxis->setLabelPadding(2);
    titleItem_ = new QCPItemText(plot_);
    titleItem_->setClipToAxisRect(false);
    titleItem_->position->setType(QCPItemPosition::ptAbsolute);
    titleItem_->position->setCoords(gutterWidth + 4, 3);
    titleItem_->setPositionAlignment(Qt::AlignLeft | Qt::AlignTop);
    titleItem_->setPadding(QMargins(5, 1, 5, 1));
    titleItem_->setLayer(QStringLiteral("overlay"));
    titleItem_->setText(title);
    raiseOverlay();
    connect(view, &ViewState::visibleRangeChanged, this, &PlotLane::followRange);
    applyColours();
    followRange();
}

void PlotLane::setTitleText(const QString& text) { titleItem_->setText(text); }

void PlotLane::setTake(TakeAudioPtr audio) {
    Lane::setTake(std::move(audio));
    rebuildPlot();
    followRange();
}

void PlotLane::setTracks(TakeTracksPtr t) {
    Lane::setTracks(std::move(t));
    rebuildPlot();
    followRange();
}

void PlotLane::replotSoon() { plot_->replot(QCustomPlot::rpQueuedReplot); }

void PlotLane::followRange() {
    const TimeMapping m = mapping();
    if (!(m.range.span() > 0)) return;
    plot_->xAxis->setRange(m.range.start, m.range.end);
    auto ticker = plot_->xAxis->ticker().dynamicCast<QCPAxisTickerFixed>();
    if (ticker) ticker->setTickStep(majorTimeStep(m));
    replotSoon();
}

void PlotLane::applyColours() {
    const LaneColours c = colours();
    plot_->setBackground(c.background);
    for (QCPAxis* axis : {plot_->xAxis, plot_->yAxis, plot_->yAxis2}) {
        axis->setBasePen(QPen(c.faintText));
        axis->setTickPen(QPen(c.faintText));
        axis->setSubTickPen(Qt::NoPen);
        axis->setTickLabelColor(c.text);
        axis->setLabelColor(c.faintText);
        axis->setTickLabelFont(font());
        axis->setLabelFont(font());
        axis->grid()->setPen(QPen(c.grid, 1));
        axis->grid()->setZeroLinePen(Qt::NoPen);
    }
    plot_->xAxis->setBasePen(Qt::NoPen);
    plot_->xAxis->setTickPen(Qt::NoPen);
    QFont bold = font();
    bold.setBold(true);
    titleItem_->setFont(bold);
    titleItem_->setColor(c.text);
    QColor chip = c.background;
    chip.setAlpha(200);
    titleItem_->setBrush(chip);
    titleItem_->setPen(Qt::NoPen);
    replotSoon();
}

void PlotLane::changeEvent(QEvent* e) {
    Lane::changeEvent(e);
    if (e->type() == QEvent::PaletteChange || e->type() == QEvent::FontChange) {
        applyColours();
        rebuildPlot();
    }
}

}  // namespace earmark::widgets
