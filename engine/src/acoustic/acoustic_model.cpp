// Reader of the Sphinx model files. Layouts (all little- or big-endian,
// told by a magic number): the "s3" parameter files start with text lines
// "s3", key-value pairs, "endhdr", then int32 0x11223344, the dimensions,
// an int32 count of floats and the floats; `mdef` in binary form starts with
// "BMDF", a version, a self-describing format text, counts, the phone names,
// a context tree, the phone table and the tied-state sequences; `sendump`
// holds length-prefixed header strings, then for every stream and density
// one byte per tied state: the weight's negative log in units of
// 1024 · ln(1.0001) (the recogniser's log table base and score shift).
#include "earmark/acoustic/acoustic_model.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <fstream>
#include <limits>
#include <map>
#include <sstream>

namespace earmark {
namespace {

namespace fs = std::filesystem;

constexpr float kNegInf = -std::numeric_limits<float>::infinity();

std::string readWhole(const fs::path& path) {
    std::error_code ec;
    if (!fs::is_regular_file(path, ec)) throw InputError(path.string(), "missing (not a model file)");
    std::ifstream in(path, std::ios::binary);
    if (!in) throw InputError(path.string(), "cannot be read");
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

// A cursor over a binary file with the file's byte order.
class Bytes {
public:
    Bytes(std::string data, std::string subject) : data_(std::move(data)), subject_(std::move(subject)) {}
    std::size_t pos() const { return pos_; }
    std::size_t left() const { return data_.size() - pos_; }
    void seek(std::size_t p) {
        if (p > data_.size()) fail("is truncated");
        pos_ = p;
    }
    void setSwap(bool swap) { swap_ = swap; }
    [[noreturn]] void fail(const std::string& problem) const { throw InputError(subject_, problem); }
    const std::string& data() const { return data_; }

    std::int32_t i32() {
        std::uint32_t v = u32raw();
        return static_cast<std::int32_t>(v);
    }
    std::int16_t i16() {
        need(2);
        std::uint16_t v;
        std::memcpy(&v, data_.data() + pos_, 2);
        pos_ += 2;
        if (swap_) v = static_cast<std::uint16_t>((v >> 8) | (v << 8));
        return static_cast<std::int16_t>(v);
    }
    std::uint8_t u8() {
        need(1);
        return static_cast<std::uint8_t>(data_[pos_++]);
    }
    float f32() {
        std::uint32_t v = u32raw();
        float f;
        std::memcpy(&f, &v, 4);
        return f;
    }
    std::string text(std::size_t n) {
        need(n);
        std::string s = data_.substr(pos_, n);
        pos_ += n;
        return s;
    }
    // A count read from the file, checked against a sane bound.
    std::size_t count(const char* what, std::size_t most) {
        const std::int32_t v = i32();
        if (v < 0 || static_cast<std::size_t>(v) > most)
            fail(std::string("holds an impossible ") + what + " (" + std::to_string(v) + ")");
        return static_cast<std::size_t>(v);
    }

private:
    std::uint32_t u32raw() {
        need(4);
        std::uint32_t v;
        std::memcpy(&v, data_.data() + pos_, 4);
        pos_ += 4;
        if (swap_) v = __builtin_bswap32(v);
        return v;
    }
    void need(std::size_t n) const {
        if (n > data_.size() - pos_) fail("is truncated");
    }
    std::string data_;
    std::string subject_;
    std::size_t pos_ = 0;
    bool swap_ = false;
};

// Skips the "s3" text header and sets the byte order from the magic number.
Bytes openS3(const fs::path& path) {
    Bytes b(readWhole(path), path.string());
    const std::string& d = b.data();
    if (d.rfind("s3\n", 0) != 0) b.fail("is not a Sphinx parameter file (no \"s3\" header)");
    const std::size_t end = d.find("endhdr\n");
    if (end == std::string::npos) b.fail("has no end of header");
    b.seek(end + 7);
    const std::int32_t magic = b.i32();
    if (magic == 0x11223344) return b;
    if (magic == 0x44332211) {
        b.setSwap(true);
        return b;
    }
    b.fail("has an unknown byte-order mark");
}

std::vector<float> readFloats(Bytes& b, std::size_t expected) {
    const std::size_t n = b.count("value count", std::size_t{1} << 28);
    if (n != expected)
        b.fail("holds " + std::to_string(n) + " values where its dimensions give " + std::to_string(expected));
    std::vector<float> v(n);
    for (float& x : v) {
        x = b.f32();
        if (!std::isfinite(x)) b.fail("holds a value that is not a finite number");
    }
    return v;
}

struct GaussianFile {
    std::size_t codebooks = 0, streams = 0, densities = 0;
    std::vector<std::size_t> sizes;
    std::vector<float> values;  // [codebook][stream][density][dim]
};

GaussianFile readGaussians(const fs::path& path) {
    Bytes b = openS3(path);
    GaussianFile g;
    g.codebooks = b.count("codebook count", 1 << 20);
    g.streams = b.count("stream count", 16);
    g.densities = b.count("density count", 1 << 16);
    std::size_t dims = 0;
    for (std::size_t s = 0; s < g.streams; ++s) {
        g.sizes.push_back(b.count("stream size", 1 << 12));
        dims += g.sizes.back();
    }
    if (g.codebooks == 0 || g.streams == 0 || g.densities == 0 || dims == 0) b.fail("holds no Gaussians");
    g.values = readFloats(b, g.codebooks * g.densities * dims);
    return g;
}

std::map<std::string, std::string> readFeatParams(const fs::path& path) {
    std::map<std::string, std::string> out;
    std::error_code ec;
    if (!fs::exists(path, ec)) return out;
    std::istringstream in(readWhole(path));
    std::string key, value;
    while (in >> key) {
        if (!(in >> value)) break;
        if (!key.empty() && key[0] == '-') out[key.substr(1)] = value;
    }
    return out;
}

double numberParam(const std::map<std::string, std::string>& p, const char* key, double fallback,
                   const fs::path& file) {
    auto it = p.find(key);
    if (it == p.end()) return fallback;
    try {
        std::size_t used = 0;
        const double v = std::stod(it->second, &used);
        if (used != it->second.size() || !std::isfinite(v)) throw std::invalid_argument(key);
        return v;
    } catch (const std::exception&) {
        throw InputError(file.string(), std::string("-") + key + " is not a number: " + it->second);
    }
}

std::uint64_t triphoneKey(int base, int left, int right, WordPosition pos) {
    return (static_cast<std::uint64_t>(static_cast<std::uint16_t>(base)) << 48) |
           (static_cast<std::uint64_t>(static_cast<std::uint16_t>(left)) << 32) |
           (static_cast<std::uint64_t>(static_cast<std::uint16_t>(right)) << 16) |
           static_cast<std::uint64_t>(pos);
}

}  // namespace

struct AcousticModelReader {
    static void frontEnd(AcousticModel& m) {
        const fs::path file = m.folder_ / "feat.params";
        const auto p = readFeatParams(file);
        ModelFrontEnd& f = m.frontEnd_;
        f.sampleRateHz = numberParam(p, "samprate", f.sampleRateHz, file);
        f.lowerHz = numberParam(p, "lowerf", f.lowerHz, file);
        f.upperHz = numberParam(p, "upperf", f.upperHz, file);
        f.filters = static_cast<int>(numberParam(p, "nfilt", f.filters, file));
        f.cepstra = static_cast<int>(numberParam(p, "ncep", f.cepstra, file));
        f.lifter = static_cast<int>(numberParam(p, "lifter", f.lifter, file));
        f.windowSeconds = numberParam(p, "wlen", f.windowSeconds, file);
        f.framesPerSecond = static_cast<int>(numberParam(p, "frate", f.framesPerSecond, file));
        f.fftSize = static_cast<int>(numberParam(p, "nfft", f.fftSize, file));
        f.preemphasis = numberParam(p, "alpha", f.preemphasis, file);
        if (auto it = p.find("cmn"); it != p.end()) f.batchCmn = it->second != "none";
        if (auto it = p.find("feat"); it != p.end() && it->second != "1s_c_d_dd")
            throw InputError(file.string(), "feature type " + it->second + " is not supported (only 1s_c_d_dd)");
        if (auto it = p.find("transform"); it != p.end() && it->second != "dct")
            throw InputError(file.string(), "transform " + it->second + " is not supported (only dct)");
        if (f.filters < 2 || f.filters > 256 || f.cepstra < 2 || f.cepstra > f.filters || f.framesPerSecond < 10 ||
            f.framesPerSecond > 1000 || f.fftSize < 64 || f.fftSize > 8192 || !(f.lowerHz >= 0) ||
            !(f.upperHz > f.lowerHz) || f.upperHz > f.sampleRateHz / 2 + 1 || !(f.windowSeconds > 0) ||
            f.windowSeconds * f.sampleRateHz > f.fftSize)
            throw InputError(file.string(), "describes a front end that cannot be built");
        f.streamSizes = {f.cepstra, f.cepstra, f.cepstra};
    }

    static void definition(AcousticModel& m) {
        const fs::path path = m.folder_ / "mdef";
        Bytes b(readWhole(path), path.string());
        if (b.data().rfind("BMDF", 0) == 0) {
            b.seek(4);
        } else if (b.data().rfind("FDMB", 0) == 0) {
            b.seek(4);
            b.setSwap(true);
        } else {
            b.fail("is not a binary model definition (text definitions are not supported)");
        }
        b.i32();  // format version
        const std::size_t descriptionBytes = b.count("description length", 1 << 20);
        b.seek(b.pos() + descriptionBytes);
        const std::size_t nBase = b.count("base phone count", 1000);
        const std::size_t nPhone = b.count("phone count", 10'000'000);
        const std::size_t nEmit = b.count("state count", 100);
        b.count("context-independent state count", 1 << 24);
        const std::size_t nSen = b.count("tied state count", 1 << 24);
        const std::size_t nTmat = b.count("transition matrix count", 1 << 20);
        const std::size_t nSseq = b.count("state sequence count", 10'000'000);
        b.count("context size", 8);
        const std::size_t nTree = b.count("context tree size", 10'000'000);
        const std::int32_t sil = b.i32();
        if (nEmit != static_cast<std::size_t>(AcousticModel::kStates))
            b.fail("has " + std::to_string(nEmit) + " states per phone (3 are supported)");
        if (nBase == 0 || nPhone < nBase) b.fail("has no phones");
        // Phone names: NUL-terminated, then padding to 4 bytes.
        for (std::size_t i = 0; i < nBase; ++i) {
            const std::size_t end = b.data().find('\0', b.pos());
            if (end == std::string::npos) b.fail("is truncated");
            m.basePhones_.push_back(b.text(end - b.pos()));
            b.u8();
        }
        b.seek((b.pos() + 3) & ~std::size_t{3});
        b.seek(b.pos() + nTree * 8);  // the context tree: we index the phone table directly
        m.silence_ = (sil >= 0 && static_cast<std::size_t>(sil) < nBase) ? sil : -1;
        struct Row {
            std::int32_t sseq, tmat;
            std::uint8_t attr[4];
        };
        std::vector<Row> rows(nPhone);
        for (Row& r : rows) {
            r.sseq = b.i32();
            r.tmat = b.i32();
            for (auto& a : r.attr) a = b.u8();
            if (r.sseq < 0 || static_cast<std::size_t>(r.sseq) >= nSseq || r.tmat < 0 ||
                static_cast<std::size_t>(r.tmat) >= nTmat)
                b.fail("has a phone with an impossible state sequence or transition matrix");
        }
        // The state sequences, preceded by their total count of entries.
        if (b.count("state sequence size", 1 << 28) != nSseq * nEmit) b.fail("has state sequences of the wrong size");
        std::vector<std::array<int, AcousticModel::kStates>> sseq(nSseq);
        for (auto& s : sseq)
            for (int& id : s) {
                id = b.i16();
                if (id < 0 || static_cast<std::size_t>(id) >= nSen) b.fail("refers to a tied state that does not exist");
            }
        m.senoneCodebook_.assign(nSen, -1);  // holds the base phone for now; see gaussians()
        m.filler_.assign(nBase, false);
        for (std::size_t i = 0; i < nPhone; ++i) {
            const Row& r = rows[i];
            int base;
            if (i < nBase) {
                base = static_cast<int>(i);
                m.filler_[i] = r.attr[0] != 0;
            } else {
                base = r.attr[1];
                const int left = r.attr[2], right = r.attr[3];
                if (static_cast<std::size_t>(base) >= nBase || static_cast<std::size_t>(left) >= nBase ||
                    static_cast<std::size_t>(right) >= nBase || r.attr[0] > 3)
                    b.fail("has a triphone with an impossible context");
                m.triphones_[triphoneKey(base, left, right, static_cast<WordPosition>(r.attr[0]))] = static_cast<int>(i);
            }
            m.phoneStates_.push_back(sseq[static_cast<std::size_t>(r.sseq)]);
            m.phoneBase_.push_back(base);
            m.phoneTmat_.push_back(r.tmat);
            for (int s : sseq[static_cast<std::size_t>(r.sseq)]) m.senoneCodebook_[static_cast<std::size_t>(s)] = base;
        }
    }

    static void transitions(AcousticModel& m) {
        const fs::path path = m.folder_ / "transition_matrices";
        Bytes b = openS3(path);
        const std::size_t n = b.count("matrix count", 1 << 20);
        const std::size_t rows = b.count("row count", 100);
        const std::size_t cols = b.count("column count", 100);
        if (rows != AcousticModel::kStates || cols != AcousticModel::kStates + 1)
            b.fail("holds " + std::to_string(rows) + "x" + std::to_string(cols) + " matrices (3x4 expected)");
        const std::vector<float> v = readFloats(b, n * rows * cols);
        m.tmats_.resize(n);
        for (std::size_t t = 0; t < n; ++t)
            for (std::size_t i = 0; i < rows; ++i) {
                float sum = 0;
                for (std::size_t j = 0; j < cols; ++j) sum += std::max(0.0f, v[(t * rows + i) * cols + j]);
                if (!(sum > 0)) b.fail("has a state with no way out");
                for (std::size_t j = 0; j < cols; ++j) {
                    const float p = v[(t * rows + i) * cols + j] / sum;
                    // Only left-to-right moves: self, next, skip one.
                    m.tmats_[t][i][j] = (p > 0 && j >= i) ? std::log(p) : kNegInf;
                }
            }
        for (int t : m.phoneTmat_)
            if (static_cast<std::size_t>(t) >= n) b.fail("has fewer matrices than the model definition uses");
    }

    static void gaussians(AcousticModel& m) {
        const GaussianFile means = readGaussians(m.folder_ / "means");
        const GaussianFile vars = readGaussians(m.folder_ / "variances");
        const std::string vpath = (m.folder_ / "variances").string();
        if (means.codebooks != vars.codebooks || means.streams != vars.streams || means.densities != vars.densities ||
            means.sizes != vars.sizes)
            throw InputError(vpath, "does not match the shape of the means");
        std::vector<int> sizes(means.sizes.begin(), means.sizes.end());
        if (sizes != m.frontEnd_.streamSizes)
            throw InputError((m.folder_ / "means").string(), "has feature streams that do not match feat.params");
        m.codebooks_ = static_cast<int>(means.codebooks);
        m.densities_ = static_cast<int>(means.densities);
        m.featureSize_ = 0;
        m.streamOffset_.clear();
        for (int s : sizes) {
            m.streamOffset_.push_back(m.featureSize_);
            m.featureSize_ += s;
        }
        m.means_ = means.values;
        m.precisions_.resize(vars.values.size());
        m.logConsts_.resize(means.codebooks * means.streams * means.densities);
        constexpr double kVarianceFloor = 1e-4;  // the recogniser's default floor
        for (std::size_t cb = 0; cb < means.codebooks; ++cb)
            for (std::size_t s = 0; s < means.streams; ++s)
                for (std::size_t d = 0; d < means.densities; ++d) {
                    const std::size_t off = m.gaussianOffset(static_cast<int>(cb), static_cast<int>(s), static_cast<int>(d));
                    double logDet = 0;
                    for (std::size_t k = 0; k < means.sizes[s]; ++k) {
                        const double var = std::max<double>(vars.values[off + k], kVarianceFloor);
                        m.precisions_[off + k] = static_cast<float>(1.0 / var);
                        logDet += std::log(2.0 * M_PI * var);
                    }
                    m.logConsts_[(cb * means.streams + s) * means.densities + d] = static_cast<float>(-0.5 * logDet);
                }
        // Transposed copies for scoring (dimension-major within a stream).
        m.meansT_.resize(m.means_.size());
        m.precisionsT_.resize(m.precisions_.size());
        for (std::size_t cb = 0; cb < means.codebooks; ++cb)
            for (std::size_t s = 0; s < means.streams; ++s) {
                const std::size_t base = m.gaussianOffset(static_cast<int>(cb), static_cast<int>(s), 0);
                const std::size_t dim = means.sizes[s];
                for (std::size_t d = 0; d < means.densities; ++d)
                    for (std::size_t k = 0; k < dim; ++k) {
                        m.meansT_[base + k * means.densities + d] = m.means_[base + d * dim + k];
                        m.precisionsT_[base + k * means.densities + d] = m.precisions_[base + d * dim + k];
                    }
            }
        // Which codebook each tied state draws from.
        const std::size_t nSen = m.senoneCodebook_.size();
        if (means.codebooks == nSen) {
            for (std::size_t s = 0; s < nSen; ++s) m.senoneCodebook_[s] = static_cast<int>(s);
        } else if (means.codebooks == 1) {
            std::fill(m.senoneCodebook_.begin(), m.senoneCodebook_.end(), 0);
        } else if (means.codebooks == m.basePhones_.size()) {
            for (int& c : m.senoneCodebook_)
                if (c < 0) throw InputError((m.folder_ / "mdef").string(), "has a tied state no phone uses");
        } else {
            throw InputError((m.folder_ / "means").string(),
                             "holds " + std::to_string(means.codebooks) +
                                 " codebooks: neither one, one per base phone, nor one per tied state");
        }
    }

    static void weights(AcousticModel& m) {
        const std::size_t nSen = m.senoneCodebook_.size();
        const std::size_t nStream = m.frontEnd_.streamSizes.size();
        const std::size_t nDen = static_cast<std::size_t>(m.densities_);
        m.logWeights_.assign(nSen * nStream * nDen, kNegInf);
        const fs::path dump = m.folder_ / "sendump";
        std::error_code ec;
        if (fs::exists(dump, ec)) {
            Bytes b(readWhole(dump), dump.string());
            // Byte order: the first length must be small.
            const std::int32_t first = b.i32();
            if (first < 0 || first > 65536) b.setSwap(true);
            b.seek(0);
            int clusters = -1;
            while (true) {
                const std::size_t n = b.count("header string length", 1 << 16);
                if (n == 0) break;
                std::string line = b.text(n);
                line.erase(std::find(line.begin(), line.end(), '\0'), line.end());
                if (line.rfind("cluster_count ", 0) == 0) clusters = std::atoi(line.c_str() + 14);
            }
            if (clusters != 0) b.fail("holds clustered weights, which are not supported");
            const std::size_t rows = b.count("density count", 1 << 16);
            const std::size_t cols = b.count("tied state count", 1 << 24);
            if (rows != nDen || cols != nSen) b.fail("does not match the model's densities and tied states");
            if (b.left() < nStream * rows * cols) b.fail("is truncated");
            const double unit = 1024.0 * std::log(1.0001);
            for (std::size_t f = 0; f < nStream; ++f)
                for (std::size_t d = 0; d < rows; ++d)
                    for (std::size_t s = 0; s < cols; ++s)
                        m.logWeights_[(s * nStream + f) * nDen + d] = static_cast<float>(-unit * b.u8());
            return;
        }
        const fs::path path = m.folder_ / "mixture_weights";
        Bytes b = openS3(path);
        const std::size_t sen = b.count("tied state count", 1 << 24);
        const std::size_t streams = b.count("stream count", 16);
        const std::size_t den = b.count("density count", 1 << 16);
        if (sen != nSen || streams != nStream || den != nDen) b.fail("does not match the model's shape");
        const std::vector<float> v = readFloats(b, sen * streams * den);
        for (std::size_t s = 0; s < sen; ++s)
            for (std::size_t f = 0; f < streams; ++f) {
                double sum = 0;
                for (std::size_t d = 0; d < den; ++d) sum += std::max(0.0f, v[(s * streams + f) * den + d]);
                for (std::size_t d = 0; d < den; ++d) {
                    const double w = sum > 0 ? std::max(0.0f, v[(s * streams + f) * den + d]) / sum : 0.0;
                    m.logWeights_[(s * streams + f) * den + d] =
                        static_cast<float>(std::log(std::max(w, 1e-7)));  // the recogniser's weight floor
                }
            }
    }
};

AcousticModel AcousticModel::load(const std::filesystem::path& folder) {
    std::error_code ec;
    if (!fs::is_directory(folder, ec)) throw InputError(folder.string(), "is not an acoustic model folder");
    AcousticModel m;
    m.folder_ = folder;
    AcousticModelReader::frontEnd(m);
    AcousticModelReader::definition(m);
    AcousticModelReader::transitions(m);
    AcousticModelReader::gaussians(m);
    AcousticModelReader::weights(m);
    return m;
}

std::optional<std::filesystem::path> AcousticModel::installedEnglishModel() {
    for (const char* env : {"EARMARK_ACOUSTIC_MODEL"})
        if (const char* p = std::getenv(env); p && *p) return fs::path(p);
    const fs::path p = "/usr/share/pocketsphinx/model/en-us/en-us";
    std::error_code ec;
    if (fs::exists(p / "mdef", ec)) return p;
    return std::nullopt;
}

std::optional<std::filesystem::path> AcousticModel::installedEnglishDictionary() {
    if (const char* p = std::getenv("EARMARK_PRONOUNCING_DICTIONARY"); p && *p) return fs::path(p);
    const fs::path p = "/usr/share/pocketsphinx/model/en-us/cmudict-en-us.dict";
    std::error_code ec;
    if (fs::exists(p, ec)) return p;
    return std::nullopt;
}

std::optional<int> AcousticModel::basePhone(const std::string& name) const {
    for (std::size_t i = 0; i < basePhones_.size(); ++i)
        if (basePhones_[i] == name) return static_cast<int>(i);
    return std::nullopt;
}

int AcousticModel::phoneModel(int base, int left, int right, WordPosition position) const {
    if (isFiller(base) || left < 0 || right < 0) return base;
    // Fillers as context count as silence.
    if (silence_ >= 0) {
        if (isFiller(left)) left = silence_;
        if (isFiller(right)) right = silence_;
    }
    if (auto it = triphones_.find(triphoneKey(base, left, right, position)); it != triphones_.end()) return it->second;
    for (WordPosition p : {WordPosition::Internal, WordPosition::Begin, WordPosition::End, WordPosition::Single})
        if (auto it = triphones_.find(triphoneKey(base, left, right, p)); it != triphones_.end()) return it->second;
    return base;
}

const std::array<std::array<float, AcousticModel::kStates + 1>, AcousticModel::kStates>& AcousticModel::transitions(
    int model) const {
    return tmats_.at(static_cast<std::size_t>(phoneTmat_.at(static_cast<std::size_t>(model))));
}

std::size_t AcousticModel::gaussianOffset(int codebook, int stream, int density) const {
    const std::size_t perDensityBlock = static_cast<std::size_t>(featureSize_);
    // Layout [codebook][stream][density][dim]: a stream's block is densities × its size.
    std::size_t off = static_cast<std::size_t>(codebook) * static_cast<std::size_t>(densities_) * perDensityBlock;
    off += static_cast<std::size_t>(streamOffset_[static_cast<std::size_t>(stream)]) * static_cast<std::size_t>(densities_);
    off += static_cast<std::size_t>(density) * static_cast<std::size_t>(frontEnd_.streamSizes[static_cast<std::size_t>(stream)]);
    return off;
}

const float* AcousticModel::mean(int codebook, int stream, int density) const {
    return means_.data() + gaussianOffset(codebook, stream, density);
}
const float* AcousticModel::precision(int codebook, int stream, int density) const {
    return precisions_.data() + gaussianOffset(codebook, stream, density);
}
float AcousticModel::logConst(int codebook, int stream, int density) const {
    return logConsts_[(static_cast<std::size_t>(codebook) * static_cast<std::size_t>(streams()) +
                       static_cast<std::size_t>(stream)) *
                          static_cast<std::size_t>(densities_) +
                      static_cast<std::size_t>(density)];
}

}  // namespace earmark
