#include "earmark/widgets/colour_map.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

namespace earmark::widgets {

// Matrices of OKLab (Ottosson 2020) for linear sRGB input.
OkLab linearSrgbToOkLab(const LinearRgb& c) {
    const double l = 0.4122214708 * c.r + 0.5363325363 * c.g + 0.0514459929 * c.b;
    const double m = 0.2119034982 * c.r + 0.6806995451 * c.g + 0.1073969566 * c.b;
    const double s = 0.0883024619 * c.r + 0.2817188376 * c.g + 0.6299787005 * c.b;
    const double l_ = std::cbrt(l), m_ = std::cbrt(m), s_ = std::cbrt(s);
    return {0.2104542553 * l_ + 0.7936177850 * m_ - 0.0040720468 * s_,
            1.9779984951 * l_ - 2.4285922050 * m_ + 0.4505937099 * s_,
            0.0259040371 * l_ + 0.7827717662 * m_ - 0.8086757660 * s_};
}

LinearRgb okLabToLinearSrgb(const OkLab& c) {
    const double l_ = c.L + 0.3963377774 * c.a + 0.2158037573 * c.b;
    const double m_ = c.L - 0.1055613458 * c.a - 0.0638541728 * c.b;
    const double s_ = c.L - 0.0894841775 * c.a - 1.2914855480 * c.b;
    const double l = l_ * l_ * l_, m = m_ * m_ * m_, s = s_ * s_ * s_;
    return {4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s,
            -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s,
            -0.0041960863 * l - 0.7034186147 * m + 1.7076147010 * s};
}

double srgbEncode(double x) {
    x = std::clamp(x, 0.0, 1.0);
    return x <= 0.0031308 ? 12.92 * x : 1.055 * std::pow(x, 1.0 / 2.4) - 0.055;
}

double srgbDecode(double x) {
    x = std::clamp(x, 0.0, 1.0);
    return x <= 0.04045 ? x / 12.92 : std::pow((x + 0.055) / 1.055, 2.4);
}

namespace {

bool inGamut(const LinearRgb& c) {
    constexpr double eps = 1e-9;
    return c.r >= -eps && c.r <= 1 + eps && c.g >= -eps && c.g <= 1 + eps && c.b >= -eps && c.b <= 1 + eps;
}

OkLab fromLch(double L, double chroma, double hueDeg) {
    const double h = hueDeg * std::numbers::pi / 180.0;
    return {L, chroma * std::cos(h), chroma * std::sin(h)};
}

// Step 1 and 2: the path point at t in [0, 1], fitted into the gamut.
OkLab pathPoint(double t) {
    const double L = 0.16 + (0.97 - 0.16) * t;
    const double hue = 285.0 + 170.0 * t;
    double chroma = 0.17 * std::pow(std::sin(std::numbers::pi * t), 0.7);
    if (!inGamut(okLabToLinearSrgb(fromLch(L, chroma, hue)))) {
        double lo = 0.0, hi = chroma;
        for (int i = 0; i < 40; ++i) {
            const double mid = 0.5 * (lo + hi);
            (inGamut(okLabToLinearSrgb(fromLch(L, mid, hue))) ? lo : hi) = mid;
        }
        chroma = lo;
    }
    return fromLch(L, chroma, hue);
}

double distance(const OkLab& p, const OkLab& q) {
    return std::sqrt((p.L - q.L) * (p.L - q.L) + (p.a - q.a) * (p.a - q.a) + (p.b - q.b) * (p.b - q.b));
}

std::uint32_t toArgb(const OkLab& c) {
    const LinearRgb rgb = okLabToLinearSrgb(c);
    auto byte = [](double lin) {
        return static_cast<std::uint32_t>(std::lround(srgbEncode(lin) * 255.0));
    };
    return 0xFF000000u | (byte(rgb.r) << 16) | (byte(rgb.g) << 8) | byte(rgb.b);
}

std::array<std::uint32_t, 256> buildDusk() {
    // Step 3: dense path, cumulative arc length, equal-length resampling.
    constexpr int dense = 4096;
    std::vector<OkLab> pts(dense + 1);
    std::vector<double> arc(dense + 1, 0.0);
    for (int i = 0; i <= dense; ++i) {
        pts[i] = pathPoint(static_cast<double>(i) / dense);
        if (i > 0) arc[i] = arc[i - 1] + distance(pts[i - 1], pts[i]);
    }
    std::array<std::uint32_t, 256> out{};
    std::size_t j = 0;
    for (int k = 0; k < 256; ++k) {
        const double target = arc.back() * k / 255.0;
        while (j + 1 < arc.size() - 1 && arc[j + 1] < target) ++j;
        const double seg = arc[j + 1] - arc[j];
        const double f = seg > 0 ? std::clamp((target - arc[j]) / seg, 0.0, 1.0) : 0.0;
        const OkLab p{pts[j].L + f * (pts[j + 1].L - pts[j].L), pts[j].a + f * (pts[j + 1].a - pts[j].a),
                      pts[j].b + f * (pts[j + 1].b - pts[j].b)};
        out[static_cast<std::size_t>(k)] = toArgb(p);
    }
    return out;
}

}  // namespace

const std::array<std::uint32_t, 256>& duskColourMap() {
    static const std::array<std::uint32_t, 256> map = buildDusk();
    return map;
}

std::array<OkLab, 256> duskColourMapOkLab() {
    std::array<OkLab, 256> out;
    const auto& map = duskColourMap();
    for (std::size_t i = 0; i < 256; ++i) {
        const auto c = map[i];
        out[i] = linearSrgbToOkLab({srgbDecode(((c >> 16) & 0xFF) / 255.0), srgbDecode(((c >> 8) & 0xFF) / 255.0),
                                    srgbDecode((c & 0xFF) / 255.0)});
    }
    return out;
}

}  // namespace earmark::widgets
