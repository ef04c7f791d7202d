#include "earmark/widgets/model_mel_lane.hpp"

#include "earmark/widgets/colour_map.hpp"
#include "earmark/widgets/spectrogram_painting.hpp"

#include <QFileInfo>
#include <QPainter>

#include <algorithm>
#include <cmath>

namespace earmark::widgets {

ModelMelLane::ModelMelLane(ModelMelPart part, ViewState* view, QWidget* parent)
    : Lane(part == ModelMelPart::Predicted ? QStringLiteral("predicted-mel") : QStringLiteral("mel-difference"),
           part == ModelMelPart::Predicted ? tr("Predicted mel") : tr("Mel difference"), view, parent),
      part_(part) {}

void ModelMelLane::setModelMel(ModelMelPtr mel) {
    mel_ = std::move(mel);
    setToolTip(mel_ && !mel_->warnings.isEmpty() ? mel_->warnings.join('\n') : QString());
    invalidateContent();
}

SpectrogramLook ModelMelLane::audioLook() const {
    // Image indices are relative to the prediction's own peak; the scale is
    // relative to the audio's.
    SpectrogramLook l = look_;
    if (mel_) l.floorDb -= mel_->predicted.peakDb - mel_->audioPeakDb;
    return l;
}

void ModelMelLane::setLook(const SpectrogramLook& look) {
    if (look.floorDb == look_.floorDb && look.rangeDb == look_.rangeDb) return;
    look_ = look;
    if (part_ == ModelMelPart::Predicted) invalidateContent();
}

QVector<QRgb> ModelMelLane::differenceColourTable(const SpectrogramView& view, double scaleDb) {
    const auto& map = emberColourMap();
    QVector<QRgb> table(256);
    for (int k = 0; k < 256; ++k) {
        const double db = view.peakDb + SpectrogramView::lowestRelativeDb + k * SpectrogramView::dbPerIndex;
        const double f = std::clamp((db + scaleDb) / (2.0 * scaleDb), 0.0, 1.0);
        table[k] = map[static_cast<std::size_t>(std::lround(f * 255.0))];
    }
    return table;
}

const SpectrogramView* ModelMelLane::current() const {
    if (!mel_) return nullptr;
    const SpectrogramView& v = part_ == ModelMelPart::Predicted ? mel_->predicted : mel_->difference;
    return v.image.isNull() ? nullptr : &v;
}

double ModelMelLane::yOfHz(const SpectrogramView& v, double hz) const {
    const QRect plot = plotRect();
    return plot.bottom() + 1 - (bandOfHz(v.data.binCentresHz, hz) + 0.5) / v.data.bins * plot.height();
}

std::optional<double> ModelMelLane::valueAt(QPoint pos) const {
    const SpectrogramView* v = current();
    if (!v) return std::nullopt;
    const QRect plot = plotRect();
    if (!plot.contains(pos)) return std::nullopt;
    const double frac = (plot.bottom() + 1 - pos.y()) / static_cast<double>(plot.height());
    const int band = std::clamp(static_cast<int>(std::floor(frac * v->data.bins)), 0, v->data.bins - 1);
    const int frame = v->frameAt(timeAtX(pos.x()));
    if (frame < 0) return std::nullopt;
    return v->data.at(frame, band);
}

QString ModelMelLane::describePoint(QPoint pos) const {
    const SpectrogramView* v = current();
    const auto value = valueAt(pos);
    if (!v || !value) return {};
    const double frac = (plotRect().bottom() + 1 - pos.y()) / static_cast<double>(plotRect().height());
    const double hz = hzOfBand(v->data.binCentresHz, frac * v->data.bins - 0.5);
    const QString where = hz >= 1000 ? tr("%1 kHz").arg(hz / 1000.0, 0, 'f', 2) : tr("%1 Hz").arg(hz, 0, 'f', 0);
    if (part_ == ModelMelPart::Difference) return tr("%1, predicted − computed %2 dB").arg(where).arg(*value, 0, 'f', 1);
    return tr("%1, predicted %2 dB re the audio's peak").arg(where).arg(*value - mel_->audioPeakDb, 0, 'f', 1);
}

void ModelMelLane::drawContent(QPainter& p) {
    const LaneColours c = colours();
    const QRect plot = plotRect();
    const SpectrogramView* v = current();
    if (!v) {
        drawTitle(p, title());
        p.setPen(c.faintText);
        p.drawText(plot.adjusted(20, 0, -20, 0), Qt::AlignCenter | Qt::TextWordWrap,
                   tr("No predicted mel spectrogram open"));
        return;
    }
    const bool difference = part_ == ModelMelPart::Difference;
    p.fillRect(plot, difference ? QColor::fromRgb(emberColourMap()[127]) : QColor::fromRgb(duskColourMap()[0]));
    paintSpectrogramImage(p, *v, mapping(), plot,
                          difference ? differenceColourTable(*v, mel_->scaleDb) : SpectrogramLane::colourTable(audioLook()),
                          v->data.bins);
    const auto& centres = v->data.binCentresHz;
    drawVerticalAxis(p, *this,
                     bandAxisTicks(centres, centres.empty() ? 0.0 : centres.back(),
                                   [&](double hz) { return yOfHz(*v, hz); }, fontMetrics().height() * 1.6),
                     tr("frequency (Hz)"), false);

    QString label = difference ? tr("Predicted − computed mel · mean |Δ| %1 dB · largest %2 dB at %3 s")
                                     .arg(mel_->meanAbsDb, 0, 'f', 1)
                                     .arg(mel_->maxAbsDb, 0, 'f', 1)
                                     .arg(mel_->maxTimeS, 0, 'f', 2)
                               : tr("Predicted mel · %1 · %2 bands").arg(QFileInfo(mel_->path).fileName()).arg(v->data.bins);
    drawTitle(p, label);
    if (difference && !mel_->warnings.isEmpty()) {
        // The first warning, and how many more, along the plot's bottom edge.
        QString text = tr("⚠ %1").arg(mel_->warnings.front());
        if (mel_->warnings.size() > 1) text += tr(" (+%1 more: hover for all)").arg(mel_->warnings.size() - 1);
        const QRect band(plot.left(), plot.bottom() - fontMetrics().height() - 4, plot.width(), fontMetrics().height() + 4);
        p.fillRect(band, QColor(0, 0, 0, 150));
        p.setPen(QColor(255, 220, 120));
        p.drawText(band.adjusted(6, 0, -6, 0), Qt::AlignVCenter | Qt::AlignLeft,
                   fontMetrics().elidedText(text, Qt::ElideRight, band.width() - 12));
    }
    drawLegend(p, plot);
}

void ModelMelLane::drawLegend(QPainter& p, const QRect& plot) const {
    const bool difference = part_ == ModelMelPart::Difference;
    const int w = 120;
    const QRect bar = drawColourBar(p, plot, difference ? emberColourMap() : duskColourMap(), w);
    QFont f = font();
    f.setPointSizeF(f.pointSizeF() * 0.85);
    p.setFont(f);
    const QFontMetrics fm(f);
    const QRect textRect(bar.left() - 160, bar.bottom() + 2, w + 160, fm.height());
    auto shadowed = [&](const QRect& r, int align, const QString& text) { drawShadowedText(p, r, align, text); };
    if (difference) {
        const QRect under(bar.left(), bar.bottom() + 2, w, fm.height());
        shadowed(under, Qt::AlignLeft, tr("−%1").arg(mel_->scaleDb, 0, 'f', 0));
        shadowed(under, Qt::AlignHCenter, QStringLiteral("0"));
        shadowed(under, Qt::AlignRight, tr("+%1 dB").arg(mel_->scaleDb, 0, 'f', 0));
        shadowed(QRect(bar.left() - 160, bar.top() - 3, 154, fm.height()), Qt::AlignRight, tr("predicted − computed"));
    } else {
        shadowed(textRect, Qt::AlignRight,
                 tr("%1 … %2 dB re the audio's peak").arg(look_.floorDb, 0, 'f', 0).arg(look_.floorDb + look_.rangeDb, 0, 'f', 0));
    }
    p.setFont(font());
}

}  // namespace earmark::widgets
