#include "earmark/widgets/span_image.hpp"

#include "earmark/core/error.hpp"
#include "earmark/widgets/energy_lane.hpp"
#include "earmark/widgets/pitch_lane.hpp"
#include "earmark/widgets/spectrogram_lane.hpp"
#include "earmark/widgets/take_loader.hpp"
#include "earmark/widgets/time_ruler_lane.hpp"
#include "earmark/widgets/waveform_lane.hpp"

#include <QApplication>
#include <QPainter>
#include <QVBoxLayout>

#include <qcustomplot.h>

#include <algorithm>
#include <cmath>
#include <filesystem>

namespace earmark::widgets {
namespace {

// In points, as the lanes scale their own fonts from the point size (13 px
// and 16 px at Qt's usual 96 logical dpi).
constexpr double kFontPt = 9.75;       // lane text: axis labels, captions
constexpr double kTitleFontPt = 12.0;  // first title line

QString qs(std::string_view text) { return QString::fromUtf8(text.data(), static_cast<qsizetype>(text.size())); }

QString seconds(double t) { return QString::number(t, 'f', 3); }

// A fixed light palette: pictures must not depend on the desktop's theme.
// Highlight is transparent because a picture has no cursor or selection (the
// lanes' overlay draws both in that colour).
QPalette picturePalette() {
    QPalette p;
    p.setColor(QPalette::Window, QColor(243, 243, 240));
    p.setColor(QPalette::Base, QColor(255, 255, 255));
    p.setColor(QPalette::Text, QColor(28, 28, 30));
    p.setColor(QPalette::WindowText, QColor(28, 28, 30));
    p.setColor(QPalette::PlaceholderText, QColor(104, 104, 110));
    p.setColor(QPalette::Highlight, QColor(0, 0, 0, 0));
    return p;
}

// Severity colours of the mark bar (our own choice: brighter and warmer as
// the severity rises) and a text colour that reads on each.
QColor severityColour(Severity s) {
    switch (s) {
        case Severity::Minor: return QColor(222, 178, 52);
        case Severity::Major: return QColor(224, 112, 28);
        case Severity::Blocker: return QColor(192, 32, 44);
    }
    return QColor(128, 128, 128);
}
// Dark text on light fills by luma (ITU-R BT.601 weights), white otherwise.
QColor textOn(const QColor& fill) {
    const double luma = 0.299 * fill.redF() + 0.587 * fill.greenF() + 0.114 * fill.blueF();
    return luma > 0.6 ? QColor(28, 28, 30) : QColor(255, 255, 255);
}

QString kindText(const Mark& mark) {
    QString text = qs(categoryName(mark.category));
    if (!mark.subtype.empty()) text += QStringLiteral(" / ") + qs(mark.subtype);
    return text + QStringLiteral(" · ") + qs(severityName(mark.severity));
}

QString takeText(const Take& take, const TakeAudio& audio) {
    const QString name =
        !take.lineId.empty()
            ? qs(take.lineId)
            : QString::fromStdString(
                  std::filesystem::path(take.audioPath.empty() ? audio.path.toStdString() : take.audioPath)
                      .stem()
                      .string());
    return take.id > 0 ? QStringLiteral("%1 (take %2)").arg(name).arg(take.id) : name;
}

// Brush of the context (padding) regions: grey with a hatch, see-through
// enough that the lanes stay readable beneath it.
void shadeContext(QPainter& p, const QRectF& area) {
    if (area.width() <= 0 || area.height() <= 0) return;
    p.fillRect(area, QColor(96, 96, 104, 96));
    QBrush hatch(QColor(255, 255, 255, 70), Qt::BDiagPattern);
    p.fillRect(area, hatch);
}

// Title band: what, where and how bad, in two lines.
class TitleBand : public QWidget {
public:
    TitleBand(QString first, QString second, QWidget* parent)
        : QWidget(parent), first_(std::move(first)), second_(std::move(second)) {
        QFont big = font();
        big.setPointSizeF(kTitleFontPt);
        big.setBold(true);
        setFixedHeight(QFontMetrics(big).height() + fontMetrics().height() + 14);
    }

protected:
    void paintEvent(QPaintEvent*) override {
        QPainter p(this);
        p.fillRect(rect(), palette().color(QPalette::Window));
        QFont big = font();
        big.setPointSizeF(kTitleFontPt);
        big.setBold(true);
        const QFontMetrics bigMetrics(big);
        const int left = 10, width = this->width() - 20;
        p.setFont(big);
        p.setPen(palette().color(QPalette::Text));
        p.drawText(QRect(left, 5, width, bigMetrics.height()), Qt::AlignLeft | Qt::AlignVCenter,
                   bigMetrics.elidedText(first_, Qt::ElideRight, width));
        p.setFont(font());
        p.setPen(palette().color(QPalette::PlaceholderText));
        p.drawText(QRect(left, 7 + bigMetrics.height(), width, fontMetrics().height()),
                   Qt::AlignLeft | Qt::AlignVCenter, fontMetrics().elidedText(second_, Qt::ElideRight, width));
        p.setPen(QColor(0, 0, 0, 40));
        p.drawLine(0, height() - 1, this->width(), height() - 1);
    }

private:
    QString first_, second_;
};

// The mark: a bar over its span in the severity colour with category,
// subtype and severity, and the note on the line below.
class MarkStrip : public Lane {
public:
    MarkStrip(const Mark& mark, ViewState* view, QWidget* parent)
        : Lane("mark", QStringLiteral("Mark"), view, parent), mark_(mark) {
        setFixedHeight(2 * fontMetrics().height() + 16);
    }

protected:
    void drawContent(QPainter& p) override {
        const QRect plot = plotRect();
        const LaneColours c = colours();
        const QFontMetrics fm(font());
        p.fillRect(rect(), palette().color(QPalette::Window));
        p.setPen(c.faintText);
        p.drawText(QRect(6, 0, gutterWidth - 12, height()), Qt::AlignVCenter | Qt::AlignLeft, QStringLiteral("mark"));
        const TimeMapping m = mapping();
        if (!(m.range.span() > 0)) return;
        const double x0 =
            std::clamp(plot.left() + m.timeToX(mark_.startSeconds), double(plot.left()), double(plot.right() + 1));
        const double x1 = std::clamp(plot.left() + m.timeToX(mark_.endSeconds), x0, double(plot.right() + 1));
        const QColor fill = severityColour(mark_.severity);
        const QRectF bar(x0, 4, std::max(x1 - x0, 2.0), fm.height() + 4);
        p.fillRect(bar, fill);

        QFont bold = font();
        bold.setBold(true);
        const QFontMetrics bm(bold);
        const QString label = kindText(mark_);
        p.setFont(bold);
        if (bm.horizontalAdvance(label) + 12 <= bar.width()) {
            p.setPen(textOn(fill));
            p.drawText(bar, Qt::AlignCenter, label);
        } else {
            // Too narrow for the caption: write it beside the bar, where there is room.
            const int w = bm.horizontalAdvance(label) + 6;
            const double right = x1 + 6, leftEnd = x0 - 6;
            const double x = right + w <= plot.right() ? right : std::max<double>(plot.left(), leftEnd - w);
            p.setPen(c.text);
            p.drawText(QRectF(x, bar.top(), w, bar.height()), Qt::AlignLeft | Qt::AlignVCenter, label);
        }

        QFont italic = font();
        italic.setItalic(!mark_.note.empty());
        const QFontMetrics im(italic);
        const QString note =
            mark_.note.empty() ? QStringLiteral("(no note)") : QStringLiteral("note: ") + qs(mark_.note).simplified();
        const QString shown = im.elidedText(note, Qt::ElideRight, plot.width() - 8);
        const double w = im.horizontalAdvance(shown);
        const double x = std::clamp(x0 + 4, double(plot.left() + 4), plot.right() - 3 - w);
        p.setFont(italic);
        p.setPen(mark_.note.empty() ? c.faintText : c.text);
        p.drawText(QRectF(x, bar.bottom() + 3, w + 2, fm.height()), Qt::AlignLeft | Qt::AlignVCenter, shown);
    }

private:
    Mark mark_;
};

// The words of the word tier over the shown span; words inside the mark in
// bold, the others faint.
class WordStrip : public Lane {
public:
    WordStrip(std::vector<TierRow> words, const Mark& mark, ViewState* view, QWidget* parent)
        : Lane("words", QStringLiteral("Words"), view, parent), words_(std::move(words)), mark_(mark) {
        setFixedHeight(fontMetrics().height() + 12);
    }

protected:
    void drawContent(QPainter& p) override {
        const QRect plot = plotRect();
        const LaneColours c = colours();
        p.fillRect(rect(), palette().color(QPalette::Window));
        p.fillRect(plot.adjusted(0, 2, 0, -2), c.background);
        p.setPen(c.faintText);
        p.drawText(QRect(6, 0, gutterWidth - 12, height()), Qt::AlignVCenter | Qt::AlignLeft, QStringLiteral("words"));
        const TimeMapping m = mapping();
        if (words_.empty() || !(m.range.span() > 0)) {
            p.drawText(plot, Qt::AlignCenter, QStringLiteral("no word tier"));
            return;
        }
        QFont bold = font();
        bold.setBold(true);
        p.setClipRect(plot);
        for (const TierRow& w : words_) {
            if (w.endSeconds <= m.range.start || w.startSeconds >= m.range.end) continue;
            const double x0 = plot.left() + m.timeToX(w.startSeconds);
            const double x1 = plot.left() + m.timeToX(w.endSeconds);
            p.setPen(QPen(c.faintText, 1));
            for (double x : {x0, x1}) p.drawLine(QPointF(x, plot.top() + 2), QPointF(x, plot.bottom() - 2));
            if (w.label.empty()) continue;
            const double middle = 0.5 * (w.startSeconds + w.endSeconds);
            const bool inMark = middle >= mark_.startSeconds && middle <= mark_.endSeconds;
            // Centre the label in the part of the word that is in view; a
            // short word gets a smaller font before it is cut.
            const double a = std::max(x0, double(plot.left())), b = std::min(x1, double(plot.right() + 1));
            const int room = int(b - a) - 4;
            QFont f = inMark ? bold : font();
            const QString label = qs(w.label);
            if (QFontMetrics(f).horizontalAdvance(label) > room) f.setPointSizeF(f.pointSizeF() * 0.8);
            p.setFont(f);
            p.setPen(inMark ? c.text : c.faintText);
            const QString text = QFontMetrics(f).elidedText(label, Qt::ElideRight, room);
            p.drawText(QRectF(a, plot.top(), b - a, plot.height()), Qt::AlignCenter, text);
        }
    }

private:
    std::vector<TierRow> words_;
    Mark mark_;
};

std::vector<TierRow> wordTier(const std::vector<TierRow>& tiers) {
    std::vector<TierRow> words;
    for (const TierRow& r : tiers)
        if (r.tier == "words") words.push_back(r);
    if (words.empty())
        for (const TierRow& r : tiers)
            if (r.tier == "word") words.push_back(r);
    return words;
}

}  // namespace

void SpanImageParams::validate() const {
    if (widthPx < BundleParams::kMinImageWidthPx || widthPx > BundleParams::kMaxImageSidePx)
        throw ParamError("SpanImageParams.widthPx",
                         "must be between " + std::to_string(BundleParams::kMinImageWidthPx) + " and " +
                             std::to_string(BundleParams::kMaxImageSidePx) + " px, not " + std::to_string(widthPx));
    if (heightPx < BundleParams::kMinImageHeightPx || heightPx > BundleParams::kMaxImageSidePx)
        throw ParamError("SpanImageParams.heightPx",
                         "must be between " + std::to_string(BundleParams::kMinImageHeightPx) + " and " +
                             std::to_string(BundleParams::kMaxImageSidePx) + " px, not " + std::to_string(heightPx));
}

SpanImage renderSpanImage(const SpanImageContent& content, const SpanImageParams& params) {
    params.validate();
    if (!content.audio) throw ParamError("SpanImageContent.audio", "is empty; a picture needs the take's audio");
    const double duration = content.audio->duration();
    const TimeRange shown = content.shown;
    if (!std::isfinite(shown.start) || !std::isfinite(shown.end) || !(shown.span() > 0) || shown.start < 0 ||
        shown.end > duration + 1e-6)
        throw ParamError("SpanImageContent.shown", "must be a non-empty span inside the take (0–" +
                                                       seconds(duration).toStdString() + " s), not " +
                                                       seconds(shown.start).toStdString() + "–" +
                                                       seconds(shown.end).toStdString() + " s");
    const Mark& mark = content.mark;

    ViewState view;
    view.resetForDuration(duration);
    view.setVisibleRange(shown);
    view.setCursor(shown.start);

    QWidget page;
    page.setAttribute(Qt::WA_DontShowOnScreen);
    page.setPalette(picturePalette());
    page.setAutoFillBackground(true);
    QFont font = QApplication::font();
    font.setPointSizeF(kFontPt);
    page.setFont(font);

    const double before = std::max(0.0, mark.startSeconds - shown.start);
    const double after = std::max(0.0, shown.end - mark.endSeconds);
    const QString first = QStringLiteral("%1  ·  %2  ·  %3–%4 s")
                              .arg(takeText(content.take, *content.audio), kindText(mark), seconds(mark.startSeconds),
                                   seconds(mark.endSeconds));
    QString second = QStringLiteral("mark %1 · %2 s long · shown %3–%4 s; shaded: %5 s context before, %6 s after")
                         .arg(mark.id)
                         .arg(seconds(mark.endSeconds - mark.startSeconds), seconds(shown.start), seconds(shown.end),
                              seconds(before), seconds(after));
    if (!content.take.build.empty()) second += QStringLiteral(" · build ") + qs(content.take.build);
    if (!mark.rater.empty()) second += QStringLiteral(" · rater ") + qs(mark.rater);

    auto* layout = new QVBoxLayout(&page);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->setSpacing(1);
    auto* title = new TitleBand(first, second, &page);
    auto* topRuler = new TimeRulerLane(&view, &page);
    auto* markStrip = new MarkStrip(mark, &view, &page);
    auto* wordStrip = new WordStrip(wordTier(content.tiers), mark, &view, &page);
    auto* waveform = new WaveformLane(&view, &page);
    auto* spectrogram = new SpectrogramLane(&view, &page);
    auto* pitch = new PitchLane(&view, &page);
    auto* energy = new EnergyLane(&view, &page);
    auto* bottomRuler = new TimeRulerLane(&view, &page);
    layout->addWidget(title);
    layout->addWidget(topRuler);
    layout->addWidget(markStrip);
    layout->addWidget(wordStrip);
    // Shares of the height left to the lanes; the energy lane needs room for
    // its rotated unit.
    layout->addWidget(waveform, 6);
    layout->addWidget(spectrogram, 12);
    layout->addWidget(pitch, 6);
    layout->addWidget(energy, 5);
    layout->addWidget(bottomRuler);
    // Short pictures give the second ruler's height to the lanes.
    constexpr int kHeightForSecondRulerPx = 600;
    bottomRuler->setVisible(params.heightPx >= kHeightForSecondRulerPx);
    Lane* lowest = bottomRuler->isVisibleTo(&page) ? static_cast<Lane*>(bottomRuler) : energy;
    for (Lane* lane : std::initializer_list<Lane*>{topRuler, markStrip, wordStrip, waveform, spectrogram, pitch, energy,
                                                   bottomRuler}) {
        lane->setTake(content.audio);
        if (content.tracks) lane->setTracks(content.tracks);
    }

    const QSize size(params.widthPx, params.heightPx);
    page.resize(size);
    page.show();
    QCoreApplication::processEvents();  // layout, resize events, queued replots
    for (QCustomPlot* plot : page.findChildren<QCustomPlot*>()) plot->replot(QCustomPlot::rpImmediateRefresh);

    SpanImage out;
    out.image = QImage(size, QImage::Format_RGB32);
    out.image.setDevicePixelRatio(1.0);
    out.image.fill(page.palette().color(QPalette::Window));
    SpanImageLayout& geo = out.layout;
    geo.plotLeft = Lane::gutterWidth;
    geo.plotRight = geo.plotLeft + waveform->plotRect().width();
    geo.title = title->geometry();
    geo.markStrip = markStrip->geometry();
    geo.wordStrip = wordStrip->geometry();
    geo.lanes =
        QRect(QPoint(0, topRuler->geometry().top()), QPoint(size.width() - 1, lowest->geometry().bottom()));
    const TimeMapping m{shown, double(geo.plotRight - geo.plotLeft)};
    geo.spanLeftX =
        std::clamp(geo.plotLeft + m.timeToX(mark.startSeconds), double(geo.plotLeft), double(geo.plotRight));
    geo.spanRightX = std::clamp(geo.plotLeft + m.timeToX(mark.endSeconds), geo.spanLeftX, double(geo.plotRight));
    {
        QPainter p(&out.image);
        page.render(&p, QPoint(), QRegion(), QWidget::DrawChildren);
        // Context shading over every lane below the title, then the span's edges.
        const double top = geo.lanes.top(), height = geo.lanes.height();
        shadeContext(p, QRectF(geo.plotLeft, top, geo.spanLeftX - geo.plotLeft, height));
        shadeContext(p, QRectF(geo.spanRightX, top, geo.plotRight - geo.spanRightX, height));
        QPen edge(severityColour(mark.severity), 1.5, Qt::DashLine);
        p.setPen(edge);
        for (double x : {geo.spanLeftX, geo.spanRightX})
            if (x > geo.plotLeft + 0.5 && x < geo.plotRight - 0.5)
                p.drawLine(QPointF(x, top), QPointF(x, top + height));
    }
    page.hide();
    return out;
}

BundleImageWriter::BundleImageWriter(TiersOf tiersOf, AnalysisSettings settings)
    : tiersOf_(std::move(tiersOf)), settings_(settings) {
    settings_.validate();
}

void BundleImageWriter::write(const BundleImageRequest& request) {
    if (!audio_ || cachedTake_ != request.take.id || cachedPath_ != request.take.audioPath) {
        auto audio = std::make_shared<TakeAudio>();
        audio->path = QString::fromStdString(request.take.audioPath);
        audio->info.path = request.take.audioPath;
        audio->info.sampleRate = request.audio.sampleRate;
        audio->info.channels = 1;
        audio->info.frames = static_cast<std::int64_t>(request.audio.size());
        audio->signal = request.audio;
        audio->summary = WaveformSummary::build(audio->signal.samples);
        tracks_ = analyseTake(*audio, settings_);
        audio_ = std::move(audio);
        tiers_ = tiersOf_ ? tiersOf_(request.take) : std::vector<TierRow>{};
        cachedTake_ = request.take.id;
        cachedPath_ = request.take.audioPath;
    }
    SpanImageContent content{audio_,       tracks_, request.take,
                             request.mark, tiers_,  TimeRange{request.clipStartSeconds, request.clipEndSeconds}};
    const SpanImage picture = renderSpanImage(content, SpanImageParams{request.widthPx, request.heightPx});
    if (!picture.image.save(QString::fromStdString(request.pngPath), "PNG"))
        throw Error(request.pngPath, "cannot write the picture (disk full or no permission?)");
}

}  // namespace earmark::widgets
