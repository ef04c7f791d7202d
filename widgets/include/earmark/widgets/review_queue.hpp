// The review queue of an open session: one row per take in queue order with
// its status and mark count, a "37 / 200 reviewed" progress line, a status
// filter, and a Locate… button for takes whose audio file is missing. It
// shows what the SessionDocument holds and follows its takesChanged().
//
// Thread-safety: GUI thread only.
#pragma once

#include "earmark/store/take.hpp"

#include <QWidget>

#include <optional>

class QComboBox;
class QLabel;
class QPushButton;
class QTreeWidget;

namespace earmark::widgets {

class SessionDocument;

// "unreviewed", "in review", "clean", "has marks", "skipped".
QString statusLabel(ReviewStatus status);

class ReviewQueue : public QWidget {
    Q_OBJECT
public:
    explicit ReviewQueue(QWidget* parent = nullptr);

    void setDocument(SessionDocument* document);  // nullptr clears
    std::optional<TakeId> currentTake() const;
    void setCurrentTake(TakeId id);
    // Moves to the next / previous take shown (after filtering); false at the end.
    bool step(int delta);
    // Empty = every status.
    void setStatusFilter(std::optional<ReviewStatus> status);
    QString progressText() const;
    int shownCount() const;

signals:
    void takeChosen(qint64 take);
    void locateRequested(qint64 take);

private:
    void rebuild();
    void onCurrentChanged();

    SessionDocument* document_ = nullptr;
    QComboBox* filter_ = nullptr;
    QLabel* progress_ = nullptr;
    QTreeWidget* list_ = nullptr;
    QPushButton* locate_ = nullptr;
    bool rebuilding_ = false;
};

}  // namespace earmark::widgets
