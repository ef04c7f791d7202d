// EBU Tech 3341 (loudness metering, "EBU mode"), Table 1: the integrated
// loudness cases that need only 1 kHz sines. Each must read within ±0.1 LU.
#include "earmark/loudness/bs1770.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdint>
#include <numbers>
#include <ostream>
#include <string>
#include <vector>

namespace earmark {
namespace {

struct Segment {
    double seconds;
    std::vector<double> dbfs;  // per channel; sine peak level (0 dBFS = amplitude 1)
};

struct Case {
    std::string name;
    double rate;
    std::vector<Segment> segments;
    double expectedLufs;
};

std::ostream& operator<<(std::ostream& os, const Case& c) { return os << c.name << "@" << c.rate; }

// Interleaved 1 kHz sine with a continuous phase across level changes.
std::vector<float> render(const Case& c) {
    const std::size_t channels = c.segments.front().dbfs.size();
    std::vector<float> out;
    std::int64_t n = 0;
    for (const Segment& s : c.segments) {
        const auto frames = std::llround(s.seconds * c.rate);
        for (std::int64_t i = 0; i < frames; ++i, ++n) {
            const double x = std::sin(2.0 * std::numbers::pi * 1000.0 * static_cast<double>(n) / c.rate);
            for (std::size_t ch = 0; ch < channels; ++ch)
                out.push_back(static_cast<float>(std::pow(10.0, s.dbfs[ch] / 20.0) * x));
        }
    }
    return out;
}

Segment stereo(double seconds, double dbfs) { return {seconds, {dbfs, dbfs}}; }

std::vector<Case> cases() {
    std::vector<Case> all;
    for (double rate : {48000.0, 44100.0, 22050.0}) {
        all.push_back({"case1", rate, {stereo(20, -23)}, -23.0});
        all.push_back({"case2", rate, {stereo(20, -33)}, -33.0});
    }
    all.push_back({"case3", 48000.0, {stereo(10, -36), stereo(60, -23), stereo(10, -36)}, -23.0});
    all.push_back({"case4", 48000.0,
                   {stereo(10, -72), stereo(10, -36), stereo(60, -23), stereo(10, -36), stereo(10, -72)},
                   -23.0});
    all.push_back({"case5", 48000.0, {stereo(20, -26), stereo(20.1, -20), stereo(20, -26)}, -23.0});
    // 5.0 in the meter's order L R C Ls Rs.
    all.push_back({"case6", 48000.0, {{20, {-28, -28, -24, -30, -30}}}, -23.0});
    return all;
}

class Ebu3341 : public ::testing::TestWithParam<Case> {};

TEST_P(Ebu3341, IntegratedLoudnessWithinTenthOfLu) {
    const Case& c = GetParam();
    const std::vector<float> x = render(c);
    const int channels = static_cast<int>(c.segments.front().dbfs.size());
    const double lufs =
        integratedLoudnessLufs(x.data(), static_cast<std::int64_t>(x.size()) / channels, c.rate, channels);
    EXPECT_NEAR(lufs, c.expectedLufs, 0.1);
    RecordProperty("deviation_lu", ::testing::PrintToString(lufs - c.expectedLufs));
}

INSTANTIATE_TEST_SUITE_P(Table1, Ebu3341, ::testing::ValuesIn(cases()),
                         [](const auto& info) {
                             return info.param.name + "_" + std::to_string(static_cast<int>(info.param.rate));
                         });

}  // namespace
}  // namespace earmark
