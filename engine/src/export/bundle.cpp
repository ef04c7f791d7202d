#include "earmark/export/bundle.hpp"

#include "earmark/core/error.hpp"
#include "earmark/io/staging.hpp"

#include <nlohmann/json.hpp>


#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <numbers>
#include <optional>

namespace earmark {
namespace {

namespace fs = std::filesystem;
using nlohmann::ordered_json;

bool isEmptyFolder(const fs::path& dir) {
    std::error_code ec;
    return fs::is_directory(dir, ec) && fs::is_empty(dir, ec);
}

bool isEarmarkBundle(const fs::path& dir) {
    std::ifstream in(dir / "manifest.json", std::ios::binary);
    if (!in) return false;
    const auto j = nlohmann::json::parse(in, nullptr, false);
    return j.is_object() && j.value("format", "") == "earmark-bundle";
}

// Width and height (px) from a PNG's IHDR chunk, which the PNG specification
// (W3C / ISO/IEC 15948, §5.2 and §11.2.2) puts right after the 8-byte
// signature; nothing if the file is not a PNG. The manifest records what was
// written, not what was asked for.
std::optional<std::array<std::uint32_t, 2>> pngSize(const fs::path& path) {
    std::ifstream in(path, std::ios::binary);
    unsigned char h[24];
    if (!in.read(reinterpret_cast<char*>(h), sizeof h)) return std::nullopt;
    static constexpr unsigned char kSignature[8] = {0x89, 'P', 'N', 'G', '\r', '\n', 0x1a, '\n'};
    if (std::memcmp(h, kSignature, 8) != 0 || std::memcmp(h + 12, "IHDR", 4) != 0) return std::nullopt;
    auto bigEndian = [&](int at) {
        return (std::uint32_t{h[at]} << 24) | (std::uint32_t{h[at + 1]} << 16) | (std::uint32_t{h[at + 2]} << 8) |
               std::uint32_t{h[at + 3]};
    };
    return std::array<std::uint32_t, 2>{bigEndian(16), bigEndian(20)};
}

// Refuses before any work is done, so a refused export costs nothing.
void checkTarget(const fs::path& target, bool replace) {
    std::error_code ec;
    if (!fs::exists(target, ec) || isEmptyFolder(target)) return;
    if (!fs::is_directory(target, ec))
        throw InputError(target.string(), "exists and is not a folder; choose another bundle folder");
    if (!replace)
        throw InputError(target.string(), "already exists and is not empty; choose another folder or "
                                          "allow replacing it (--force)");
    if (!isEarmarkBundle(target))
        throw InputError(target.string(), "is not an Earmark bundle (no manifest.json of format "
                                          "earmark-bundle); refusing to replace it");
}

// File names stay portable: ASCII letters, digits, '.', '-' and '_' only.
std::string safeName(std::string_view text) {
    std::string out;
    for (char c : text) {
        const bool ok = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') ||
                        c == '-' || c == '.';
        if (ok) out += c;
        else if (out.empty() || out.back() != '_') out += '_';
        if (out.size() >= 60) break;
    }
    return out.empty() ? "take" : out;
}

std::string clipBaseName(const DefectRow& row) {
    char id[32];
    std::snprintf(id, sizeof id, "mark-%04lld", static_cast<long long>(row.mark.id));
    const std::string take =
        safeName(row.take.lineId.empty() ? fs::path(row.take.storedAudioPath).stem().string() : row.take.lineId);
    std::string kind(categoryName(row.mark.category));
    if (!row.mark.subtype.empty()) kind += "-" + row.mark.subtype;
    return std::string(id) + "_" + take + "_" + kind;
}

void writeFile(const fs::path& path, const std::string& text, const fs::path& target) {
    std::ofstream out(path, std::ios::binary | std::ios::trunc);
    out << text;
    out.flush();
    if (!out) throw WriteError(target.string(), "could not write " + path.filename().string() + " (disk full?)");
}

// Whether a folder holds only what a bundle holds (clips/, images/,
// manifest.json, manifest.csv): a leftover of an export, not a user's folder.
bool looksLikeBundleWork(const fs::path& dir) {
    std::error_code ec;
    if (!fs::is_directory(dir, ec) || fs::is_symlink(dir, ec)) return false;
    for (fs::directory_iterator it(dir, ec), end; !ec && it != end; it.increment(ec)) {
        const std::string name = it->path().filename().string();
        if (name != "clips" && name != "images" && name != "manifest.json" && name != "manifest.csv") return false;
    }
    return !ec;
}

// A killed export leaves its hidden work folders (".NAME.partial-PID", and
// ".NAME.old-PID" while replacing) holding voice clips; each export removes
// those of processes that no longer run from the folder it writes into.
void removeLeftovers(const fs::path& parent) {
    std::error_code ec;
    for (const char* kind : {"partial", "old"})
        for (const fs::path& stale : staleStaging(parent, kind))
            if (looksLikeBundleWork(stale)) fs::remove_all(stale, ec);
}

// Removes the folder being built unless the export finished.
class StagingFolder {
public:
    explicit StagingFolder(fs::path path) : path_(std::move(path)) {
        std::error_code ec;
        fs::remove_all(path_, ec);
        if (!fs::create_directories(path_ / "clips", ec))
            throw WriteError(path_.parent_path().string(), "cannot create a folder here: " + ec.message());
    }
    ~StagingFolder() {
        std::error_code ec;
        if (!done_) fs::remove_all(path_, ec);
    }
    StagingFolder(const StagingFolder&) = delete;
    StagingFolder& operator=(const StagingFolder&) = delete;
    const fs::path& path() const { return path_; }
    void release() { done_ = true; }

private:
    fs::path path_;
    bool done_ = false;
};

// Moves the finished folder into place. An earlier bundle is swapped with
// it in one step (the old one then sits in the staging folder and is
// removed); where the file system cannot swap, it is set aside first and
// removed only after the new one is in place.
void moveIntoPlace(const fs::path& staging, const fs::path& target, bool replace) {
    std::error_code ec;
    checkTarget(target, replace);  // again: the folder may have appeared while exporting
    if (isEmptyFolder(target)) fs::remove(target, ec);
    if (!fs::exists(target, ec)) {
        if (!moveIntoPlaceNoReplace(staging, target))
            throw InputError(target.string(), "appeared while exporting; nothing was replaced");
        syncFolder(target.parent_path());
        return;
    }
    if (exchangeInPlace(staging, target)) {
        syncFolder(target.parent_path());
        fs::remove_all(staging, ec);
        return;
    }
    const fs::path old = stagingPath(target, "old");
    fs::rename(target, old, ec);
    if (ec) throw WriteError(target.string(), "cannot be replaced: " + ec.message());
    fs::rename(staging, target, ec);
    if (ec) {
        std::error_code ignored;
        fs::rename(old, target, ignored);
        throw WriteError(target.string(), "cannot be created: " + ec.message());
    }
    fs::remove_all(old, ec);
}

}  // namespace

void BundleParams::validate() const {
    if (!(padSeconds >= 0 && padSeconds <= 10))
        throw ParamError("BundleParams.padSeconds", "must be between 0 and 10 s");
    if (!(fadeSeconds >= 0 && fadeSeconds <= 10))
        throw ParamError("BundleParams.fadeSeconds", "must be between 0 and 10 s");
    if (imageWidthPx < kMinImageWidthPx || imageWidthPx > kMaxImageSidePx)
        throw ParamError("BundleParams.imageWidthPx", "must be between " + std::to_string(kMinImageWidthPx) +
                                                          " and " + std::to_string(kMaxImageSidePx) + " px, not " +
                                                          std::to_string(imageWidthPx));
    if (imageHeightPx < kMinImageHeightPx || imageHeightPx > kMaxImageSidePx)
        throw ParamError("BundleParams.imageHeightPx", "must be between " + std::to_string(kMinImageHeightPx) +
                                                           " and " + std::to_string(kMaxImageSidePx) + " px, not " +
                                                           std::to_string(imageHeightPx));
}

Signal cutClip(const Signal& take, double startSeconds, double endSeconds, double padSeconds, double fadeSeconds,
               double* clipStartSeconds, double* clipEndSeconds) {
    const double rate = take.sampleRate;
    const auto n = static_cast<double>(take.size());
    const double first = std::clamp(std::round((startSeconds - padSeconds) * rate), 0.0, n);
    const double last = std::clamp(std::round((endSeconds + padSeconds) * rate), first, n);
    Signal clip;
    clip.sampleRate = rate;
    clip.samples.assign(take.samples.begin() + static_cast<std::ptrdiff_t>(first),
                        take.samples.begin() + static_cast<std::ptrdiff_t>(last));
    // Raised-cosine (sin²) gain over the first and last fade samples.
    const std::size_t fade =
        std::min(static_cast<std::size_t>(std::round(fadeSeconds * rate)), clip.size() / 2);
    for (std::size_t i = 0; i < fade; ++i) {
        const double s = std::sin(0.5 * std::numbers::pi * (static_cast<double>(i) + 0.5) / static_cast<double>(fade));
        const auto g = static_cast<float>(s * s);
        clip.samples[i] *= g;
        clip.samples[clip.size() - 1 - i] *= g;
    }
    if (clipStartSeconds) *clipStartSeconds = first / rate;
    if (clipEndSeconds) *clipEndSeconds = last / rate;
    return clip;
}

BundleResult writeBundle(const Session& session, const std::string& folder, const BundleParams& params,
                         const BundleImageRenderer& renderImage, Progress progress) {
    params.validate();
    fs::path target = fs::absolute(folder).lexically_normal();
    if (!target.has_filename()) target = target.parent_path();  // "dir/" → "dir"
    checkTarget(target, params.replaceExisting);
    std::error_code ec;
    fs::create_directories(target.parent_path(), ec);
    removeLeftovers(target.parent_path());

    const DefectList list = collectDefects(session);
    for (const DefectRow& row : list.rows)
        if (!fs::is_regular_file(row.take.audioPath, ec))
            throw InputError(row.take.audioPath, "audio of take " + std::to_string(row.take.id) +
                                                     " is missing (moved?); relocate the take before exporting");

    StagingFolder staging(stagingPath(target, "partial"));
    if (renderImage) fs::create_directories(staging.path() / "images", ec);

    ordered_json manifest = ordered_json::parse(defectListToJson(list, -1));
    manifest["format"] = "earmark-bundle";
    manifest["pad_s"] = params.padSeconds;
    manifest["fade_s"] = params.fadeSeconds;
    if (renderImage)
        manifest["images"] = ordered_json{{"drawn", true}, {"width_px", params.imageWidthPx},
                                          {"height_px", params.imageHeightPx}};
    else
        manifest["images"] = ordered_json{
            {"drawn", false},
            {"reason", params.noImagesReason.empty() ? "the exporting program draws no pictures"
                                                     : params.noImagesReason}};
    const auto measureNames = list.measureNames();
    auto csvHeader = defectCsvHeader(measureNames);
    for (const char* extra : {"clip_file", "clip_start_s", "clip_end_s", "image_file"}) csvHeader.push_back(extra);
    std::string csv = csvRecord(csvHeader);

    BundleResult result{target.string(), 0, 0};
    const double total = static_cast<double>(std::max<std::size_t>(list.rows.size(), 1));
    std::optional<LoadedAudio> audio;
    TakeId loadedTake = 0;
    for (std::size_t i = 0; i < list.rows.size(); ++i) {
        const DefectRow& row = list.rows[i];
        const Progress step = progress.sub(static_cast<double>(i) / total, static_cast<double>(i + 1) / total);
        if (!audio || loadedTake != row.take.id) {
            audio = loadAudio(row.take.audioPath, {}, {}, step.sub(0.0, 0.8));
            loadedTake = row.take.id;
        }
        double clipStart = 0, clipEnd = 0;
        const Signal clip = cutClip(audio->signal, row.mark.startSeconds, row.mark.endSeconds, params.padSeconds,
                                    params.fadeSeconds, &clipStart, &clipEnd);
        const std::string base = clipBaseName(row);
        const std::string clipFile = "clips/" + base + ".wav";
        writeWav((staging.path() / clipFile).string(), clip, params.encoding);
        ++result.clips;

        std::string imageFile;
        std::optional<std::array<std::uint32_t, 2>> imageSize;
        if (renderImage) {
            const std::string candidate = "images/" + base + ".png";
            renderImage(BundleImageRequest{row.take, row.mark, audio->signal, clipStart, clipEnd,
                                           (staging.path() / candidate).string(), params.imageWidthPx,
                                           params.imageHeightPx});
            if (fs::is_regular_file(staging.path() / candidate, ec)) {
                imageFile = candidate;
                imageSize = pngSize(staging.path() / candidate);
                ++result.images;
            }
        }
        manifest["marks"][i]["clip"] = ordered_json{
            {"file", clipFile},
            {"start_s", clipStart},
            {"end_s", clipEnd},
            {"mark_offset_s", row.mark.startSeconds - clipStart},
            {"sample_rate", clip.sampleRate},
            {"frames", clip.size()},
            {"image", imageFile.empty() ? ordered_json(nullptr) : ordered_json(imageFile)},
            {"image_width_px", imageSize ? ordered_json((*imageSize)[0]) : ordered_json(nullptr)},
            {"image_height_px", imageSize ? ordered_json((*imageSize)[1]) : ordered_json(nullptr)},
        };
        auto fields = defectCsvFields(row, measureNames);
        fields.insert(fields.end(), {clipFile, formatNumber(clipStart), formatNumber(clipEnd), imageFile});
        csv += csvRecord(fields);
        step.report(1.0);
    }
    writeFile(staging.path() / "manifest.json",
              manifest.dump(2, ' ', false, ordered_json::error_handler_t::replace) + "\n", target);
    writeFile(staging.path() / "manifest.csv", csv, target);
    moveIntoPlace(staging.path(), target, params.replaceExisting);
    staging.release();
    progress.report(1.0);
    return result;
}

}  // namespace earmark
