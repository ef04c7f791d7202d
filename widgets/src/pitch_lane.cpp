#include "earmark/widgets/pitch_lane.hpp"

#include <qcustomplot.h>

#include <algorithm>
#include <cmath>
#include <limits>

namespace earmark::widgets {

ValueRange pitchAxisRange(const PitchSummary& s, PitchUnit unit) {
    if (!s.medianHz || !s.p5Hz || !s.p95Hz)
        return unit == PitchUnit::Hertz ? ValueRange{50.0, 400.0} : ValueRange{-12.0, 12.0};
    if (unit == PitchUnit::Hertz) {
        // A fifth of the speaker's range as margin, and at least 40 Hz shown.
        double low = *s.p5Hz / 1.25, high = *s.p95Hz * 1.25;
        if (high - low < 40.0) {
            const double mid = 0.5 * (low + high);
            low = mid - 20.0;
            high = mid + 20.0;
        }
        return {std::max(0.0, std::floor(low / 10.0) * 10.0), std::ceil(high / 10.0) * 10.0};
    }
    const double lo = 12.0 * std::log2(*s.p5Hz / *s.medianHz);
    const double hi = 12.0 * std::log2(*s.p95Hz / *s.medianHz);
    // At least an octave shown, so a flat take looks flat.
    return {std::floor(std::min(lo - 3.0, -6.0)), std::ceil(std::max(hi + 3.0, 6.0))};
}

PitchLane::PitchLane(ViewState* view, QWidget* parent) : PlotLane("pitch", tr("Pitch"), view, parent) {
    QCustomPlot* p = plot();
    confidence_ = p->addGraph(p->xAxis, p->yAxis2);
    contour_ = p->addGraph(p->xAxis, p->yAxis);
    // Confidence is a low strip along the bottom quarter, under the contour.
    p->yAxis2->setRange(0.0, 4.0);
    p->yAxis2->setVisible(false);
    median_ = new QCPItemStraightLine(p);
    median_->setClipToAxisRect(true);
    median_->setVisible(false);
    medianLabel_ = new QCPItemText(p);
    medianLabel_->position->setTypeX(QCPItemPosition::ptAxisRectRatio);
    medianLabel_->position->setTypeY(QCPItemPosition::ptPlotCoords);
    medianLabel_->setPositionAlignment(Qt::AlignRight | Qt::AlignBottom);
    medianLabel_->setVisible(false);
    applyColours();
    rebuildPlot();
    connect(view, &ViewState::visibleRangeChanged, this, &PitchLane::fitConfidencePen);
}

void PitchLane::fitConfidencePen() {
    const auto& t = tracks();
    if (!t || !t->pitch) return;
    const double width = std::clamp(mapping().pixelsPerSecond() * t->pitch->hopSeconds, 1.0, 50.0);
    if (std::abs(width - confidenceWidth_) < 0.25) return;
    confidenceWidth_ = width;
    QPen pen = confidence_->pen();
    pen.setWidthF(std::ceil(width));
    confidence_->setPen(pen);
}

void PitchLane::setLook(const PitchLook& look) {
    if (look == look_) return;
    look_ = look;
    rebuildPlot();
}

void PitchLane::applyColours() {
    PlotLane::applyColours();
    if (!contour_) return;
    const LaneColours c = colours();
    contour_->setPen(QPen(c.pitch, 2.2, Qt::SolidLine, Qt::RoundCap, Qt::RoundJoin));
    contour_->setLineStyle(QCPGraph::lsLine);
    // Drawn as impulses (one vertical line per frame) rather than a filled
    // curve: QCustomPlot's fills cost ~300 ms per repaint on a 10-minute take,
    // impulses ~2 ms. The pen widens with the zoom so the strip stays solid.
    confidence_->setPen(QPen(c.confidence, confidenceWidth_, Qt::SolidLine, Qt::FlatCap));
    confidence_->setBrush(Qt::NoBrush);
    confidence_->setAntialiased(false);
    confidence_->setLineStyle(QCPGraph::lsImpulse);
    QColor m = c.faintText;
    m.setAlpha(160);
    median_->setPen(QPen(m, 1, Qt::DashLine));
    medianLabel_->setColor(c.faintText);
    medianLabel_->setFont(font());
}

void PitchLane::rebuildPlot() {
    QCustomPlot* p = plot();
    contour_->data()->clear();
    confidence_->data()->clear();
    median_->setVisible(false);
    medianLabel_->setVisible(false);
    const auto& t = tracks();
    const bool semitones = look_.unit == PitchUnit::Semitones;
    p->yAxis->setLabel(semitones ? tr("F0 (st re median)") : tr("F0 (Hz)"));
    setTitleText(tr("Pitch"));
    if (t && t->pitch) {
        const PitchTrack& pt = *t->pitch;
        const double median = t->pitchSummary.medianHz.value_or(100.0);
        const double nan = std::numeric_limits<double>::quiet_NaN();
        QVector<double> keys(static_cast<int>(pt.size())), values(keys.size()), conf(keys.size());
        for (std::size_t i = 0; i < pt.size(); ++i) {
            keys[i] = pt.timeSeconds(i);
            // NaN makes the plot break the line: nothing is drawn across unvoiced frames.
            values[i] = !pt.voiced(i) ? nan : semitones ? 12.0 * std::log2(pt.f0Hz[i] / median) : pt.f0Hz[i];
            conf[i] = i < pt.confidence.size() ? pt.confidence[i] : 0.0;
        }
        contour_->setData(keys, values, true);
        if (look_.confidence) confidence_->setData(keys, conf, true);
        if (t->pitchSummary.medianHz) {
            const double y = semitones ? 0.0 : median;
            median_->point1->setCoords(0.0, y);
            median_->point2->setCoords(1.0, y);
            median_->setVisible(true);
            medianLabel_->position->setCoords(0.995, y);
            medianLabel_->setText(tr("median %1 Hz").arg(median, 0, 'f', 0));
            medianLabel_->setVisible(true);
        }
    }
    fitConfidencePen();
    const ValueRange r = pitchAxisRange(t ? t->pitchSummary : PitchSummary{}, look_.unit);
    p->yAxis->setRange(r.low, r.high);
    replotSoon();
}

QString PitchLane::describePoint(QPoint pos) const {
    if (!tracks() || !tracks()->pitch) return {};
    const double v = plot()->yAxis->pixelToCoord(pos.y());
    return look_.unit == PitchUnit::Semitones ? tr("pointer %1 st").arg(v, 0, 'f', 1)
                                              : tr("pointer %1 Hz").arg(v, 0, 'f', 0);
}

}  // namespace earmark::widgets
