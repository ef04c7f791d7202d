// The small palette that makes a mark in two keystrokes: the window opens it
// over a span; a number key 1–6 picks one of the six categories (or type to
// filter them, arrows to move), subtype and severity are optional (Tab), and
// Enter makes the mark. Escape closes it without a mark.
#pragma once

#include "earmark/marks/mark.hpp"

#include <QDialog>

class QComboBox;
class QLabel;
class QLineEdit;
class QListWidget;

namespace earmark::widgets {

struct MarkChoice {
    MarkCategory category = MarkCategory::Other;
    std::string subtype;
    Severity severity = Severity::Minor;
};

class MarkPalette : public QDialog {
    Q_OBJECT
public:
    explicit MarkPalette(QWidget* parent = nullptr);

    // Shows the palette for a span ("0.42–0.77 s · ferry to"), filter cleared.
    void begin(const QString& spanText);
    QLineEdit* filterEdit() const { return filter_; }
    std::optional<MarkCategory> currentCategory() const;
    MarkChoice choice() const;

signals:
    void chosen(const earmark::widgets::MarkChoice& choice);

protected:
    bool eventFilter(QObject* watched, QEvent* event) override;

private:
    void applyFilter();
    void fillSubtypes();
    void finish();

    QLabel* span_ = nullptr;
    QLineEdit* filter_ = nullptr;
    QListWidget* categories_ = nullptr;
    QComboBox* subtype_ = nullptr;
    QComboBox* severity_ = nullptr;
};

}  // namespace earmark::widgets
