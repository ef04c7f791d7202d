#include "earmark/widgets/attention_lane.hpp"

#include "earmark/widgets/axis_painting.hpp"
#include "earmark/widgets/colour_map.hpp"

#include <QFileInfo>
#include <QHelpEvent>
#include <QPainter>
#include <QPainterPath>
#include <QToolTip>

#include <algorithm>
#include <cmath>

namespace earmark::widgets {

const QColor AttentionLane::skipColour(235, 64, 52);
const QColor AttentionLane::repeatColour(255, 176, 32);

AttentionLane::AttentionLane(ViewState* view, QWidget* parent) : Lane("attention", tr("Attention"), view, parent) {}

void AttentionLane::setAttention(ModelAttentionPtr attention) {
    attention_ = std::move(attention);
    invalidateContent();
}

double AttentionLane::yOfToken(double token) const {
    const QRect plot = plotRect();
    return plot.top() + token * plot.height() / std::max(1, attention_ ? attention_->tokens : 1);
}

std::optional<int> AttentionLane::tokenAtY(double y) const {
    if (!attention_ || attention_->tokens <= 0) return std::nullopt;
    const QRect plot = plotRect();
    const int k = static_cast<int>(std::floor((y - plot.top()) * attention_->tokens / plot.height()));
    if (k < 0 || k >= attention_->tokens) return std::nullopt;
    return k;
}

std::optional<double> AttentionLane::weightAt(QPoint pos) const {
    const auto token = tokenAtY(pos.y());
    if (!token || !plotRect().contains(pos)) return std::nullopt;
    const int frame = static_cast<int>(std::floor(timeAtX(pos.x()) / attention_->hopSeconds));
    if (frame < 0 || frame >= attention_->frames) return std::nullopt;
    return attention_->image.pixelIndex(frame, *token) / 255.0;
}

QString AttentionLane::faultTextAt(QPoint pos) const {
    if (!attention_ || !plotRect().contains(pos)) return {};
    const double slack = 4.0 * mapping().range.span() / std::max(1, plotRect().width());
    QStringList lines;
    for (const AttentionEvent* e : attention_->faultsAt(timeAtX(pos.x()), slack)) lines << attention_->describe(*e);
    return lines.join('\n');
}

QString AttentionLane::describePoint(QPoint pos) const {
    const auto token = tokenAtY(pos.y());
    const auto weight = weightAt(pos);
    if (!token || !weight) return {};
    QString text = tr("token %1 “%2”, weight %3")
                       .arg(*token)
                       .arg(QString::fromStdString(attention_->labels[static_cast<std::size_t>(*token)]))
                       .arg(*weight, 0, 'f', 2);
    const QString fault = faultTextAt(pos);
    if (!fault.isEmpty()) text += QStringLiteral(" — ") + QString(fault).replace('\n', QStringLiteral("; "));
    return text;
}

bool AttentionLane::event(QEvent* e) {
    if (e->type() == QEvent::ToolTip) {
        auto* help = static_cast<QHelpEvent*>(e);
        const QString text = faultTextAt(help->pos());
        if (text.isEmpty()) QToolTip::hideText();
        else QToolTip::showText(help->globalPos(), text, this);
        return true;
    }
    return Lane::event(e);
}

void AttentionLane::drawContent(QPainter& p) {
    const LaneColours c = colours();
    const QRect plot = plotRect();
    if (!attention_) {
        drawTitle(p, title());
        p.setPen(c.faintText);
        p.drawText(plot.adjusted(20, 0, -20, 0), Qt::AlignCenter | Qt::TextWordWrap, tr("No attention matrix open"));
        return;
    }
    const ModelAttention& a = *attention_;
    const TimeMapping m = mapping();
    p.fillRect(plot, QColor::fromRgb(duskColourMap()[0]));

    // The matrix: column f covers [f·hop, (f+1)·hop).
    QImage image = a.image;
    QVector<QRgb> table(256);
    for (int k = 0; k < 256; ++k) table[k] = duskColourMap()[static_cast<std::size_t>(k)];
    image.setColorTable(table);
    const double x0 = m.range.start / a.hopSeconds, x1 = m.range.end / a.hopSeconds;
    p.save();
    p.setClipRect(plot);
    p.drawImage(QRectF(plot.left(), plot.top(), plot.width(), plot.height()),
                image.convertToFormat(QImage::Format_ARGB32_Premultiplied), QRectF(x0, 0, x1 - x0, a.tokens));

    // The monotonic path through the frame and token centres.
    p.setRenderHint(QPainter::Antialiasing);
    QPainterPath path;
    const auto& tokenOf = a.alignment.path.tokenOfFrame;
    for (std::size_t f = 0; f < tokenOf.size(); ++f) {
        const QPointF pt(plot.left() + m.timeToX((f + 0.5) * a.hopSeconds), yOfToken(tokenOf[f] + 0.5));
        if (f == 0) path.moveTo(pt);
        else path.lineTo(pt);
    }
    p.setPen(QPen(QColor(120, 255, 240, 170), 1.5));
    p.drawPath(path);

    // Faults: a skip at its frame, a repeat over its frames, captioned.
    QFont small = font();
    small.setPointSizeF(small.pointSizeF() * 0.85);
    small.setBold(true);
    p.setFont(small);
    const QFontMetrics fm(small);
    for (const AttentionEvent& e : a.alignment.faults) {
        const double xa = plot.left() + m.timeToX(e.startS), xb = plot.left() + m.timeToX(e.endS);
        const bool skip = e.kind == AttentionFault::Skip;
        const QColor colour = skip ? skipColour : repeatColour;
        QColor fill = colour;
        fill.setAlpha(skip ? 230 : 90);
        const QRectF band(xa, plot.top(), std::max(skip ? 3.0 : 2.0, xb - xa), plot.height());
        p.fillRect(band, fill);
        p.setPen(QPen(colour, 1.0));
        if (!skip) p.drawRect(band);
        const QString caption = (skip ? tr("skip “%1”") : tr("repeat “%1”"))
                                    .arg(QString::fromStdString(a.labels[static_cast<std::size_t>(e.firstToken)]));
        const QRectF chip(band.center().x() - fm.horizontalAdvance(caption) / 2.0 - 4, plot.bottom() - fm.height() - 6,
                          fm.horizontalAdvance(caption) + 8, fm.height() + 2);
        p.setPen(Qt::NoPen);
        p.setBrush(colour);
        p.drawRoundedRect(chip, 3, 3);
        p.setPen(Qt::black);
        p.drawText(chip, Qt::AlignCenter, caption);
    }
    p.restore();

    // Token labels in the gutter, as many as fit.
    const int every = std::max(1, static_cast<int>(std::ceil(fontMetrics().height() * a.tokens / std::max(1.0, 1.0 * plot.height()))));
    std::vector<AxisTick> ticks;
    for (int k = 0; k < a.tokens; k += every) {
        QString label = QString::fromStdString(a.labels[static_cast<std::size_t>(k)]);
        ticks.push_back({yOfToken(k + 0.5), fontMetrics().elidedText(label, Qt::ElideRight, gutterWidth - 22)});
    }
    drawVerticalAxis(p, *this, ticks, tr("token"), false);
    drawTitle(p, tr("Attention · %1 · %2 frames × %3 tokens · %4 fault(s)")
                     .arg(QFileInfo(a.path).fileName())
                     .arg(a.frames)
                     .arg(a.tokens)
                     .arg(a.alignment.faults.size()));
}

}  // namespace earmark::widgets
