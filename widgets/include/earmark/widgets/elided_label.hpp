// A one-line label that gives way: when its place is narrower than its text
// it shows the start with "…" and keeps the whole text in its tooltip, so
// a long message never pushes over (or under) its neighbours in a bar.
#pragma once

#include <QFrame>
#include <QString>

namespace earmark::widgets {

class ElidedLabel : public QFrame {
    Q_OBJECT
public:
    explicit ElidedLabel(QWidget* parent = nullptr);
    void setText(const QString& text);
    const QString& text() const { return text_; }
    // The text as it fits the current width (exposed for tests).
    QString shownText() const;

    QSize sizeHint() const override;
    QSize minimumSizeHint() const override;

protected:
    void paintEvent(QPaintEvent* event) override;

private:
    QString text_;
};

}  // namespace earmark::widgets
