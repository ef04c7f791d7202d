// Pixel counts for render tests: how colourful an area is, how much two
// images differ.
#pragma once

#include <QImage>
#include <QRect>
#include <QSet>

#include <algorithm>

namespace earmark::test {

// Every `stride`-th pixel of every `stride`-th row of `area`.
inline int distinctColours(const QImage& image, const QRect& area, int stride = 1) {
    QSet<QRgb> colours;
    for (int y = area.top(); y <= area.bottom(); y += stride)
        for (int x = area.left(); x <= area.right(); x += stride) colours.insert(image.pixel(x, y));
    return colours.size();
}

inline int differingPixels(const QImage& a, const QImage& b) {
    int n = 0;
    for (int y = 0; y < std::min(a.height(), b.height()); ++y)
        for (int x = 0; x < std::min(a.width(), b.width()); ++x) n += a.pixel(x, y) != b.pixel(x, y);
    return n;
}

}  // namespace earmark::test
