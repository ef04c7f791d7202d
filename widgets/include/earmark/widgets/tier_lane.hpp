// A tier lane: one tier of a take (words or phones) as labelled intervals
// under the signal lanes. Click an interval to select its span, double-click
// to select and play it; Shift-click widens the selection over another one. Hovering an interval draws its two boundaries as
// guides through every lane. Words whose confidence is below 0.5 are tinted.
//
// Editing: drag a boundary (optionally snapped by a function the window
// gives, e.g. to a zero crossing); double-click with Ctrl, or editLabel(),
// edits a label in place. The lane never changes its own tier: it emits the
// edited tier (editRequested) and the window pushes it on the undo stack and
// calls setTier() back.
#pragma once

#include "earmark/acoustic/evidence_review.hpp"
#include "earmark/tiers/tier.hpp"
#include "earmark/widgets/span_lane.hpp"
#include "earmark/widgets/tier_editing.hpp"

#include <functional>

class QLineEdit;

namespace earmark::widgets {

// A word's pronunciation score drawn under the tier (word_score_look.hpp):
// a strip along the bottom of its span, thicker and warmer as the score
// falls; words not said as written are cross-hatched with their script word.
struct WordScoreMark {
    double startS = 0, endS = 0;
    WordScoreClass cls = WordScoreClass::Good;
    bool guessed = false;  // phones guessed (not in the dictionary): dotted line on top
    QString label;         // the script word
    QString detail;        // one line for the tooltip: score, class, guessed
};

// Below this word confidence (0…1) an interval is drawn as doubtful.
inline constexpr double kLowConfidence = 0.5;

class TierLane : public SpanLane {
    Q_OBJECT
public:
    // `tierName` is the tier shown ("words", "phones"); `title` labels the lane.
    TierLane(const QString& tierName, const QString& title, ViewState* view, QWidget* parent = nullptr);
    QSize sizeHint() const override { return QSize(400, 30); }
    QString describePoint(QPoint pos) const override;
    bool followsVisibleRange() const override { return true; }

    const QString& tierName() const { return tierName_; }
    // An empty tier (no intervals) shows a hint: "no <tier> for this take", or the reason
    // given with setHint() until the next setTier().
    void setTier(const Tier& tier);
    const Tier& tier() const { return tier_; }
    // Word scores to draw over the tier (empty: none).
    void setScoreMarks(std::vector<WordScoreMark> marks);
    const std::vector<WordScoreMark>& scoreMarks() const { return scoreMarks_; }
    // Where boundaries land when dragged: identity when not set.
    void setSnap(std::function<double(double)> snap) { snap_ = std::move(snap); }
    // Opens an in-place editor over interval `index`.
    void editLabel(int index);
    QLineEdit* labelEditor() const { return editor_; }

signals:
    void editRequested(const QString& description, const earmark::Tier& after);
    void playRequested();   // double-click: play the selected interval
    void activated();       // clicked: the window's tier commands act on this lane

protected:
    void drawContent(QPainter& painter) override;
    void mousePressEvent(QMouseEvent* event) override;
    void mouseMoveEvent(QMouseEvent* event) override;
    void mouseReleaseEvent(QMouseEvent* event) override;
    void mouseDoubleClickEvent(QMouseEvent* event) override;
    void leaveEvent(QEvent* event) override;

private:
    QString defaultHint() const;
    std::optional<TierBoundary> boundaryNear(double x) const;
    void drawScoreMarks(QPainter& painter);
    void selectInterval(int index);

    QString tierName_;
    Tier tier_;
    std::vector<WordScoreMark> scoreMarks_;
    std::function<double(double)> snap_;
    std::optional<TierBoundary> dragging_;
    double dragTime_ = 0.0;
    QPoint pressPos_;
    bool pressed_ = false;
    QLineEdit* editor_ = nullptr;
};

}  // namespace earmark::widgets

Q_DECLARE_METATYPE(earmark::Tier)
