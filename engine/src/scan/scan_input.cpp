#include "earmark/scan/scan_input.hpp"

#include "earmark/core/error.hpp"
#include "earmark/io/text_file.hpp"
#include "earmark/store/take_list.hpp"  // parseCsv (RFC 4180)

#include <algorithm>
#include <cctype>
#include <charconv>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>

namespace earmark {
namespace fs = std::filesystem;
namespace {

std::string lower(std::string s) {
    for (auto& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    return s;
}

std::vector<ScanItem> listFolder(const fs::path& root) {
    std::vector<std::pair<std::string, fs::path>> files;
    std::error_code ec;
    fs::recursive_directory_iterator it(root, fs::directory_options::skip_permission_denied, ec);
    if (ec) throw InputError(root.string(), "cannot be listed: " + ec.message());
    for (; it != fs::recursive_directory_iterator(); it.increment(ec)) {
        if (ec) throw InputError(root.string(), "cannot be listed: " + ec.message());
        if (!it->is_regular_file(ec) || !isAudioFileName(it->path().filename().string())) continue;
        files.emplace_back(it->path().lexically_relative(root).generic_string(), it->path());
    }
    std::sort(files.begin(), files.end());
    // x.wav and x.flac side by side would both be take x: such files keep
    // their extension in the id, so every id stays unique.
    std::map<std::string, int> stems;
    for (const auto& f : files) ++stems[fs::path(f.first).replace_extension().generic_string()];
    std::vector<ScanItem> items;
    for (const auto& [rel, full] : files) {
        ScanItem item;
        item.index = items.size();
        item.id = fs::path(rel).replace_extension().generic_string();
        if (stems[item.id] > 1) item.id = rel;
        item.audioPath = full.string();
        items.push_back(std::move(item));
    }
    std::map<std::string, const ScanItem*> ids;
    for (const auto& item : items)
        if (auto [it, fresh] = ids.emplace(item.id, &item); !fresh)
            throw InputError(item.audioPath, "would be take '" + item.id + "' like " + it->second->audioPath +
                                                 "; rename one of them");
    return items;
}

std::vector<ScanItem> listManifest(const fs::path& manifest) {
    const std::string body = withoutByteOrderMark(readTextFile(manifest.string()));
    auto records = parseCsv(body, manifest.string());
    std::erase_if(records, [](const std::vector<std::string>& r) { return r.size() == 1 && r[0].empty(); });
    if (records.empty()) throw InputError(manifest.string(), "is empty (expected a header with id,audio)");
    std::map<std::string, std::size_t> column;
    for (std::size_t i = 0; i < records[0].size(); ++i) {
        std::string name = lower(records[0][i]);
        name.erase(0, name.find_first_not_of(' '));
        name.erase(name.find_last_not_of(' ') + 1);
        column.emplace(name, i);
    }
    for (const char* required : {"id", "audio"})
        if (!column.count(required))
            throw InputError(manifest.string(), std::string("the header has no '") + required +
                                                    "' column (expected id,audio[,text][,timings][,voice])");
    const fs::path base = manifest.parent_path();
    auto resolve = [&](const std::string& p) {
        const fs::path path(p);
        return (path.is_absolute() || base.empty() ? path : base / path).string();
    };
    auto cell = [&](const std::vector<std::string>& r, const char* name) -> std::string {
        auto it = column.find(name);
        return it != column.end() && it->second < r.size() ? r[it->second] : std::string();
    };
    std::vector<ScanItem> items;
    std::map<std::string, std::size_t> seen;
    for (std::size_t row = 1; row < records.size(); ++row) {
        const auto& r = records[row];
        const std::string where = "record " + std::to_string(row + 1);
        ScanItem item;
        item.index = items.size();
        item.id = cell(r, "id");
        const std::string audio = cell(r, "audio");
        if (item.id.empty()) throw InputError(manifest.string(), where + ": the id is empty");
        if (audio.empty()) throw InputError(manifest.string(), where + " ('" + item.id + "'): the audio path is empty");
        if (auto [it, fresh] = seen.emplace(item.id, row + 1); !fresh)
            throw InputError(manifest.string(), where + ": id '" + item.id + "' already used in record " +
                                                    std::to_string(it->second));
        item.audioPath = resolve(audio);
        item.text = cell(r, "text");
        if (const std::string t = cell(r, "timings"); !t.empty()) item.timingsPath = resolve(t);
        item.voice = cell(r, "voice");
        items.push_back(std::move(item));
    }
    return items;
}

}  // namespace

bool isAudioFileName(const std::string& path) {
    const std::string ext = lower(fs::path(path).extension().string());
    static const char* known[] = {".wav", ".flac", ".ogg", ".oga", ".opus", ".aif", ".aiff",
                                  ".aifc", ".au", ".snd", ".caf", ".w64", ".rf64", ".mp3"};
    return std::any_of(std::begin(known), std::end(known), [&](const char* k) { return ext == k; });
}

std::vector<ScanItem> listScanInput(const std::string& path) {
    std::error_code ec;
    const auto status = fs::status(path, ec);
    if (ec || !fs::exists(status)) throw InputError(path, "does not exist");
    if (fs::is_directory(status)) return listFolder(path);
    return listManifest(path);
}

std::uint64_t fnv1a64(const std::string& bytes) {
    std::uint64_t h = 14695981039346656037ull;
    for (unsigned char c : bytes) {
        h ^= c;
        h *= 1099511628211ull;
    }
    return h;
}

Shard Shard::parse(const std::string& text) {
    const auto slash = text.find('/');
    Shard s;
    auto number = [&](std::string_view v, int& out) {
        auto [p, ec] = std::from_chars(v.data(), v.data() + v.size(), out);
        return ec == std::errc() && p == v.data() + v.size();
    };
    if (slash == std::string::npos || !number(std::string_view(text).substr(0, slash), s.part) ||
        !number(std::string_view(text).substr(slash + 1), s.parts))
        throw ParamError("Shard", "expects K/N with whole numbers, e.g. 2/4, got '" + text + "'");
    if (s.parts < 1 || s.part < 1 || s.part > s.parts)
        throw ParamError("Shard", "K/N needs 1 <= K <= N, got '" + text + "'");
    return s;
}

bool Shard::holds(const ScanItem& item) const {
    return fnv1a64(item.id) % static_cast<std::uint64_t>(parts) == static_cast<std::uint64_t>(part - 1);
}

std::vector<ScanItem> selectShard(const std::vector<ScanItem>& items, const Shard& shard) {
    std::vector<ScanItem> out;
    for (const auto& item : items)
        if (shard.holds(item)) out.push_back(item);
    return out;
}

}  // namespace earmark
