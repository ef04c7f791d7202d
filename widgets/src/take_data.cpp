#include "earmark/widgets/take_data.hpp"

#include <algorithm>
#include <cmath>
#include <cstring>

namespace earmark::widgets {

SpectrogramView SpectrogramView::make(Spectrogram s) {
    SpectrogramView v;
    if (s.frames <= 0 || s.bins <= 0) {
        v.data = std::move(s);
        return v;
    }
    const auto [lowest, highest] = std::minmax_element(s.values.begin(), s.values.end());
    v.peakDb = *highest;
    v.image = QImage(s.frames, s.bins, QImage::Format_Indexed8);
    // Digital silence sits at the floor everywhere: show it dark, not as "peak".
    const bool silent = *highest - *lowest < 1e-3;
    for (int bin = 0; bin < s.bins && silent; ++bin) std::memset(v.image.scanLine(bin), 0, static_cast<std::size_t>(s.frames));
    for (int bin = 0; bin < s.bins && !silent; ++bin) {
        uchar* row = v.image.scanLine(s.bins - 1 - bin);
        for (int f = 0; f < s.frames; ++f) {
            const double rel = s.at(f, bin) - v.peakDb;
            const double k = std::round((rel - lowestRelativeDb) / dbPerIndex);
            row[f] = static_cast<uchar>(std::clamp(k, 0.0, 255.0));
        }
    }
    v.data = std::move(s);
    v.levels.push_back(v.image);
    while (v.levels.back().width() > 256) {
        const QImage& fine = v.levels.back();
        QImage coarse((fine.width() + 1) / 2, fine.height(), QImage::Format_Indexed8);
        for (int y = 0; y < fine.height(); ++y) {
            const uchar* in = fine.constScanLine(y);
            uchar* out = coarse.scanLine(y);
            for (int x = 0; x < coarse.width(); ++x) {
                const int a = 2 * x, b = std::min(2 * x + 1, fine.width() - 1);
                out[x] = std::max(in[a], in[b]);
            }
        }
        v.levels.push_back(std::move(coarse));
    }
    return v;
}

int SpectrogramView::frameAt(double t) const {
    if (data.frames <= 0) return -1;
    if (data.timesSeconds.empty()) {
        if (!(data.hopSeconds > 0)) return -1;
        const long i = std::lround(t / data.hopSeconds);
        return i >= 0 && i < data.frames ? static_cast<int>(i) : -1;
    }
    const auto& ts = data.timesSeconds;
    const double half = 0.5 * data.hopSeconds;
    if (t < ts.front() - half || t > ts.back() + half) return -1;
    const auto it = std::lower_bound(ts.begin(), ts.end(), t);
    if (it == ts.end()) return data.frames - 1;
    if (it != ts.begin() && t - *(it - 1) < *it - t) return static_cast<int>(it - ts.begin() - 1);
    return static_cast<int>(it - ts.begin());
}

std::optional<double> SpectrogramView::relativeDbAt(double t, int bin) const {
    const int f = frameAt(t);
    if (f < 0 || bin < 0 || bin >= data.bins) return std::nullopt;
    return data.at(f, bin) - peakDb;
}

namespace {

template <typename Values>
std::optional<std::size_t> nearestFrame(const Values& values, double hop, double t) {
    if (!(hop > 0) || values.empty()) return std::nullopt;
    const long i = std::lround(t / hop);
    if (i < 0 || static_cast<std::size_t>(i) >= values.size()) return std::nullopt;
    return static_cast<std::size_t>(i);
}

}  // namespace

std::optional<double> TakeTracks::f0At(double t) const {
    if (!pitch) return std::nullopt;
    const auto i = nearestFrame(pitch->f0Hz, pitch->hopSeconds, t);
    if (!i || !pitch->voiced(*i)) return std::nullopt;
    return pitch->f0Hz[*i];
}

std::optional<double> TakeTracks::confidenceAt(double t) const {
    if (!pitch) return std::nullopt;
    const auto i = nearestFrame(pitch->confidence, pitch->hopSeconds, t);
    if (!i) return std::nullopt;
    return pitch->confidence[*i];
}

std::optional<double> TakeTracks::energyDbAt(double t) const {
    if (!energy) return std::nullopt;
    const auto i = nearestFrame(energy->db, energy->hopSeconds, t);
    if (!i) return std::nullopt;
    return energy->db[*i];
}

}  // namespace earmark::widgets
