// Bundle pictures: the requested size, real content in every lane, the
// marked span in true colours and the context around it shaded, the words of
// the word tier, and PNG files written by the bundle writer.
#include "earmark/widgets/span_image.hpp"
#include "earmark/core/error.hpp"
#include "earmark/widgets/lane.hpp"
#include "sample_take.hpp"
#include "image_checks.hpp"

#include <QImage>
#include <QSet>

#include <gtest/gtest.h>

#include <cmath>

namespace earmark::widgets {
namespace {

// The sample take (test::sampleTake): voiced 0.2–0.8 s, noise 0.8–0.95 s,
// voiced 1.15–1.65 s, 1.8 s long. The mark covers the first voiced part and
// the picture shows it with 0.15 s of context on each side.
Mark sampleMark() {
    Mark m;
    m.id = 7;
    m.category = MarkCategory::Intonation;
    m.subtype = "flat";
    m.severity = Severity::Major;
    m.startSeconds = 0.3;
    m.endSeconds = 0.7;
    m.note = "sits on one note";
    return m;
}

SpanImageContent sampleContent() {
    const auto& sample = test::sampleTake();
    Take take;
    take.id = 3;
    take.lineId = "line-003";
    take.build = "build-9";
    std::vector<TierRow> tiers = {{"words", 0.2, 0.5, "first"},
                                  {"words", 0.5, 0.8, "second"},
                                  {"words", 1.15, 1.65, "third"},
                                  {"phones", 0.2, 0.3, "f"}};
    return SpanImageContent{sample.audio, sample.tracks, take, sampleMark(), tiers, TimeRange{0.15, 0.85}};
}

using test::distinctColours;

// Share of pixels in `columns` × the lanes' rows that differ between two images.
double differingShare(const QImage& a, const QImage& b, int x0, int x1, const QRect& rows) {
    long differ = 0, total = 0;
    for (int y = rows.top(); y <= rows.bottom(); ++y)
        for (int x = x0; x <= x1; ++x, ++total) differ += a.pixel(x, y) != b.pixel(x, y);
    return total ? double(differ) / double(total) : 0.0;
}

TEST(SpanImage, HasTheRequestedSizeAndRealContent) {
    for (const SpanImageParams size : {SpanImageParams{}, SpanImageParams{800, 500}, SpanImageParams{1600, 1000}}) {
        const SpanImage picture = renderSpanImage(sampleContent(), size);
        ASSERT_FALSE(picture.image.isNull());
        EXPECT_EQ(picture.image.width(), size.widthPx);
        EXPECT_EQ(picture.image.height(), size.heightPx);
        // A spectrogram, waveform and plots put hundreds of colours in the lanes.
        EXPECT_GT(distinctColours(picture.image, picture.layout.lanes, 2), 300) << size.widthPx;
        // The title band holds text: more than the background's colour.
        EXPECT_GT(distinctColours(picture.image, picture.layout.title), 10) << size.widthPx;
        EXPECT_LT(picture.layout.title.bottom(), picture.layout.lanes.top());
        EXPECT_EQ(picture.layout.lanes.bottom(), size.heightPx - 1);
    }
}

TEST(SpanImage, SpanEdgesSitWhereTheTimeAxisPutsThem) {
    const SpanImage picture = renderSpanImage(sampleContent());
    const SpanImageLayout& g = picture.layout;
    EXPECT_EQ(g.plotRight - g.plotLeft, 1200 - Lane::gutterWidth - Lane::rightMargin);
    const double pxPerSecond = (g.plotRight - g.plotLeft) / 0.7;
    EXPECT_NEAR(g.spanLeftX, g.plotLeft + 0.15 * pxPerSecond, 1e-9);
    EXPECT_NEAR(g.spanRightX, g.plotLeft + 0.55 * pxPerSecond, 1e-9);
}

TEST(SpanImage, ContextIsShadedAndTheMarkedSpanIsNot) {
    // The same take and view drawn twice: once with the mark as above, once
    // with a mark over the whole view (no context). Inside the marked span the
    // lanes must be identical; in the context they must differ almost everywhere.
    const SpanImageContent withContext = sampleContent();
    SpanImageContent whole = withContext;
    whole.mark.startSeconds = whole.shown.start;
    whole.mark.endSeconds = whole.shown.end;
    const SpanImage a = renderSpanImage(withContext);
    const SpanImage b = renderSpanImage(whole);
    const SpanImageLayout& g = a.layout;
    // Lanes below the mark and word strips (those two draw the mark itself).
    const QRect rows(0, g.wordStrip.bottom() + 1, 1, g.lanes.bottom() - g.wordStrip.bottom() - 1);
    const int edge = 4;  // px kept clear of the dashed edge lines
    EXPECT_EQ(differingShare(a.image, b.image, int(g.spanLeftX) + edge, int(g.spanRightX) - edge, rows), 0.0);
    EXPECT_GT(differingShare(a.image, b.image, g.plotLeft, int(g.spanLeftX) - edge, rows), 0.95);
    EXPECT_GT(differingShare(a.image, b.image, int(g.spanRightX) + edge, g.plotRight - 1, rows), 0.95);
    // Shading darkens: the context of the white waveform lane is darker than the span.
    const int y = rows.top() + 5;
    EXPECT_LT(qGray(a.image.pixel(g.plotLeft + 5, y)), qGray(a.image.pixel(int(g.spanLeftX) + 20, y)) - 20);
    // In the mark strip, the bar's colour is in the span and not in the context.
    const int barY = g.markStrip.top() + 6;
    const QRgb bar = a.image.pixel(int(g.spanLeftX) + 3, barY);
    EXPECT_NE(bar, a.image.pixel(g.plotLeft + 3, barY));
    EXPECT_NE(bar, a.image.pixel(g.plotRight - 3, barY));
}

TEST(SpanImage, DrawsTheWordsOfTheWordTier) {
    const SpanImageContent words = sampleContent();
    SpanImageContent none = words;
    none.tiers = {{"phones", 0.2, 0.3, "f"}};  // a tier, but not a word tier
    const SpanImage a = renderSpanImage(words);
    const SpanImage b = renderSpanImage(none);
    const QRect strip = a.layout.wordStrip;
    // "first" (0.2–0.5 s, inside the mark, so bold and dark) is centred at
    // 0.35 s, i.e. 0.2 s into the view: dark text pixels there, none without
    // a word tier (which writes "no word tier" in the middle of the strip).
    const SpanImageLayout& g = a.layout;
    const double pxPerSecond = (g.plotRight - g.plotLeft) / 0.7;
    const QRect firstWord(int(g.plotLeft + 0.10 * pxPerSecond), strip.top(), int(0.2 * pxPerSecond), strip.height());
    auto darkPixels = [&](const QImage& image) {
        int n = 0;
        for (int y = firstWord.top(); y <= firstWord.bottom(); ++y)
            for (int x = firstWord.left(); x <= firstWord.right(); ++x) n += qGray(image.pixel(x, y)) < 100;
        return n;
    };
    EXPECT_GT(darkPixels(a.image), 20);
    EXPECT_EQ(darkPixels(b.image), 0);
}

TEST(SpanImage, RefusesBadInput) {
    SpanImageContent c = sampleContent();
    EXPECT_THROW(renderSpanImage(c, SpanImageParams{100, 700}), ParamError);
    EXPECT_THROW(renderSpanImage(c, SpanImageParams{1200, 20000}), ParamError);
    c.shown = TimeRange{0.5, 0.5};
    EXPECT_THROW(renderSpanImage(c), ParamError);
    c.shown = TimeRange{0.5, 9.0};  // past the end of the take
    EXPECT_THROW(renderSpanImage(c), ParamError);
    c = sampleContent();
    c.audio.reset();
    EXPECT_THROW(renderSpanImage(c), ParamError);
}

TEST(BundleImageWriter, WritesAPngOfTheRequestedSizeAndAsksForTiersOncePerTake) {
    const auto& sample = test::sampleTake();
    const SpanImageContent c = sampleContent();
    int tierCalls = 0;
    BundleImageWriter writer([&](const Take& t) {
        ++tierCalls;
        EXPECT_EQ(t.id, 3);
        return c.tiers;
    });
    for (int i = 0; i < 2; ++i) {
        const std::string png = sample.dir.file("mark-" + std::to_string(i) + ".png");
        writer.write(BundleImageRequest{c.take, c.mark, sample.audio->signal, 0.15, 0.85, png, 900 + 100 * i, 600});
        const QImage image(QString::fromStdString(png));
        ASSERT_FALSE(image.isNull()) << png;
        EXPECT_EQ(image.width(), 900 + 100 * i);
        EXPECT_EQ(image.height(), 600);
    }
    EXPECT_EQ(tierCalls, 1);
    EXPECT_THROW(writer.write(BundleImageRequest{c.take, c.mark, sample.audio->signal, 0.15, 0.85,
                                                 sample.dir.file("no-such-folder/x.png"), 900, 600}),
                 Error);
}

}  // namespace
}  // namespace earmark::widgets
