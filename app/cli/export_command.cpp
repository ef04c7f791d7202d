// earmark-cli export: a session's marks as a defect list (CSV, JSON) and/or
// an example bundle folder (docs/defect-list.md). Built with the window
// (EARMARK_BUILD_GUI), the bundle gets one picture of the lanes per mark,
// drawn offscreen by earmark_widgets; without it, none, and the manifest
// says why.
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"
#include "terminal_progress.hpp"

#include "earmark/core/error.hpp"
#include "earmark/export/bundle.hpp"
#include "earmark/export/defect_list.hpp"
#include "earmark/store/session.hpp"

#include <cstdio>
#include <memory>
#include <regex>
#include <tuple>
#include <utility>

#ifdef EARMARK_CLI_WITH_PICTURES
#include "earmark/widgets/span_image.hpp"

#include <QApplication>
#endif

namespace earmark::cli {
namespace {

Arguments exportArguments() {
    return Arguments(
        "export", "FILE (--csv OUT | --json OUT | --bundle DIR) [OPTIONS]",
        {
            {"csv", "OUT|-", "", "defect list as CSV (RFC 4180), one row per mark; - = stdout"},
            {"json", "OUT|-", "", "defect list as JSON (docs/defect-list.schema.json); - = stdout"},
            {"bundle", "DIR", "", "example bundle: manifests, one clipped WAV and (GUI builds) one PNG per mark"},
            {"take", "ID", "", "only the marks of this take (CSV and JSON)"},
            {"pad-ms", "MS", "300", "context kept before and after each mark in bundle clips"},
            {"fade-ms", "MS", "10", "fade in and out at the ends of each clip"},
            {"image-size", "WxH", "1200x700", "size of each bundle picture in pixels"},
            {"force", "", "", "replace an existing bundle folder (only an earlier Earmark bundle)"},
            {"progress", "", "", "show progress on stderr even when it is not a terminal"},
        });
}

// writeTextOutput ends the text with '\n'; drop the CSV's own final LF so the
// last record still ends in CRLF (RFC 4180) and no blank line follows.
std::string withoutFinalLf(std::string text) {
    if (!text.empty() && text.back() == '\n') text.pop_back();
    return text;
}

// "1200x700" → {1200, 700}.
std::pair<int, int> parseImageSize(const std::string& text) {
    static const std::regex pattern("([0-9]{1,5})[xX]([0-9]{1,5})");
    std::smatch m;
    if (!std::regex_match(text, m, pattern))
        throw UsageError("--image-size wants WxH in pixels, e.g. 1200x700, not '" + text + "'");
    const int w = std::stoi(m[1]), h = std::stoi(m[2]);
    const bool tooSmall = w < BundleParams::kMinImageWidthPx || h < BundleParams::kMinImageHeightPx;
    if (tooSmall || w > BundleParams::kMaxImageSidePx || h > BundleParams::kMaxImageSidePx)
        throw UsageError("--image-size must be between " + std::to_string(BundleParams::kMinImageWidthPx) + "x" +
                         std::to_string(BundleParams::kMinImageHeightPx) + " and " +
                         std::to_string(BundleParams::kMaxImageSidePx) + "x" +
                         std::to_string(BundleParams::kMaxImageSidePx) + ", not " + text);
    return {w, h};
}

#ifdef EARMARK_CLI_WITH_PICTURES
// Qt's notes about the offscreen platform (no window manager, no runtime
// folder) say nothing about the pictures, whose writing is checked anyway;
// only its errors reach stderr.
void qtErrorsOnly(QtMsgType type, const QMessageLogContext&, const QString& message) {
    if (type == QtCriticalMsg || type == QtFatalMsg)
        std::fprintf(stderr, "earmark-cli: Qt: %s\n", qPrintable(message));
}

// The widgets need a QApplication. It is made on the first picture, so that
// exports refused before any work never start Qt, and on Qt's offscreen
// platform when none was chosen and there is no display to talk to.
class OffscreenQt {
public:
    void ensure() {
        if (QCoreApplication::instance()) return;
        if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM") && qEnvironmentVariableIsEmpty("DISPLAY") &&
            qEnvironmentVariableIsEmpty("WAYLAND_DISPLAY"))
            qputenv("QT_QPA_PLATFORM", "offscreen");
        qInstallMessageHandler(qtErrorsOnly);
        app_ = std::make_unique<QApplication>(argc_, argv_);
    }

private:
    int argc_ = 1;
    char name_[12] = "earmark-cli";
    char* argv_[2] = {name_, nullptr};
    std::unique_ptr<QApplication> app_;
};
#endif

}  // namespace

int runExport(const std::vector<std::string>& argv) {
    Arguments args = exportArguments();
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    if (args.positionals().size() != 1) throw UsageError("expects exactly one session FILE (see --help)");
    if (!args.has("csv") && !args.has("json") && !args.has("bundle"))
        throw UsageError("needs at least one of --csv OUT, --json OUT, --bundle DIR");
    if (args.value("csv") == "-" && args.value("json") == "-")
        throw UsageError("--csv and --json cannot both write to stdout");
    BundleParams bundle;
    if (auto v = args.number("pad-ms")) bundle.padSeconds = *v / 1000.0;
    if (auto v = args.number("fade-ms")) bundle.fadeSeconds = *v / 1000.0;
    bundle.replaceExisting = args.has("force");
    if (auto v = args.value("image-size")) std::tie(bundle.imageWidthPx, bundle.imageHeightPx) = parseImageSize(*v);
    bundle.validate();

    const Session session = Session::open(args.positionals().front(), OpenMode::ReadOnly);
    std::optional<TakeId> take;
    if (auto key = args.value("take")) {
        take = session.findTake(*key);
        if (!take) throw InputError(session.path(), "has no take '" + *key + "' (see earmark-cli session list)");
    }
    const bool toStdout = args.value("csv") == "-" || args.value("json") == "-";
    if (args.has("csv") || args.has("json")) {
        const DefectList list = collectDefects(session, take);
        if (auto out = args.value("csv")) writeTextOutput(*out, withoutFinalLf(defectListToCsv(list)));
        if (auto out = args.value("json")) writeTextOutput(*out, defectListToJson(list));
        if (!toStdout) std::fprintf(stderr, "exported %zu mark(s)\n", list.rows.size());
    }
    if (auto dir = args.value("bundle")) {
        if (take) throw UsageError("--take applies to --csv and --json only; a bundle holds every mark");
        BundleImageRenderer renderer;
#ifdef EARMARK_CLI_WITH_PICTURES
        OffscreenQt qt;  // outlives the writer and every widget it makes
        widgets::BundleImageWriter pictures([&session](const Take& t) { return session.tiers(t.id); });
        renderer = [&qt, &pictures](const BundleImageRequest& request) {
            qt.ensure();
            pictures.write(request);
        };
#else
        bundle.noImagesReason = "this earmark-cli was built without the window (EARMARK_BUILD_GUI=OFF) and draws "
                                "no pictures";
#endif
        BundleResult result;
        {
            TerminalProgress bar("exporting bundle", args.has("progress"));
            result = writeBundle(session, *dir, bundle, renderer, bar.progress());
        }
        std::fprintf(stderr, "wrote %d clip(s) and %d picture(s) to %s\n", result.clips, result.images,
                     result.folder.c_str());
    }
    return kExitOk;
}

}  // namespace earmark::cli
