// Pictures of the lanes over one time span, for example bundles
// (docs/defect-list.md, "Bundle"): the window's own lanes — time ruler,
// waveform, spectrogram, pitch, energy — rendered offscreen into one image,
// under a title line and two strips drawn here: the mark (its span as a bar
// coloured by severity, captioned with category, subtype, severity and note)
// and the words of the take's word tier. Times on the axis are seconds from
// the start of the take. The context around the marked span (the bundle's
// padding) is shaded grey and hatched in every lane, so the marked span is
// the part in true colours between two dashed edges.
//
// Rendering needs a QApplication (the lanes are widgets) and runs on its
// thread. Nothing is shown on screen (Qt::WA_DontShowOnScreen), so it works
// on Qt's offscreen platform as well as under a desktop session. The colours
// are a fixed light palette, not the desktop's, so pictures look the same
// wherever they are made.
#pragma once

#include "earmark/export/bundle.hpp"
#include "earmark/store/take.hpp"
#include "earmark/widgets/analysis_settings.hpp"
#include "earmark/widgets/take_data.hpp"
#include "earmark/widgets/time_mapping.hpp"

#include <QImage>
#include <QRect>

#include <functional>
#include <vector>

namespace earmark::widgets {

struct SpanImageParams {
    int widthPx = 1200;  // size of the picture in pixels (device pixel ratio 1)
    int heightPx = 700;

    // Throws ParamError("SpanImageParams.widthPx" / ".heightPx") outside the
    // limits of BundleParams (kMinImageWidthPx, kMinImageHeightPx, kMaxImageSidePx).
    void validate() const;
};

// What one picture shows.
struct SpanImageContent {
    TakeAudioPtr audio;          // required
    TakeTracksPtr tracks;        // may be null: the pitch, energy and spectrogram lanes stay empty
    Take take;                   // line id, id and build for the title
    Mark mark;                   // span, category, subtype, severity, note
    std::vector<TierRow> tiers;  // the word tier ("words" or "word") is drawn when present
    TimeRange shown;             // the time span drawn, s from the start of the take
};

// Where things landed, in picture pixels (for tests and for callers that
// annotate further). x of a time t: plotLeft + (t − shown.start) ·
// (plotRight − plotLeft) / shown.span().
struct SpanImageLayout {
    int plotLeft = 0;         // x of shown.start
    int plotRight = 0;        // x of shown.end
    QRect title;              // the title band
    QRect markStrip;          // the mark bar and caption
    QRect wordStrip;          // the words
    QRect lanes;              // top ruler to the lowest lane (bottom ruler when shown), full width
    double spanLeftX = 0.0;   // x of the mark's start (clamped to the plot)
    double spanRightX = 0.0;  // x of the mark's end (clamped to the plot)
};

struct SpanImage {
    QImage image;  // Format_RGB32, exactly widthPx × heightPx
    SpanImageLayout layout;
};

// Renders one picture. Throws ParamError (params; "SpanImageContent.audio"
// when null; "SpanImageContent.shown" when empty, not finite, or outside
// the take).
SpanImage renderSpanImage(const SpanImageContent& content, const SpanImageParams& params = {});

// Writes bundle pictures: one PNG per BundleImageRequest, of the size the
// request asks for, over the request's clip span. Each take is analysed once
// (with `settings`, the window's defaults unless given) and kept while
// requests for the same take follow, as they do in a bundle (marks are listed
// take by take). `tiersOf` supplies a take's tiers for the word strip (empty
// function or empty result: no word tier).
//
// Needs a QApplication; GUI thread only. write() throws Error naming the PNG
// when it cannot be written, ParamError for a bad size, and whatever the
// analysis throws.
class BundleImageWriter {
public:
    using TiersOf = std::function<std::vector<TierRow>(const Take&)>;

    explicit BundleImageWriter(TiersOf tiersOf = {}, AnalysisSettings settings = {});
    void write(const BundleImageRequest& request);

private:
    TiersOf tiersOf_;
    AnalysisSettings settings_;
    TakeId cachedTake_ = 0;
    std::string cachedPath_;
    TakeAudioPtr audio_;
    TakeTracksPtr tracks_;
    std::vector<TierRow> tiers_;
};

}  // namespace earmark::widgets
