// Drawing shared by the lanes that show a SpectrogramView (the take's
// spectrogram, the model lanes): the visible part of the image scaled into
// the plot, and the band axis of a mel-type (unevenly spaced) spectrogram.
// GUI thread only (QPainter on widgets).
#pragma once

#include "earmark/widgets/axis_painting.hpp"
#include "earmark/widgets/take_data.hpp"
#include "earmark/widgets/time_mapping.hpp"

#include <QRect>
#include <QVector>

#include <array>
#include <cstdint>

#include <functional>
#include <vector>

class QPainter;

namespace earmark::widgets {

// Fractional band index (0 = lowest) of a frequency, interpolated between
// band centres (bands equally spaced on their own scale), extrapolated beyond
// the ends; and its inverse, clamped to the bands. 0 with fewer than 2 bands.
double bandOfHz(const std::vector<double>& centresHz, double hz);
double hzOfBand(const std::vector<double>& centresHz, double band);

// Draws the frames of `view` inside mapping.range into `plot`, bins
// [0, shownBins) from the bottom up, coloured by `table` (256 entries for the
// image's indices). Picks the coarsest pyramid level that still has at least
// one column per pixel; smooth when columns are finer than pixels.
void paintSpectrogramImage(QPainter& painter, const SpectrogramView& view, const TimeMapping& mapping,
                           const QRect& plot, const QVector<QRgb>& table, double shownBins);

// Ticks at round frequencies for a band axis up to topHz, at least
// `minSpacingPx` apart; `yOfHz` places them.
std::vector<AxisTick> bandAxisTicks(const std::vector<double>& centresHz, double topHz,
                                    const std::function<double(double)>& yOfHz, double minSpacingPx);

// "850" or "1.5k".
QString hzTickLabel(double hz);

// A colour-scale bar (`widthPx` × 8 px, lowest colour on the left) in the
// plot's top-right corner, framed; returns where it is.
QRect drawColourBar(QPainter& painter, const QRect& plot, const std::array<std::uint32_t, 256>& map, int widthPx);
// White text with a dark shadow, readable over any colour.
void drawShadowedText(QPainter& painter, const QRect& rect, int align, const QString& text);

}  // namespace earmark::widgets
