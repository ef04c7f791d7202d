#include "earmark/tiers/timings_vtt.hpp"

#include "earmark/core/error.hpp"
#include "row_check.hpp"
#include "text_util.hpp"

#include <cctype>
#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <cstdio>
#include <optional>

namespace earmark {
namespace {

using namespace tiers_detail;

struct Line {
    std::size_t number;  // 1-based
    std::string_view text;
};

// WebVTT line terminators: CRLF, LF or CR.
std::vector<Line> splitLines(std::string_view text) {
    std::vector<Line> lines;
    std::size_t start = 0, number = 1;
    for (std::size_t i = 0; i <= text.size(); ++i) {
        if (i == text.size() || text[i] == '\n' || text[i] == '\r') {
            lines.push_back({number++, text.substr(start, i - start)});
            if (i < text.size() && text[i] == '\r' && i + 1 < text.size() && text[i + 1] == '\n') ++i;
            start = i + 1;
        }
    }
    return lines;
}

bool startsWithKeyword(std::string_view line, std::string_view word) {
    if (line.substr(0, word.size()) != word) return false;
    return line.size() == word.size() || line[word.size()] == ' ' || line[word.size()] == '\t';
}

bool isDigit(char c) { return c >= '0' && c <= '9'; }

// Parses a timestamp at `pos`, advancing it. nullopt if malformed.
std::optional<double> parseTimestamp(std::string_view s, std::size_t& pos) {
    const auto digits = [&](std::size_t& at) {
        const std::size_t from = at;
        std::uint64_t v = 0;
        while (at < s.size() && isDigit(s[at]) && at - from < 12) v = v * 10 + static_cast<unsigned>(s[at++] - '0');
        return std::pair<std::uint64_t, std::size_t>{v, at - from};
    };
    std::size_t at = pos;
    auto [first, firstLen] = digits(at);
    if (firstLen < 2 || at >= s.size() || s[at] != ':') return std::nullopt;
    ++at;
    auto [second, secondLen] = digits(at);
    if (secondLen != 2) return std::nullopt;
    std::uint64_t hours = 0, minutes = first, secs = second;
    if (at < s.size() && s[at] == ':') {
        ++at;
        auto [third, thirdLen] = digits(at);
        if (thirdLen != 2) return std::nullopt;
        hours = first;
        minutes = second;
        secs = third;
    } else if (firstLen != 2) {
        return std::nullopt;  // mm must be two digits when there are no hours
    }
    if (at >= s.size() || s[at] != '.') return std::nullopt;
    ++at;
    auto [millis, millisLen] = digits(at);
    if (millisLen != 3 || minutes > 59 || secs > 59) return std::nullopt;
    pos = at;
    return static_cast<double>(hours) * 3600.0 + static_cast<double>(minutes) * 60.0 + static_cast<double>(secs) +
           static_cast<double>(millis) / 1000.0;
}

void skipSpaces(std::string_view s, std::size_t& pos) {
    while (pos < s.size() && (s[pos] == ' ' || s[pos] == '\t')) ++pos;
}

void appendUtf8(std::string& out, std::uint32_t cp) {
    if (cp < 0x80) {
        out += static_cast<char>(cp);
    } else if (cp < 0x800) {
        out += static_cast<char>(0xC0 | (cp >> 6));
        out += static_cast<char>(0x80 | (cp & 0x3F));
    } else if (cp < 0x10000) {
        out += static_cast<char>(0xE0 | (cp >> 12));
        out += static_cast<char>(0x80 | ((cp >> 6) & 0x3F));
        out += static_cast<char>(0x80 | (cp & 0x3F));
    } else {
        out += static_cast<char>(0xF0 | (cp >> 18));
        out += static_cast<char>(0x80 | ((cp >> 12) & 0x3F));
        out += static_cast<char>(0x80 | ((cp >> 6) & 0x3F));
        out += static_cast<char>(0x80 | (cp & 0x3F));
    }
}

// Cue text to a plain label: tags dropped, character references decoded.
std::string cueTextToLabel(std::string_view s) {
    std::string out;
    for (std::size_t i = 0; i < s.size();) {
        if (s[i] == '<') {
            const std::size_t close = s.find('>', i);
            i = close == std::string_view::npos ? s.size() : close + 1;
        } else if (s[i] == '&') {
            const std::size_t semi = s.find(';', i);
            const std::string_view name =
                semi == std::string_view::npos ? std::string_view() : s.substr(i + 1, semi - i - 1);
            std::optional<std::uint32_t> cp;
            if (name == "amp") cp = '&';
            else if (name == "lt") cp = '<';
            else if (name == "gt") cp = '>';
            else if (name == "quot") cp = '"';
            else if (name == "apos") cp = '\'';
            else if (name == "nbsp") cp = 0xA0;
            else if (name == "lrm") cp = 0x200E;
            else if (name == "rlm") cp = 0x200F;
            else if (name.size() > 1 && name[0] == '#') {
                const bool hex = name[1] == 'x' || name[1] == 'X';
                const std::string digits(name.substr(hex ? 2 : 1));
                char* end = nullptr;
                const unsigned long v = std::strtoul(digits.c_str(), &end, hex ? 16 : 10);
                if (!digits.empty() && end && *end == '\0' && v > 0 && v <= 0x10FFFF) cp = static_cast<std::uint32_t>(v);
            }
            if (cp) {
                appendUtf8(out, *cp);
                i = semi + 1;
            } else {
                out += s[i++];
            }
        } else {
            out += s[i++];
        }
    }
    return out;
}

std::string vttTime(double seconds) {
    const long long ms = std::llround(seconds * 1000.0);
    char buf[40];
    std::snprintf(buf, sizeof buf, "%02lld:%02lld:%02lld.%03lld", ms / 3600000, (ms / 60000) % 60, (ms / 1000) % 60,
                  ms % 1000);
    return buf;
}

}  // namespace

LoadedTimings parseTimingsVtt(std::string_view text, const std::string& source,
                              const TimingsReadOptions& options) {
    const std::vector<Line> lines = splitLines(stripBom(text));
    if (lines.empty() || !startsWithKeyword(lines[0].text, "WEBVTT"))
        throw InputError(source, "line 1: not a WebVTT file (the first line must start with WEBVTT)");

    LoadedTimings out;
    Tier& tier = out.tiers.getOrAdd(options.defaultTier);
    RowNames rows(1);
    std::size_t i = 1;
    while (i < lines.size() && !lines[i].text.empty()) ++i;  // rest of the header block
    while (i < lines.size()) {
        if (lines[i].text.empty()) {
            ++i;
            continue;
        }
        std::size_t blockEnd = i;
        while (blockEnd < lines.size() && !lines[blockEnd].text.empty()) ++blockEnd;
        const std::string_view head = lines[i].text;
        if (startsWithKeyword(head, "NOTE") || startsWithKeyword(head, "STYLE") || startsWithKeyword(head, "REGION")) {
            i = blockEnd;
            continue;
        }
        std::size_t timing = i;
        if (head.find("-->") == std::string_view::npos) ++timing;  // an identifier line
        if (timing >= blockEnd || lines[timing].text.find("-->") == std::string_view::npos)
            throw InputError(source, "line " + std::to_string(lines[i].number) +
                                         ": a cue without a timing line (start --> end)");
        const std::string where = "line " + std::to_string(lines[timing].number);
        const std::string_view t = lines[timing].text;
        std::size_t pos = 0;
        skipSpaces(t, pos);
        const auto start = parseTimestamp(t, pos);
        skipSpaces(t, pos);
        const bool arrow = t.substr(pos, 3) == "-->";
        if (arrow) pos += 3;
        skipSpaces(t, pos);
        const auto end = arrow ? parseTimestamp(t, pos) : std::nullopt;
        if (!start || !end || (pos < t.size() && t[pos] != ' ' && t[pos] != '\t'))
            throw InputError(source, where + ": bad cue timing '" + std::string(t) +
                                         "' (expected hh:mm:ss.ttt --> hh:mm:ss.ttt)");
        std::string payload;
        for (std::size_t k = timing + 1; k < blockEnd; ++k) {
            if (!payload.empty()) payload += ' ';
            payload += lines[k].text;
        }
        tier.intervals.push_back(Interval{*start, *end, cueTextToLabel(payload), std::nullopt});
        rows[0].push_back(where);
        i = blockEnd;
    }
    out.warnings = validateRows(out.tiers, rows, source, options.takeDurationS);
    return out;
}

std::string tierToVtt(const Tier& tier) {
    std::string out = "WEBVTT\n";
    for (const Interval& iv : tier.intervals) {
        out += '\n';
        out += vttTime(iv.startS);
        out += " --> ";
        out += vttTime(iv.endS);
        out += '\n';
        for (char ch : iv.label) {
            if (ch == '&') out += "&amp;";
            else if (ch == '<') out += "&lt;";
            else if (ch == '>') out += "&gt;";
            else if (ch == '\n' || ch == '\r') out += ' ';
            else out += ch;
        }
        out += "\n";
    }
    return out;
}

}  // namespace earmark
