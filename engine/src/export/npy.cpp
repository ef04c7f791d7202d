#include "earmark/export/npy.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <array>
#include <bit>
#include <cctype>
#include <cerrno>
#include <cmath>
#include <cstring>
#include <fstream>
#include <limits>
#include <optional>

namespace earmark {

namespace {

constexpr char kMagic[] = "\x93NUMPY";
constexpr std::size_t kMagicSize = 6;
constexpr std::size_t kAlignment = 64;
// A header this long is no array description: refuse before allocating it.
constexpr std::uint32_t kMaxHeaderBytes = 1u << 20;

std::string shapeText(const std::vector<std::int64_t>& shape) {
    std::string s = "(";
    for (std::size_t i = 0; i < shape.size(); ++i) {
        if (i) s += ", ";
        s += std::to_string(shape[i]);
    }
    if (shape.size() == 1) s += ",";  // a one-element Python tuple
    return s + ")";
}

template <std::size_t N>
void reverseBytes(unsigned char* p) {
    std::reverse(p, p + N);
}

// ---- header parsing: the small subset of Python literals that NEP 1 headers use ----

struct HeaderValue {
    enum class Kind { String, Bool, IntTuple, Other } kind = Kind::Other;
    std::string text;
    bool flag = false;
    std::vector<std::int64_t> ints;
};

class HeaderParser {
public:
    HeaderParser(const std::string& path, std::string_view text) : path_(path), s_(text) {}

    // Parses the whole dict; throws InputError on anything else.
    std::vector<std::pair<std::string, HeaderValue>> dict() {
        std::vector<std::pair<std::string, HeaderValue>> entries;
        expect('{');
        for (;;) {
            skipSpace();
            if (peek() == '}') break;
            if (peek() != '\'' && peek() != '"') fail("expected a quoted key");
            std::string key = quoted();
            expect(':');
            entries.emplace_back(std::move(key), value());
            skipSpace();
            if (peek() == ',') {
                ++pos_;
                continue;
            }
            if (peek() != '}') fail("expected ',' or '}'");
        }
        ++pos_;
        skipSpace();
        if (pos_ != s_.size()) fail("text after the closing '}'");
        return entries;
    }

private:
    [[noreturn]] void fail(const std::string& why) const {
        throw InputError(path_, "malformed .npy header (" + why + " at offset " + std::to_string(pos_) + ")");
    }
    char peek() const { return pos_ < s_.size() ? s_[pos_] : '\0'; }
    void skipSpace() {
        while (pos_ < s_.size() && std::isspace(static_cast<unsigned char>(s_[pos_]))) ++pos_;
    }
    void expect(char c) {
        skipSpace();
        if (peek() != c) fail(std::string("expected '") + c + "'");
        ++pos_;
    }
    bool consumeWord(std::string_view w) {
        if (s_.substr(pos_, w.size()) != w) return false;
        pos_ += w.size();
        return true;
    }
    std::string quoted() {
        const char q = s_[pos_++];
        const std::size_t end = s_.find(q, pos_);
        if (end == std::string_view::npos) fail("unterminated string");
        std::string out(s_.substr(pos_, end - pos_));
        pos_ = end + 1;
        return out;
    }
    std::int64_t integer() {
        skipSpace();
        const std::size_t start = pos_;
        std::int64_t v = 0;
        bool negative = false;
        if (peek() == '-') {
            negative = true;
            ++pos_;
        }
        if (!std::isdigit(static_cast<unsigned char>(peek()))) fail("expected an integer");
        while (std::isdigit(static_cast<unsigned char>(peek()))) {
            const int d = s_[pos_++] - '0';
            if (v > (std::numeric_limits<std::int64_t>::max() - d) / 10) {
                pos_ = start;
                fail("dimension too large");
            }
            v = v * 10 + d;
        }
        if (peek() == 'L') ++pos_;  // long suffix in headers written by Python 2
        if (negative) {
            pos_ = start;
            fail("negative dimension");
        }
        return v;
    }
    // Skips a bracketed literal (e.g. a structured dtype's list), quotes respected.
    void skipComposite() {
        int depth = 0;
        do {
            const char c = peek();
            if (c == '\0') fail("unterminated bracket");
            if (c == '\'' || c == '"') {
                quoted();
                continue;
            }
            if (c == '(' || c == '[' || c == '{') ++depth;
            if (c == ')' || c == ']' || c == '}') --depth;
            ++pos_;
        } while (depth > 0);
    }
    HeaderValue value() {
        skipSpace();
        HeaderValue v;
        const char c = peek();
        if (c == '\'' || c == '"') {
            v.kind = HeaderValue::Kind::String;
            v.text = quoted();
        } else if (consumeWord("True")) {
            v.kind = HeaderValue::Kind::Bool;
            v.flag = true;
        } else if (consumeWord("False")) {
            v.kind = HeaderValue::Kind::Bool;
        } else if (c == '(') {
            ++pos_;
            v.kind = HeaderValue::Kind::IntTuple;
            bool comma = false;
            for (;;) {
                skipSpace();
                if (peek() == ')') break;
                v.ints.push_back(integer());
                skipSpace();
                if (peek() == ',') {
                    comma = true;
                    ++pos_;
                    continue;
                }
                if (peek() != ')') fail("expected ',' or ')' in the shape");
            }
            ++pos_;
            // "(5)" is an int in Python, not a tuple: not a shape.
            if (v.ints.size() == 1 && !comma) fail("shape must be a tuple");
        } else if (c == '-' || std::isdigit(static_cast<unsigned char>(c))) {
            ++pos_;  // a number where none belongs; the caller names the key
            while (std::isalnum(static_cast<unsigned char>(peek())) || peek() == '.') ++pos_;
        } else if (c == '[' || c == '{') {
            skipComposite();
        } else {
            fail("unexpected value");
        }
        return v;
    }

    const std::string& path_;
    std::string_view s_;
    std::size_t pos_ = 0;
};

struct Dtype {
    int bytes = 0;
    bool bigEndian = false;
};

std::optional<Dtype> parseDtype(const std::string& descr) {
    if (descr.size() != 3 || descr[1] != 'f') return std::nullopt;
    Dtype d;
    switch (descr[0]) {
    case '<': d.bigEndian = false; break;
    case '>': d.bigEndian = true; break;
    case '=': d.bigEndian = std::endian::native == std::endian::big; break;
    default: return std::nullopt;
    }
    if (descr[2] != '2' && descr[2] != '4' && descr[2] != '8') return std::nullopt;
    d.bytes = descr[2] - '0';
    return d;
}

// IEEE 754 binary16 to float: every half value is exact in float.
float halfToFloat(std::uint16_t h) {
    const int sign = (h >> 15) & 1;
    const int exponent = (h >> 10) & 0x1f;
    const int mantissa = h & 0x3ff;
    float v;
    if (exponent == 0) v = std::ldexp(static_cast<float>(mantissa), -24);  // zero or subnormal
    else if (exponent == 31) v = mantissa ? std::numeric_limits<float>::quiet_NaN() : std::numeric_limits<float>::infinity();
    else v = std::ldexp(static_cast<float>(mantissa | 0x400), exponent - 25);
    return sign ? -v : v;
}

}  // namespace

void writeNpyFloat32(const std::string& path, const std::vector<float>& data,
                     const std::vector<std::int64_t>& shape) {
    std::int64_t count = 1;
    for (std::int64_t d : shape) {
        if (d < 0) throw ParamError("writeNpyFloat32.shape", "dimension " + std::to_string(d) + " is negative");
        count = d == 0 || count <= std::numeric_limits<std::int64_t>::max() / d ? count * d : -1;
        if (count < 0) throw ParamError("writeNpyFloat32.shape", "too many elements");
    }
    if (static_cast<std::uint64_t>(count) != data.size())
        throw ParamError("writeNpyFloat32.shape", "shape " + shapeText(shape) + " holds " + std::to_string(count) +
                                                      " values but data has " + std::to_string(data.size()));

    std::string header = "{'descr': '<f4', 'fortran_order': False, 'shape': " + shapeText(shape) + ", }";
    // Version 1.0 has a 2-byte header length; 2.0 only when a shape is absurdly long.
    const bool v2 = kMagicSize + 2 + 2 + header.size() + 1 > 0xFFFF;
    const std::size_t prefix = kMagicSize + 2 + (v2 ? 4 : 2);
    const std::size_t total = (prefix + header.size() + 1 + kAlignment - 1) / kAlignment * kAlignment;
    header.append(total - prefix - header.size() - 1, ' ');
    header += '\n';

    std::ofstream out(path, std::ios::binary | std::ios::trunc);
    if (!out) throw WriteError(path, std::string("cannot create the file: ") + std::strerror(errno));
    out.write(kMagic, kMagicSize);
    const auto len = static_cast<std::uint32_t>(header.size());
    const std::array<unsigned char, 6> version{static_cast<unsigned char>(v2 ? 2 : 1), 0,
                                               static_cast<unsigned char>(len & 0xFF),
                                               static_cast<unsigned char>((len >> 8) & 0xFF),
                                               static_cast<unsigned char>((len >> 16) & 0xFF),
                                               static_cast<unsigned char>((len >> 24) & 0xFF)};
    out.write(reinterpret_cast<const char*>(version.data()), v2 ? 6 : 4);
    out.write(header.data(), static_cast<std::streamsize>(header.size()));
    if constexpr (std::endian::native == std::endian::little) {
        out.write(reinterpret_cast<const char*>(data.data()), static_cast<std::streamsize>(data.size() * sizeof(float)));
    } else {
        for (float v : data) {
            auto bytes = std::bit_cast<std::array<unsigned char, 4>>(v);
            reverseBytes<4>(bytes.data());
            out.write(reinterpret_cast<const char*>(bytes.data()), 4);
        }
    }
    out.close();
    if (!out) throw WriteError(path, "writing failed (disk full or file removed?)");
}

NpyArray readNpy(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    if (!in) throw InputError(path, std::string("cannot open the file: ") + std::strerror(errno));

    std::array<char, kMagicSize + 2> start{};
    if (!in.read(start.data(), start.size()) || std::memcmp(start.data(), kMagic, kMagicSize) != 0)
        throw InputError(path, "not a .npy file (no \\x93NUMPY magic string)");
    const int major = static_cast<unsigned char>(start[6]);
    const int minor = static_cast<unsigned char>(start[7]);
    if (major < 1 || major > 3 || minor != 0)
        throw InputError(path, "unsupported .npy version " + std::to_string(major) + "." + std::to_string(minor) +
                                   " (1.0, 2.0 and 3.0 are read)");
    std::array<unsigned char, 4> lenBytes{};
    const int lenSize = major == 1 ? 2 : 4;
    if (!in.read(reinterpret_cast<char*>(lenBytes.data()), lenSize))
        throw InputError(path, "truncated .npy header");
    std::uint32_t headerLen = 0;
    for (int i = lenSize - 1; i >= 0; --i) headerLen = (headerLen << 8) | lenBytes[static_cast<std::size_t>(i)];
    if (headerLen > kMaxHeaderBytes)
        throw InputError(path, "malformed .npy header (claims " + std::to_string(headerLen) + " bytes)");
    std::string header(headerLen, '\0');
    if (!in.read(header.data(), headerLen)) throw InputError(path, "truncated .npy header");
    if (header.empty() || header.back() != '\n')
        throw InputError(path, "malformed .npy header (does not end with a newline)");

    NpyArray array;
    bool haveDescr = false, haveOrder = false, haveShape = false, fortran = false;
    for (auto& [key, value] : HeaderParser(path, header).dict()) {
        bool* seen = key == "descr" ? &haveDescr : key == "fortran_order" ? &haveOrder : key == "shape" ? &haveShape : nullptr;
        if (!seen) throw InputError(path, "malformed .npy header (unexpected key '" + key + "')");
        if (*seen) throw InputError(path, "malformed .npy header (key '" + key + "' given twice)");
        *seen = true;
        if (key == "descr") {
            if (value.kind != HeaderValue::Kind::String)
                throw InputError(path, "unsupported dtype (structured or non-string 'descr'); only float16/32/64 are read");
            array.dtype = value.text;
        } else if (key == "fortran_order") {
            if (value.kind != HeaderValue::Kind::Bool)
                throw InputError(path, "malformed .npy header ('fortran_order' is not True or False)");
            fortran = value.flag;
        } else {
            if (value.kind != HeaderValue::Kind::IntTuple)
                throw InputError(path, "malformed .npy header ('shape' is not a tuple of integers)");
            array.shape = value.ints;
        }
    }
    if (!haveDescr || !haveOrder || !haveShape)
        throw InputError(path, std::string("malformed .npy header (missing '") +
                                   (!haveDescr ? "descr" : !haveOrder ? "fortran_order" : "shape") + "')");
    const std::optional<Dtype> dtype = parseDtype(array.dtype);
    if (!dtype)
        throw InputError(path, "unsupported dtype '" + array.dtype +
                                   "'; only float16/32/64 ('<f2', '<f4', '<f8' or big-endian '>') are read");
    if (fortran)
        throw InputError(path, "Fortran-order (column-major) arrays are not supported; save a C-order array");

    std::uint64_t count = 1;
    for (std::int64_t d : array.shape) {
        const auto ud = static_cast<std::uint64_t>(d);
        if (ud != 0 && count > std::numeric_limits<std::uint64_t>::max() / 16 / ud)
            throw InputError(path, "malformed .npy header (shape " + shapeText(array.shape) + " is too large)");
        count *= ud;
    }
    const std::uint64_t dataBytes = count * static_cast<std::uint64_t>(dtype->bytes);
    // Check the size before allocating, so a lying header cannot exhaust memory.
    const std::streamoff dataStart = in.tellg();
    in.seekg(0, std::ios::end);
    const auto available = static_cast<std::uint64_t>(std::max<std::streamoff>(0, in.tellg() - dataStart));
    in.seekg(dataStart);
    if (available < dataBytes)
        throw InputError(path, "truncated data: shape " + shapeText(array.shape) + " of '" + array.dtype + "' needs " +
                                   std::to_string(dataBytes) + " bytes, the file has " + std::to_string(available));

    std::vector<unsigned char> raw(static_cast<std::size_t>(dataBytes));
    if (!in.read(reinterpret_cast<char*>(raw.data()), static_cast<std::streamsize>(dataBytes)))
        throw InputError(path, "reading the data failed");
    const bool swap = dtype->bigEndian != (std::endian::native == std::endian::big);
    array.data.resize(static_cast<std::size_t>(count));
    for (std::size_t i = 0; i < array.data.size(); ++i) {
        unsigned char* p = raw.data() + i * static_cast<std::size_t>(dtype->bytes);
        switch (dtype->bytes) {
        case 2: {
            if (swap) reverseBytes<2>(p);
            std::uint16_t h;
            std::memcpy(&h, p, 2);
            array.data[i] = halfToFloat(h);
            break;
        }
        case 4:
            if (swap) reverseBytes<4>(p);
            std::memcpy(&array.data[i], p, 4);
            break;
        default: {
            if (swap) reverseBytes<8>(p);
            double d;
            std::memcpy(&d, p, 8);
            array.data[i] = static_cast<float>(d);
            break;
        }
        }
    }
    return array;
}

}  // namespace earmark
