// The mark inspector: the selected mark's category, subtype, severity and
// note as editable fields, and its measure snapshot (read only). A change by
// the person is reported as a whole new draft (draftEdited); the window makes
// it an undoable session edit and shows the stored mark again with setMark().
// With no mark selected, the measures box shows the current selection's
// measures (setSelection), so a span can be judged before it is marked.
#pragma once

#include "earmark/marks/mark.hpp"

#include <QWidget>

#include <optional>
#include <utility>

class QComboBox;
class QFormLayout;
class QGroupBox;
class QLabel;
class QLineEdit;

namespace earmark::widgets {

class MarkInspector : public QWidget {
    Q_OBJECT
public:
    explicit MarkInspector(QWidget* parent = nullptr);
    void setMark(std::optional<Mark> mark);  // empty: nothing selected
    // The selection in the lanes and its measures (empty: none); shown while no mark is selected.
    void setSelection(std::optional<std::pair<double, double>> span, const MeasureSnapshot& measures = {});
    QString measuresTitle() const;
    const std::optional<Mark>& mark() const { return mark_; }
    QComboBox* categoryBox() const { return category_; }
    QComboBox* severityBox() const { return severity_; }
    QLineEdit* noteEdit() const { return note_; }
    // Text of the measures shown, one "name: value" per line (for tests and copying).
    QString measuresText() const;
    void focusNote();

signals:
    void draftEdited(qint64 id, const earmark::MarkDraft& draft);

private:
    void fillSubtypes(MarkCategory category, const std::string& current);
    void emitDraft();
    void showMeasures();

    std::optional<Mark> mark_;
    bool filling_ = false;
    QLabel* header_ = nullptr;
    QComboBox* category_ = nullptr;
    QComboBox* subtype_ = nullptr;
    QComboBox* severity_ = nullptr;
    QLineEdit* note_ = nullptr;
    QFormLayout* measures_ = nullptr;
    QGroupBox* measuresBox_ = nullptr;
    std::optional<std::pair<double, double>> selection_;
    MeasureSnapshot selectionMeasures_;
    QWidget* fields_ = nullptr;
};

}  // namespace earmark::widgets
