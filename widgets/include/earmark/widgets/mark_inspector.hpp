// The mark inspector: the selected mark's category, subtype, severity and
// note as editable fields, and its measure snapshot (read only). A change by
// the person is reported as a whole new draft (draftEdited); the window makes
// it an undoable session edit and shows the stored mark again with setMark().
#pragma once

#include "earmark/marks/mark.hpp"

#include <QWidget>

#include <optional>

class QComboBox;
class QFormLayout;
class QLabel;
class QLineEdit;

namespace earmark::widgets {

class MarkInspector : public QWidget {
    Q_OBJECT
public:
    explicit MarkInspector(QWidget* parent = nullptr);
    void setMark(std::optional<Mark> mark);  // empty: nothing selected
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

    std::optional<Mark> mark_;
    bool filling_ = false;
    QLabel* header_ = nullptr;
    QComboBox* category_ = nullptr;
    QComboBox* subtype_ = nullptr;
    QComboBox* severity_ = nullptr;
    QLineEdit* note_ = nullptr;
    QFormLayout* measures_ = nullptr;
    QWidget* fields_ = nullptr;
};

}  // namespace earmark::widgets
