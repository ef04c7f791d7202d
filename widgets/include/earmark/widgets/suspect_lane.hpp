// The suspects lane: the scan's automatic hints on the take, drawn as hatched
// outlines (never solid, so they do not read as marks, which are a person's
// verdict). The tooltip names the measure and gives the scan's reason.
// Overlapping suspects share the lane's height in rows. Clicking a suspect
// selects its span, ready to be marked.
#pragma once

#include "earmark/store/suspect.hpp"
#include "earmark/widgets/span_lane.hpp"

#include <optional>
#include <vector>

namespace earmark::widgets {

class SuspectLane : public SpanLane {
    Q_OBJECT
public:
    explicit SuspectLane(ViewState* view, QWidget* parent = nullptr);
    QSize sizeHint() const override { return QSize(400, 40); }
    QString describePoint(QPoint pos) const override;

    void setSuspects(std::vector<Suspect> suspects);
    const std::vector<Suspect>& suspects() const { return suspects_; }
    // The suspect under x (widget coordinates), or nullptr.
    const Suspect* suspectAt(double x) const;
    // The suspect whose span is the selection (to a millisecond), else the
    // shortest one holding the cursor, else nullptr.
    const Suspect* suspectFor(const std::optional<TimeRange>& selection, double cursorSeconds) const;

protected:
    void drawContent(QPainter& painter) override;
    bool event(QEvent* event) override;
    void mouseReleaseEvent(QMouseEvent* event) override;

private:
    std::vector<Suspect> suspects_;
};

}  // namespace earmark::widgets
