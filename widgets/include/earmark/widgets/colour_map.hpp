// Earmark's spectrogram colour map ("dusk"), computed here rather than taken
// from anywhere.
//
// How it is made (all in OKLab, B. Ottosson 2020, "A perceptual color space
// for image processing"):
//   1. A path through OKLab: lightness L rises linearly from 0.16 to 0.97; hue
//      turns from 285° (blue-violet) through magenta and red to 95° (yellow);
//      chroma follows 0.17·sin(π·t)^0.7, so both ends are nearly grey.
//   2. Each path point is brought into the sRGB gamut by lowering its chroma
//      (bisection) at fixed L and hue.
//   3. The gamut-fitted path is resampled at equal OKLab arc length (ΔE_OK),
//      so neighbouring entries differ by the same perceived amount, while L
//      stays strictly increasing (the map reads correctly in grey scale).
//
// Earmark's diverging map for signed differences ("ember"), made the same way
// but as two paths from one dark centre:
//   1. The centre (index 127.5, a difference of 0) is a neutral near-black,
//      OKLab L 0.20; each half rises linearly in L to 0.93 at its end, so the
//      larger a difference of either sign, the brighter it is drawn (the
//      map is meant for sparse differences on a dark ground).
//   2. The lower half (negative) turns hue 250° (blue) towards 215° (cyan);
//      the upper half (positive) 35° (red-orange) towards 85° (yellow);
//      chroma 0.16·sin(π/2·u)^0.8 of the distance u from the centre, so the
//      centre is grey; gamut-fitted as step 2 above.
//   3. Each half is resampled at equal OKLab arc length (as step 3 above);
//      the two halves have the same L at mirrored indices.
// Pure functions; no state, thread-safe.
#pragma once

#include <array>
#include <cstdint>

namespace earmark::widgets {

struct OkLab {
    double L = 0.0, a = 0.0, b = 0.0;
};

struct LinearRgb {
    double r = 0.0, g = 0.0, b = 0.0;  // linear-light sRGB, in gamut when all in [0, 1]
};

OkLab linearSrgbToOkLab(const LinearRgb& c);
LinearRgb okLabToLinearSrgb(const OkLab& c);
double srgbEncode(double linear);  // IEC 61966-2-1 transfer function, input clamped to [0, 1]
double srgbDecode(double encoded);

// 256 entries as 0xAARRGGBB (QRgb layout), darkest first.
const std::array<std::uint32_t, 256>& duskColourMap();

// The OKLab coordinates of the 256 entries after encoding to 8-bit sRGB (for tests).
std::array<OkLab, 256> duskColourMapOkLab();

// 256 entries as 0xAARRGGBB: index 0 the most negative, 255 the most
// positive; 127 and 128 straddle zero.
const std::array<std::uint32_t, 256>& emberColourMap();
std::array<OkLab, 256> emberColourMapOkLab();

}  // namespace earmark::widgets
