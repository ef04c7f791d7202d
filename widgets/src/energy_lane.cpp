#include "earmark/widgets/energy_lane.hpp"

#include <qcustomplot.h>

#include <algorithm>

namespace earmark::widgets {

EnergyLane::EnergyLane(ViewState* view, QWidget* parent) : PlotLane("energy", tr("Energy"), view, parent) {
    QCustomPlot* p = plot();
    floor_ = p->addGraph();
    level_ = p->addGraph();
    level_->setChannelFillGraph(floor_);
    p->yAxis->setLabel(tr("RMS (dBFS)"));
    p->yAxis->setRange(lowestDb - 3.0, 3.0);  // a little room so the end labels are not cut
    p->yAxis->setTicker(QSharedPointer<QCPAxisTickerFixed>::create());
    p->yAxis->ticker().dynamicCast<QCPAxisTickerFixed>()->setTickStep(20.0);
    applyColours();
    rebuildPlot();
}

void EnergyLane::applyColours() {
    PlotLane::applyColours();
    if (!level_) return;
    const LaneColours c = colours();
    level_->setPen(QPen(c.energy, 1.5));
    QColor fill = c.energy;
    fill.setAlpha(60);
    level_->setBrush(fill);
    floor_->setPen(Qt::NoPen);
}

void EnergyLane::rebuildPlot() {
    level_->data()->clear();
    floor_->data()->clear();
    const auto& t = tracks();
    if (t && t->energy) {
        const EnergyTrack& e = *t->energy;
        QVector<double> keys(static_cast<int>(e.db.size())), values(keys.size());
        for (std::size_t i = 0; i < e.db.size(); ++i) {
            keys[i] = i * e.hopSeconds;
            values[i] = std::max<double>(e.db[i], lowestDb);
        }
        level_->setData(keys, values, true);
        floor_->setData(QVector<double>{0.0, keys.isEmpty() ? 0.0 : keys.back()},
                        QVector<double>{lowestDb, lowestDb}, true);
    }
    replotSoon();
}

QString EnergyLane::describePoint(QPoint pos) const {
    if (!tracks() || !tracks()->energy) return {};
    return tr("pointer %1 dBFS").arg(plot()->yAxis->pixelToCoord(pos.y()), 0, 'f', 1);
}

}  // namespace earmark::widgets
