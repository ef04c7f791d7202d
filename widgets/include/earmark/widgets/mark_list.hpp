// Every mark of the session in one sortable table (take, span, category,
// subtype, severity, words, note), filtered by category, severity and take.
// Clicking a row asks the window to open that take and select the mark;
// double-clicking also plays it.
#pragma once

#include "earmark/marks/mark.hpp"

#include <QWidget>

class QComboBox;
class QLabel;
class QTableWidget;

namespace earmark::widgets {

class SessionDocument;

class MarkList : public QWidget {
    Q_OBJECT
public:
    explicit MarkList(QWidget* parent = nullptr);
    void setDocument(SessionDocument* document);
    QTableWidget* table() const { return table_; }
    QComboBox* categoryFilter() const { return category_; }
    QComboBox* severityFilter() const { return severity_; }
    QComboBox* takeFilter() const { return take_; }
    int shownCount() const;
    MarkId markAtRow(int row) const;

signals:
    void markChosen(qint64 id);
    void markPlayRequested(qint64 id);

private:
    void rebuild();
    void rebuildTakes();

    SessionDocument* document_ = nullptr;
    QComboBox* category_ = nullptr;
    QComboBox* severity_ = nullptr;
    QComboBox* take_ = nullptr;
    QLabel* count_ = nullptr;
    QTableWidget* table_ = nullptr;
};

}  // namespace earmark::widgets
