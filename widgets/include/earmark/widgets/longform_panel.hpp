// The long-form panel: the take's long-form findings (kind, time, value and
// threshold) and its outline (paragraphs holding their sentences), as one
// list. Choosing an entry (click, Enter) asks for its span; the window jumps
// to it and selects it. A line above the list says what is shown or why not.
#pragma once

#include "earmark/longform/findings.hpp"
#include "earmark/tiers/tier.hpp"

#include <QWidget>

class QLabel;
class QTreeWidget;
class QTreeWidgetItem;

namespace earmark::widgets {

class LongformPanel : public QWidget {
    Q_OBJECT
public:
    explicit LongformPanel(QWidget* parent = nullptr);
    void setFindings(const std::vector<Finding>& findings);
    // The paragraph and sentence tiers (either may be null).
    void setOutline(const Tier* paragraphs, const Tier* sentences);
    void setNote(const QString& text);
    QString note() const;
    QTreeWidget* tree() const { return tree_; }
    // Marks the entry of the span [start, end] as current (no signal), if listed.
    void showCurrent(double startS, double endS);

signals:
    void spanChosen(double startS, double endS);

private:
    void choose(QTreeWidgetItem* item);

    QLabel* note_ = nullptr;
    QTreeWidget* tree_ = nullptr;
    QTreeWidgetItem* findings_ = nullptr;
    QTreeWidgetItem* outline_ = nullptr;
};

}  // namespace earmark::widgets
