#include "earmark/core/error.hpp"
#include "earmark/level/energy.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <string>
#include <vector>

namespace earmark {
namespace {

// Oracle: RMS of each frame summed sample by sample from the definition in
// energy.hpp / DESIGN.md (frame i centred at i·hop, zeros outside the signal).
std::vector<double> naiveEnergyDb(const Signal& s, int hop, int win, double floorDb) {
    const auto n = static_cast<std::int64_t>(s.size());
    std::vector<double> db;
    for (std::int64_t i = 0; i <= n / hop && n > 0; ++i) {
        long double sum = 0;
        for (std::int64_t j = i * hop - win / 2; j < i * hop - win / 2 + win; ++j)
            if (j >= 0 && j < n) sum += static_cast<long double>(s.samples[j]) * s.samples[j];
        const double power = static_cast<double>(sum / win);
        db.push_back(power > std::pow(10.0, floorDb / 10.0) ? 10.0 * std::log10(power) : floorDb);
    }
    return db;
}

Signal square(double seconds, double rate, double amplitude, int halfPeriod = 24) {
    Signal s = test::silence(seconds, rate);
    for (std::size_t i = 0; i < s.size(); ++i)
        s.samples[i] = static_cast<float>((i / halfPeriod) % 2 == 0 ? amplitude : -amplitude);
    return s;
}

// Frames whose whole window lies inside [0, n).
std::vector<std::size_t> interiorFrames(std::size_t frames, int hop, int win, std::int64_t n) {
    std::vector<std::size_t> out;
    for (std::size_t i = 0; i < frames; ++i) {
        const std::int64_t first = static_cast<std::int64_t>(i) * hop - win / 2;
        if (first >= 0 && first + win <= n) out.push_back(i);
    }
    return out;
}

TEST(Energy, FullScaleSquareIsZeroDbfs) {
    const Signal s = square(1.0, 48000.0, 1.0);
    const EnergyTrack t = analyseEnergy(s);
    const auto inside = interiorFrames(t.db.size(), 240, 1200, 48000);
    ASSERT_GT(inside.size(), 150u);
    for (std::size_t i : inside) EXPECT_NEAR(t.db[i], 0.0, 1e-5) << "frame " << i;
}

TEST(Energy, FullScaleSineIsMinus3Dbfs) {
    // RMS dBFS with full scale = 1.0 (common practice): a full-scale sine has
    // RMS 1/√2, i.e. −3.0103 dBFS. The 25 ms window holds 25 whole periods.
    const Signal s = test::sine(1000.0, 1.0, 48000.0, 1.0);
    const EnergyTrack t = analyseEnergy(s);
    for (std::size_t i : interiorFrames(t.db.size(), 240, 1200, 48000))
        EXPECT_NEAR(t.db[i], -3.0103, 1e-3) << "frame " << i;
}

TEST(Energy, FrameCountIsFloorOfSamplesOverHopPlusOne) {
    const EnergyParams p{.hopSeconds = 0.005, .windowSeconds = 0.025};
    for (std::size_t n : {1u, 239u, 240u, 241u, 47999u, 48000u, 48001u}) {
        Signal s = test::silence(0.0, 48000.0);
        s.samples.assign(n, 0.25f);
        const EnergyTrack t = analyseEnergy(s, p);
        EXPECT_EQ(t.db.size(), n / 240 + 1) << n << " samples";
        EXPECT_DOUBLE_EQ(t.hopSeconds, 0.005);
    }
    EXPECT_TRUE(analyseEnergy(test::silence(0.0, 48000.0), p).db.empty());
}

TEST(Energy, FrameIIsCentredAtIHop) {
    // 1 s of silence, then a full-scale square. With hop 240 and window 1200
    // samples, frame i covers [240i − 600, 240i + 600): frame 197 is the last
    // all-silent one, frame 200 (centred on the onset at sample 48000) is half
    // loud (−3.01 dB), frame 203 the first all-loud one.
    const double rate = 48000.0;
    const Signal s = test::concat({test::silence(1.0, rate), square(1.0, rate, 1.0)});
    const EnergyParams p{.hopSeconds = 0.005, .windowSeconds = 0.025, .floorDb = -120.0};
    const EnergyTrack t = analyseEnergy(s, p);
    std::size_t firstAbove = 0;
    while (firstAbove < t.db.size() && t.db[firstAbove] <= p.floorDb) ++firstAbove;
    EXPECT_EQ(firstAbove, 198u);
    EXPECT_NEAR(t.db[200], 10.0 * std::log10(0.5), 1e-5);
    EXPECT_LT(t.db[202], -1e-3);
    EXPECT_NEAR(t.db[203], 0.0, 1e-5);
}

TEST(Energy, SilenceReadsTheFloor) {
    const EnergyParams p{.floorDb = -90.0};
    const EnergyTrack t = analyseEnergy(test::silence(2.0, 16000.0), p);
    ASSERT_EQ(t.db.size(), 401u);
    for (float v : t.db) EXPECT_EQ(v, -90.0f);
}

TEST(Energy, MatchesNaivePerFrameRms) {
    struct Case {
        double rate, hop, win;
    };
    double maxError = 0.0;
    for (const Case c : {Case{16000.0, 0.005, 0.025}, Case{22050.0, 0.01, 0.03}, Case{48000.0, 0.02, 0.01},
                         Case{44100.0, 0.0125, 0.05}}) {
        SCOPED_TRACE(std::to_string(c.rate) + " hop " + std::to_string(c.hop) + " win " + std::to_string(c.win));
        Signal s = test::speechLike(4.0, c.rate, 17);
        const EnergyParams p{.hopSeconds = c.hop, .windowSeconds = c.win, .floorDb = -120.0};
        const EnergyTrack t = analyseEnergy(s, p);
        const auto oracle = naiveEnergyDb(s, static_cast<int>(std::lround(c.hop * c.rate)),
                                          static_cast<int>(std::lround(c.win * c.rate)), p.floorDb);
        ASSERT_EQ(t.db.size(), oracle.size());
        for (std::size_t i = 0; i < oracle.size(); ++i) {
            ASSERT_NEAR(t.db[i], oracle[i], 1e-3) << "frame " << i;
            maxError = std::max(maxError, std::fabs(t.db[i] - oracle[i]));
        }
    }
    RecordProperty("max_error_db", ::testing::PrintToString(maxError));
}

TEST(Energy, QuietPassageAndSilenceAfterLongLoudPassage) {
    // A minute of full-scale square, then a −100 dBFS square, then digital
    // silence: the quiet frames must read −100 dBFS, not the floor (a plain
    // running sum over the take swallows squares of 1e-10 next to a sum of
    // ~3e6), and the silent ones exactly the floor even when it is −300 dB
    // (any rounding residue left from the loud part would show above it).
    const double rate = 48000.0;
    const Signal s = test::concat({square(60.0, rate, 1.0), square(1.0, rate, 1e-5), test::silence(1.0, rate)});
    const EnergyParams p{.floorDb = -300.0};
    const EnergyTrack t = analyseEnergy(s, p);
    const auto oracle = naiveEnergyDb(s, 240, 1200, p.floorDb);
    ASSERT_EQ(t.db.size(), oracle.size());
    for (std::size_t i = 12003; i < 12198; ++i) {
        ASSERT_NEAR(oracle[i], -100.0, 1e-3);
        ASSERT_NEAR(t.db[i], -100.0, 1e-3) << "frame " << i;
    }
    for (std::size_t i = 12203; i < t.db.size(); ++i) ASSERT_EQ(t.db[i], -300.0f) << "frame " << i;
}

TEST(Energy, InvalidParamsNameTheField) {
    const Signal s = test::sine(100.0, 0.1, 8000.0);
    const auto subjectOf = [](const Signal& sig, const EnergyParams& p) -> std::string {
        try {
            analyseEnergy(sig, p);
        } catch (const ParamError& e) {
            return e.subject();
        }
        return "(no ParamError)";
    };
    const double nan = std::numeric_limits<double>::quiet_NaN();
    EXPECT_EQ(subjectOf(s, {.hopSeconds = 0.0}), "EnergyParams.hopSeconds");
    EXPECT_EQ(subjectOf(s, {.hopSeconds = -0.01}), "EnergyParams.hopSeconds");
    EXPECT_EQ(subjectOf(s, {.hopSeconds = nan}), "EnergyParams.hopSeconds");
    EXPECT_EQ(subjectOf(s, {.windowSeconds = 0.0}), "EnergyParams.windowSeconds");
    EXPECT_EQ(subjectOf(s, {.windowSeconds = nan}), "EnergyParams.windowSeconds");
    Signal noRate = s;
    noRate.sampleRate = 0.0;
    EXPECT_EQ(subjectOf(noRate, {}), "Signal.sampleRate");
}

}  // namespace
}  // namespace earmark
