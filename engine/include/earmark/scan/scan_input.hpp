// What a scan reads: a folder of audio files or a manifest CSV, listed as
// items in a fixed order, and the shard of that list one process handles.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

namespace earmark {

struct ScanItem {
    std::size_t index = 0;    // position in the full listing (before sharding), 0-based
    std::string id;           // manifest id, or the path below the folder without extension
                              // (with it when files differ only by extension: x.flac, x.wav)
    std::string audioPath;    // as opened (manifest paths resolved against the manifest's folder)
    std::string text;         // script line; may be empty
    std::string timingsPath;  // word/phone timings file; may be empty
    std::string voice;        // the take's voice or language (espeak-ng name, e.g. "en-us"); may be empty
};

// True for the extensions libsndfile reads (wav, flac, ogg, oga, opus, aif,
// aiff, aifc, au, snd, caf, w64, rf64, mp3), case-insensitive.
bool isAudioFileName(const std::string& path);

// A folder: every audio file below it (recursively), sorted by path (byte
// order of the path below the folder). A file: a manifest CSV (RFC 4180)
// with a header naming at least `id` and `audio`, optionally `text`,
// `timings` and `voice`; other columns are ignored; relative paths are taken from the
// manifest's folder. Throws InputError(path, …) when the input is missing,
// the manifest lacks a column, a row has an empty id or audio field, or an
// id appears twice (naming the line).
std::vector<ScanItem> listScanInput(const std::string& path);

// One of N disjoint parts of a listing. Part k (1 ≤ k ≤ N) holds the items
// whose id hashes (FNV-1a, 64 bit, over the id's bytes) to k − 1 modulo N:
// the split depends only on the ids, not on the order of the listing or the
// machine, so re-running a shard after the input grew keeps old takes in
// their part.
struct Shard {
    int part = 1;   // k, 1-based
    int parts = 1;  // N

    // "K/N"; throws ParamError("Shard", …) for anything else or K outside 1…N.
    static Shard parse(const std::string& text);
    bool holds(const ScanItem& item) const;
};

std::uint64_t fnv1a64(const std::string& bytes);
std::vector<ScanItem> selectShard(const std::vector<ScanItem>& items, const Shard& shard);

}  // namespace earmark
