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

// Step 2: lower the chroma at fixed L and hue until the colour is in gamut.
OkLab fitted(double L, double chroma, double hue) {
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

// Step 1 and 2 of "dusk": the path point at t in [0, 1].
OkLab duskPoint(double t) {
    return fitted(0.16 + (0.97 - 0.16) * t, 0.17 * std::pow(std::sin(std::numbers::pi * t), 0.7), 285.0 + 170.0 * t);
}

// Step 1 and 2 of "ember", one half: u in [0, 1] is the distance from the centre.
OkLab emberPoint(double u, bool positive) {
    const double hue = positive ? 35.0 + 50.0 * u : 250.0 - 35.0 * u;
    return fitted(0.20 + (0.93 - 0.20) * u, 0.16 * std::pow(std::sin(0.5 * std::numbers::pi * u), 0.8), hue);
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

// Step 3: `count` colours at equal OKLab arc length along path(t), t in [0, 1].
template <typename Path>
std::vector<std::uint32_t> resampleByArc(Path path, int count) {
    constexpr int dense = 4096;
    std::vector<OkLab> pts(dense + 1);
    std::vector<double> arc(dense + 1, 0.0);
    for (int i = 0; i <= dense; ++i) {
        pts[i] = path(static_cast<double>(i) / dense);
        if (i > 0) arc[i] = arc[i - 1] + distance(pts[i - 1], pts[i]);
    }
    std::vector<std::uint32_t> out(static_cast<std::size_t>(count));
    std::size_t j = 0;
    for (int k = 0; k < count; ++k) {
        const double target = arc.back() * k / (count - 1);
        while (j + 1 < arc.size() - 1 && arc[j + 1] < target) ++j;
        const double seg = arc[j + 1] - arc[j];
        const double f = seg > 0 ? std::clamp((target - arc[j]) / seg, 0.0, 1.0) : 0.0;
        const OkLab p{pts[j].L + f * (pts[j + 1].L - pts[j].L), pts[j].a + f * (pts[j + 1].a - pts[j].a),
                      pts[j].b + f * (pts[j + 1].b - pts[j].b)};
        out[static_cast<std::size_t>(k)] = toArgb(p);
    }
    return out;
}

std::array<std::uint32_t, 256> buildDusk() {
    const auto v = resampleByArc(duskPoint, 256);
    std::array<std::uint32_t, 256> out{};
    std::copy(v.begin(), v.end(), out.begin());
    return out;
}

std::array<std::uint32_t, 256> buildEmber() {
    // Index 128 + k and 127 − k sit at the same distance (k + ½)/128 from the centre.
    const auto up = resampleByArc([](double t) { return emberPoint(t, true); }, 257);
    const auto down = resampleByArc([](double t) { return emberPoint(t, false); }, 257);
    std::array<std::uint32_t, 256> out{};
    for (std::size_t k = 0; k < 128; ++k) {
        const std::size_t i = 2 * k + 1;  // arc position (k + ½)/128 of 256 steps
        out[128 + k] = up[i];
        out[127 - k] = down[i];
    }
    return out;
}

std::array<OkLab, 256> toOkLab(const std::array<std::uint32_t, 256>& map) {
    std::array<OkLab, 256> out;
    for (std::size_t i = 0; i < 256; ++i) {
        const auto c = map[i];
        out[i] = linearSrgbToOkLab({srgbDecode(((c >> 16) & 0xFF) / 255.0), srgbDecode(((c >> 8) & 0xFF) / 255.0),
                                    srgbDecode((c & 0xFF) / 255.0)});
    }
    return out;
}

}  // namespace

const std::array<std::uint32_t, 256>& duskColourMap() {
    static const std::array<std::uint32_t, 256> map = buildDusk();
    return map;
}

std::array<OkLab, 256> duskColourMapOkLab() { return toOkLab(duskColourMap()); }

const std::array<std::uint32_t, 256>& emberColourMap() {
    static const std::array<std::uint32_t, 256> map = buildEmber();
    return map;
}

std::array<OkLab, 256> emberColourMapOkLab() { return toOkLab(emberColourMap()); }

}  // namespace earmark::widgets
