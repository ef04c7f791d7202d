#include "earmark/widgets/hover_readout.hpp"

#include <cmath>

namespace earmark::widgets {

HoverReadout::HoverReadout(ViewState* view, QWidget* parent) : QLabel(parent), view_(view) {
    setTextFormat(Qt::PlainText);
    setMinimumWidth(fontMetrics().horizontalAdvance(QStringLiteral("0")) * 70);
    connect(view_, &ViewState::hoverChanged, this, &HoverReadout::refresh);
    connect(view_, &ViewState::cursorChanged, this, &HoverReadout::refresh);
    connect(view_, &ViewState::selectionChanged, this, &HoverReadout::refresh);
    refresh();
}

void HoverReadout::setTracks(TakeTracksPtr tracks) {
    tracks_ = std::move(tracks);
    refresh();
}

void HoverReadout::setLaneDetail(const QString& text) {
    if (text == laneDetail_) return;
    laneDetail_ = text;
    refresh();
}

QString HoverReadout::textFor(std::optional<double> time) const {
    if (!time) {
        QString text = tr("cursor %1 s").arg(view_->cursor(), 0, 'f', 3);
        if (const auto sel = view_->selection())
            text += tr("  ·  selection %1–%2 s (%3 ms)")
                        .arg(sel->start, 0, 'f', 3)
                        .arg(sel->end, 0, 'f', 3)
                        .arg(sel->span() * 1000.0, 0, 'f', 0);
        return text;
    }
    QStringList parts;
    parts << tr("%1 s").arg(*time, 0, 'f', 3);
    if (tracks_) {
        if (const auto f0 = tracks_->f0At(*time)) {
            QString f = tr("F0 %1 Hz").arg(*f0, 0, 'f', 1);
            if (tracks_->pitchSummary.medianHz)
                f += tr(" (%1%2 st)").arg(*f0 >= *tracks_->pitchSummary.medianHz ? "+" : "")
                         .arg(12.0 * std::log2(*f0 / *tracks_->pitchSummary.medianHz), 0, 'f', 1);
            parts << f;
        } else if (tracks_->pitch) {
            parts << tr("unvoiced");
        }
        if (const auto e = tracks_->energyDbAt(*time)) parts << tr("energy %1 dBFS").arg(*e, 0, 'f', 1);
    }
    if (!laneDetail_.isEmpty()) parts << laneDetail_;
    return parts.join(QStringLiteral("  ·  "));
}

void HoverReadout::refresh() { setText(textFor(view_->hoverTime())); }

}  // namespace earmark::widgets
