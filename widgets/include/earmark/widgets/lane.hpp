// A lane: one horizontal strip of the stacked view, locked to the shared time
// axis of a ViewState. The base class does what every lane shares: the left
// gutter for the lane's vertical axis, the time mapping, the mouse (click sets
// the cursor, drag selects, wheel scrolls, Ctrl+wheel zooms at the pointer,
// hover), and an overlay child that draws selection, cursor, hover line and
// playhead on top of the content. A new lane is one subclass: it draws its
// content (or hosts a plot) and may describe what is under the pointer.
#pragma once

#include "earmark/widgets/take_data.hpp"
#include "earmark/widgets/time_mapping.hpp"
#include "earmark/widgets/view_state.hpp"

#include <QPointer>
#include <QWidget>

#include <optional>

namespace earmark::widgets {

class LaneOverlay;

// Draws a lane title as a chip in the top-left corner of the plotting area.
void drawTitleChip(QPainter& painter, const QWidget& lane, const QString& text);

// Colours shared by the lanes, derived from the widget's palette so that the
// lanes follow the desktop's light or dark theme.
struct LaneColours {
    QColor background, text, faintText, grid, waveform, pitch, energy, confidence;
    QColor selection, cursor, playhead, hover, guide;
    static LaneColours from(const QPalette& palette);
};

class Lane : public QWidget {
    Q_OBJECT
public:
    static constexpr int gutterWidth = 76;  // px of the vertical axis on the left
    static constexpr int rightMargin = 10;  // px

    Lane(const QString& id, const QString& title, ViewState* view, QWidget* parent = nullptr);
    ~Lane() override;

    const QString& id() const { return id_; }
    const QString& title() const { return title_; }
    ViewState* view() const { return view_; }

    virtual void setTake(TakeAudioPtr audio);
    virtual void setTracks(TakeTracksPtr tracks);

    // The plotting area (right of the gutter), in widget coordinates.
    QRect plotRect() const;
    // Time ↔ x for the plotting area; x is relative to plotRect().left().
    virtual TimeMapping mapping() const;
    // What lies under a point of this lane beyond the time (e.g. frequency and
    // level), for the status bar; empty when nothing.
    virtual QString describePoint(QPoint pos) const;
    // Does the overlay draw the selection? (The overview draws its own marks.)
    virtual bool showsSelection() const { return true; }
    // Is the content a view of the visible range (redrawn when it changes)?
    virtual bool followsVisibleRange() const { return true; }

    LaneColours colours() const { return LaneColours::from(palette()); }

    // Text shown centred in the plotting area while no take is loaded.
    void setEmptyText(const QString& text);

signals:
    void pointDescribed(const QString& text);

protected:
    // Content has changed (new data, new settings): drop any cached drawing.
    void invalidateContent();
    // Draws the lane's content into `painter` (plot area and gutter); called from
    // paintEvent only when the cache is stale.
    virtual void drawContent(QPainter& painter);
    // Drawn over the cached content on every paint (cheap marks).
    virtual void drawDecorations(QPainter& painter);
    // Lanes that host a child widget (plots) draw nothing themselves.
    void setHostsChild(bool hosts) { hostsChild_ = hosts; }
    // Keeps the overlay above children added by a subclass.
    void raiseOverlay();

    const TakeAudioPtr& take() const { return take_; }
    const TakeTracksPtr& tracks() const { return tracks_; }

    void paintEvent(QPaintEvent* event) override;
    void resizeEvent(QResizeEvent* event) override;
    void mousePressEvent(QMouseEvent* event) override;
    void mouseMoveEvent(QMouseEvent* event) override;
    void mouseReleaseEvent(QMouseEvent* event) override;
    void wheelEvent(QWheelEvent* event) override;
    void leaveEvent(QEvent* event) override;
    void changeEvent(QEvent* event) override;

    double timeAtX(double widgetX) const;
    // Draws the lane title in the plotting area's top-left corner.
    void drawTitle(QPainter& painter, const QString& text) const;

private:
    QString id_;
    QString title_;
    QPointer<ViewState> view_;
    LaneOverlay* overlay_ = nullptr;  // child, owned by this widget
    TakeAudioPtr take_;
    TakeTracksPtr tracks_;
    QPixmap cache_;
    bool cacheValid_ = false;
    bool hostsChild_ = false;
    QString emptyText_;
    std::optional<double> pressTime_;
    bool dragging_ = false;
    int pressX_ = 0;
};

}  // namespace earmark::widgets
