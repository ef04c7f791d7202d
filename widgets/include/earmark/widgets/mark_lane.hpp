// The mark lane: the person's marks on the take as solid spans with a short
// category label, shaded by severity. Click a mark to select it (its span
// becomes the selection); drag either edge to change its span, which the
// lane reports (spanEdited) rather than applies: the window turns it into an
// undoable session edit and calls setMarks() back.
#pragma once

#include "earmark/marks/mark.hpp"
#include "earmark/widgets/span_lane.hpp"

#include <optional>
#include <vector>

namespace earmark::widgets {

// Earmark's colour for a mark category (the same in every view).
QColor categoryColour(MarkCategory category);
QString categoryLabel(MarkCategory category);
QString severityLabel(Severity severity);

class MarkLane : public SpanLane {
    Q_OBJECT
public:
    explicit MarkLane(ViewState* view, QWidget* parent = nullptr);
    QSize sizeHint() const override { return QSize(400, 34); }
    QString describePoint(QPoint pos) const override;
    // The selected mark is outlined instead: a tint over it would falsify its colour.
    bool showsSelection() const override { return false; }

    void setMarks(std::vector<Mark> marks);
    const std::vector<Mark>& marks() const { return marks_; }
    void setSelectedMark(std::optional<MarkId> id);
    std::optional<MarkId> selectedMark() const { return selected_; }

signals:
    void markSelected(qint64 id);  // 0 when the selection was cleared by a click beside the marks
    void spanEdited(qint64 id, double startSeconds, double endSeconds);
    void playRequested();

protected:
    void drawContent(QPainter& painter) override;
    void mousePressEvent(QMouseEvent* event) override;
    void mouseMoveEvent(QMouseEvent* event) override;
    void mouseReleaseEvent(QMouseEvent* event) override;
    void mouseDoubleClickEvent(QMouseEvent* event) override;

private:
    const Mark* markAt(double x) const;
    struct EdgeDrag {
        MarkId id = 0;
        bool startEdge = true;
        double start = 0.0, end = 0.0;  // the span while dragging
    };
    std::optional<EdgeDrag> edgeNear(double x) const;

    std::vector<Mark> marks_;
    std::optional<MarkId> selected_;
    std::optional<EdgeDrag> drag_;
};

}  // namespace earmark::widgets
