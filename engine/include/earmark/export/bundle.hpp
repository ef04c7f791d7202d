// Example bundles: a folder that explains each mark without the workbench,
// for a data team. Layout (docs/defect-list.md, "Bundle"):
//
//   DIR/manifest.json   the defect list (JSON, docs/defect-list.schema.json)
//                       with "format": "earmark-bundle" and a "clip" object
//                       per mark
//   DIR/manifest.csv    the defect list CSV plus clip_file, clip_start_s,
//                       clip_end_s, image_file columns
//   DIR/clips/*.wav     one clip per mark: the span ± padding, clamped to the
//                       take, mono (channels mixed), at the take's own sample
//                       rate, with a short raised-cosine fade in and out
//   DIR/images/*.png    one picture per mark, when an image renderer is given;
//                       manifest.json says whether pictures were drawn (top-level
//                       "images") and each clip's picture size (read back from
//                       the PNG header)
//
// The bundle is built in a hidden sibling folder (".NAME.partial-PID") and
// moved into place at the end (an earlier bundle is swapped with it in one
// step), so a failed, cancelled or killed export leaves the old bundle or the
// new one, never half of one. A killed export's hidden folder still holds
// voice clips: every export first removes such leftovers of processes that no
// longer run from the folder it writes into. An existing folder is
// never replaced unless BundleParams::replaceExisting is set, and even then
// only when it is empty or an earlier Earmark bundle (holds a manifest.json
// of format "earmark-bundle") — never an unrelated folder.
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"
#include "earmark/export/defect_list.hpp"
#include "earmark/io/audio_file.hpp"

#include <functional>
#include <string>

namespace earmark {

struct BundleParams {
    double padSeconds = 0.3;     // context before and after the span (clamped to the take)
    double fadeSeconds = 0.01;   // raised-cosine fade at each end of a clip (common practice: 5–20 ms
                                 // avoids an audible click where the cut lands mid-waveform)
    bool replaceExisting = false;
    WavEncoding encoding = WavEncoding::Pcm16;
    int imageWidthPx = 1200;     // picture size asked of the image renderer (px)
    int imageHeightPx = 700;
    std::string noImagesReason;  // why there are no pictures, for the manifest when no renderer is given

    static constexpr int kMinImageWidthPx = 400;
    static constexpr int kMinImageHeightPx = 300;
    static constexpr int kMaxImageSidePx = 8000;

    // Throws ParamError("BundleParams.padSeconds" / ".fadeSeconds"): both must be in [0, 10] s;
    // ("BundleParams.imageWidthPx" / ".imageHeightPx"): within the limits above.
    void validate() const;
};

// What an image renderer gets for one mark. References are valid only during the call.
struct BundleImageRequest {
    const Take& take;
    const Mark& mark;
    const Signal& audio;      // the whole take, mono, at its own rate
    double clipStartSeconds;  // the clip's span within the take
    double clipEndSeconds;
    std::string pngPath;      // where to write the picture (inside the folder being built)
    int widthPx = 1200;       // the picture size asked for (BundleParams::imageWidthPx, imageHeightPx)
    int heightPx = 700;
};

// Draws one picture per mark (the window provides one that renders its
// lanes). Called on the exporting thread; an exception aborts the export.
// A renderer that writes nothing leaves "image" null in the manifest.
using BundleImageRenderer = std::function<void(const BundleImageRequest&)>;

struct BundleResult {
    std::string folder;
    int clips = 0;
    int images = 0;
};

// Writes the bundle of every mark in the session into `folder`.
// Throws InputError (a take's audio is missing or unreadable; the folder
// exists and may not be replaced), Error (cannot write), ParamError,
// Cancelled. Progress runs once over all marks.
BundleResult writeBundle(const Session& session, const std::string& folder, const BundleParams& params = {},
                         const BundleImageRenderer& renderImage = {}, Progress progress = {});

// The clip of [startSeconds, endSeconds] ± pad, clamped to the signal, faded
// in and out over min(fadeSeconds, half the clip). Sample i of the clip is
// sample round(clipStart·rate) + i of the take. Exposed for tests.
Signal cutClip(const Signal& take, double startSeconds, double endSeconds, double padSeconds,
               double fadeSeconds, double* clipStartSeconds = nullptr, double* clipEndSeconds = nullptr);

}  // namespace earmark
