// The report's pictures as plain SVG 1.1 text.
#include "earmark/listening/report_files.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>

namespace earmark::listening {
namespace {

// Our own muted palette; systems take colours in design order.
constexpr const char* kColours[] = {"#2f6690", "#c2702a", "#4f8a3c", "#8c3f74", "#6b6b6b",
                                    "#2a8c83", "#a0811c", "#5252a8", "#b04a4a", "#3e7a5e"};

std::string colourOf(const TestDesign& d, const std::string& system) {
    const int i = std::max(0, d.systemIndex(system));
    return kColours[static_cast<std::size_t>(i) % std::size(kColours)];
}

std::string escape(const std::string& text) {
    std::string out;
    for (char c : text) {
        switch (c) {
        case '&': out += "&amp;"; break;
        case '<': out += "&lt;"; break;
        case '>': out += "&gt;"; break;
        case '"': out += "&quot;"; break;
        default: out += c;
        }
    }
    return out;
}

std::string num(double v) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.2f", v);
    return buf;
}

std::string header(double width, double height, const std::string& title) {
    return "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"" +
           num(width) + "\" height=\"" + num(height) + "\" viewBox=\"0 0 " + num(width) + " " + num(height) +
           "\" font-family=\"sans-serif\" font-size=\"12\">\n<rect width=\"100%\" height=\"100%\" fill=\"white\"/>\n"
           "<text x=\"12\" y=\"22\" font-size=\"15\">" + escape(title) + "</text>\n";
}

std::string line(double x1, double y1, double x2, double y2, const std::string& colour, double width) {
    return "<line x1=\"" + num(x1) + "\" y1=\"" + num(y1) + "\" x2=\"" + num(x2) + "\" y2=\"" + num(y2) +
           "\" stroke=\"" + colour + "\" stroke-width=\"" + num(width) + "\"/>\n";
}

std::string text(double x, double y, const std::string& s, const std::string& anchor = "middle",
                 double rotate = 0) {
    std::string t = "<text x=\"" + num(x) + "\" y=\"" + num(y) + "\" text-anchor=\"" + anchor + "\"";
    if (rotate != 0) t += " transform=\"rotate(" + num(rotate) + " " + num(x) + " " + num(y) + ")\"";
    return t + ">" + escape(s) + "</text>\n";
}

// A vertical value axis for the kind's scale over [top, bottom] at x.
struct Axis {
    double lo, hi, top, bottom;
    double y(double v) const { return bottom - (v - lo) / (hi - lo) * (bottom - top); }
};

std::string axisWithGrid(const Axis& a, double left, double right, TestKind kind) {
    std::string out;
    const double step = kind == TestKind::Mushra ? 20 : 1;
    for (double v = a.lo; v <= a.hi + 1e-9; v += step) {
        out += line(left, a.y(v), right, a.y(v), "#e2e2e2", 1);
        out += text(left - 6, a.y(v) + 4, num(v).substr(0, num(v).find('.')), "end");
    }
    for (const auto& [value, label] : scaleOf(kind).labels)
        out += "<text x=\"" + num(right + 4) + "\" y=\"" + num(a.y(value) + 4) +
               "\" fill=\"#777\" font-size=\"10\">" + escape(label) + "</text>\n";
    return out;
}

std::string preferencesPicture(const TestDesign& d, const Report& r) {
    const double rowH = 34, left = 170, barW = 420, top = 50;
    const double height = top + rowH * static_cast<double>(r.preferences.size()) + 50;
    std::string out = header(left + barW + 60, height, d.name + ": preference share (95 % Clopper-Pearson)");
    for (std::size_t i = 0; i < r.preferences.size(); ++i) {
        const Preference& p = r.preferences[i];
        const double y = top + rowH * static_cast<double>(i);
        out += text(left - 8, y + 16, p.a + " over " + p.b, "end");
        out += "<rect x=\"" + num(left) + "\" y=\"" + num(y + 4) + "\" width=\"" + num(barW) +
               "\" height=\"18\" fill=\"#f0f0f0\"/>\n";
        if (std::isfinite(p.test.share)) {
            out += "<rect x=\"" + num(left) + "\" y=\"" + num(y + 4) + "\" width=\"" + num(barW * p.test.share) +
                   "\" height=\"18\" fill=\"" + colourOf(d, p.a) + "\"/>\n";
            out += line(left + barW * p.test.low, y + 13, left + barW * p.test.high, y + 13, "black", 1.5);
            char share[32];
            std::snprintf(share, sizeof share, "%.1f %%", 100 * p.test.share);
            out += text(left + barW + 6, y + 17, share, "start");
        }
    }
    const double yEnd = top + rowH * static_cast<double>(r.preferences.size());
    out += line(left + barW / 2, top, left + barW / 2, yEnd, "#444", 1);
    out += text(left + barW / 2, yEnd + 16, "50 %");
    return out + "</svg>\n";
}

}  // namespace

std::string meansSvg(const TestDesign& d, const Report& r) {
    if (r.kind == TestKind::Ab) return preferencesPicture(d, r);
    const Scale scale = scaleOf(r.kind);
    const double slot = 90, left = 56, top = 44, plotH = 260;
    const double width = left + slot * static_cast<double>(std::max<std::size_t>(r.systems.size(), 1)) + 90;
    const Axis axis{scale.min, scale.max, top, top + plotH};
    std::string title = d.name + ": mean " + (r.kind == TestKind::Cmos ? "CMOS against the reference" : "score") +
                        " (thick: t 95 %, thin: bootstrap 95 %)";
    std::string out = header(width, top + plotH + 80, title);
    out += axisWithGrid(axis, left, width - 88, r.kind);
    if (r.kind == TestKind::Cmos) out += line(left, axis.y(0), width - 88, axis.y(0), "#888", 1);
    for (std::size_t i = 0; i < r.systems.size(); ++i) {
        const SystemSummary& s = r.systems[i];
        const double x = left + slot * (static_cast<double>(i) + 0.5);
        const std::string c = colourOf(d, s.system);
        if (std::isfinite(s.t.low)) out += line(x, axis.y(s.t.low), x, axis.y(s.t.high), c, 5);
        if (std::isfinite(s.bootLow)) out += line(x + 10, axis.y(s.bootLow), x + 10, axis.y(s.bootHigh), c, 1.5);
        if (std::isfinite(s.t.mean))
            out += "<circle cx=\"" + num(x) + "\" cy=\"" + num(axis.y(s.t.mean)) + "\" r=\"6\" fill=\"white\" stroke=\"" +
                   c + "\" stroke-width=\"2\"/>\n" + text(x + 16, axis.y(s.t.mean) + 4, num(s.t.mean), "start");
        out += text(x, top + plotH + 18, s.system, "end", -30);
    }
    return out + "</svg>\n";
}

std::string linesSvg(const TestDesign& d, const Report& r) {
    if (r.kind == TestKind::Ab) return {};
    const Scale scale = scaleOf(r.kind);
    std::vector<std::string> systems;
    for (const SystemSummary& s : r.systems) systems.push_back(s.system);
    const double box = 12, gap = 18, left = 56, top = 64, plotH = 240;
    const double group = box * static_cast<double>(systems.size()) + gap;
    const double width = left + group * static_cast<double>(d.lines.size()) + 90;
    const Axis axis{scale.min, scale.max, top, top + plotH};
    std::string out = header(std::max(width, 420.0), top + plotH + 80, d.name + ": answers per line");
    for (std::size_t s = 0; s < systems.size(); ++s) {
        const double x = 12 + 110 * static_cast<double>(s);
        out += "<rect x=\"" + num(x) + "\" y=\"34\" width=\"10\" height=\"10\" fill=\"" + colourOf(d, systems[s]) + "\"/>\n";
        out += text(x + 14, 43, systems[s], "start");
    }
    out += axisWithGrid(axis, left, width - 88, r.kind);
    for (std::size_t l = 0; l < d.lines.size(); ++l) {
        const double gx = left + group * static_cast<double>(l) + gap / 2;
        for (std::size_t s = 0; s < systems.size(); ++s) {
            const auto it = std::find_if(r.perLine.begin(), r.perLine.end(), [&](const LineValues& lv) {
                return lv.line == d.lines[l].id && lv.system == systems[s];
            });
            if (it == r.perLine.end()) continue;
            const BoxFigures b = boxFigures(it->values);
            const double x = gx + box * static_cast<double>(s), cx = x + box / 2;
            const std::string c = colourOf(d, systems[s]);
            out += line(cx, axis.y(b.min), cx, axis.y(b.max), c, 1);
            out += "<rect x=\"" + num(x + 1) + "\" y=\"" + num(axis.y(b.q3)) + "\" width=\"" + num(box - 2) +
                   "\" height=\"" + num(std::max(1.0, axis.y(b.q1) - axis.y(b.q3))) + "\" fill=\"" + c +
                   "\" fill-opacity=\"0.35\" stroke=\"" + c + "\"/>\n";
            out += line(x + 1, axis.y(b.median), x + box - 1, axis.y(b.median), c, 2);
        }
        out += text(gx + group / 2 - gap / 2, top + plotH + 16, d.lines[l].id, "end", -45);
    }
    return out + "</svg>\n";
}

}  // namespace earmark::listening
