#include "earmark/widgets/mark_palette.hpp"

#include "earmark/widgets/mark_lane.hpp"

#include <QComboBox>
#include <QFormLayout>
#include <QKeyEvent>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QVBoxLayout>

namespace earmark::widgets {

MarkPalette::MarkPalette(QWidget* parent) : QDialog(parent) {
    setObjectName("markPalette");
    setWindowTitle(tr("New mark"));
    auto* layout = new QVBoxLayout(this);
    span_ = new QLabel(this);
    layout->addWidget(span_);
    filter_ = new QLineEdit(this);
    filter_->setPlaceholderText(tr("type to filter, or 1–6"));
    layout->addWidget(filter_);
    categories_ = new QListWidget(this);
    int n = 1;
    for (MarkCategory c : allMarkCategories()) {
        auto* item = new QListWidgetItem(QStringLiteral("%1   %2").arg(n++).arg(categoryLabel(c)), categories_);
        item->setData(Qt::UserRole, static_cast<int>(c));
        QPixmap swatch(12, 12);
        swatch.fill(categoryColour(c));
        item->setIcon(QIcon(swatch));
    }
    categories_->setCurrentRow(0);
    categories_->setFixedHeight(categories_->sizeHintForRow(0) * 6 + 2 * categories_->frameWidth() + 4);
    layout->addWidget(categories_);
    auto* form = new QFormLayout;
    subtype_ = new QComboBox(this);
    severity_ = new QComboBox(this);
    for (Severity s : allSeverities()) severity_->addItem(severityLabel(s), static_cast<int>(s));
    form->addRow(tr("subtype"), subtype_);
    form->addRow(tr("severity"), severity_);
    layout->addLayout(form);
    auto* hint = new QLabel(tr("Enter makes the mark · Esc cancels"), this);
    hint->setEnabled(false);
    layout->addWidget(hint);
    filter_->installEventFilter(this);
    categories_->installEventFilter(this);
    subtype_->installEventFilter(this);
    severity_->installEventFilter(this);
    connect(filter_, &QLineEdit::textChanged, this, [this] { applyFilter(); });
    connect(categories_, &QListWidget::currentRowChanged, this, [this] { fillSubtypes(); });
    connect(categories_, &QListWidget::itemActivated, this, [this] { finish(); });
    fillSubtypes();
}

void MarkPalette::begin(const QString& spanText) {
    span_->setText(spanText);
    filter_->clear();
    categories_->setCurrentRow(0);
    severity_->setCurrentIndex(0);
    show();
    raise();
    activateWindow();
    filter_->setFocus();
}

std::optional<MarkCategory> MarkPalette::currentCategory() const {
    const QListWidgetItem* item = categories_->currentItem();
    if (!item || item->isHidden()) return std::nullopt;
    return static_cast<MarkCategory>(item->data(Qt::UserRole).toInt());
}

MarkChoice MarkPalette::choice() const {
    MarkChoice c;
    c.category = currentCategory().value_or(MarkCategory::Other);
    c.subtype = subtype_->currentData().toString().toStdString();
    c.severity = static_cast<Severity>(severity_->currentData().toInt());
    return c;
}

void MarkPalette::applyFilter() {
    const QString f = filter_->text().trimmed();
    int first = -1;
    for (int i = 0; i < categories_->count(); ++i) {
        QListWidgetItem* item = categories_->item(i);
        const auto c = static_cast<MarkCategory>(item->data(Qt::UserRole).toInt());
        const bool show = f.isEmpty() || categoryLabel(c).contains(f, Qt::CaseInsensitive);
        item->setHidden(!show);
        if (show && first < 0) first = i;
    }
    if (first >= 0 && (!categories_->currentItem() || categories_->currentItem()->isHidden())) categories_->setCurrentRow(first);
}

void MarkPalette::fillSubtypes() {
    subtype_->clear();
    subtype_->addItem(tr("(none)"), QString());
    if (const auto c = currentCategory())
        for (std::string_view s : subtypesOf(*c)) {
            const QString name = QString::fromUtf8(s.data(), static_cast<qsizetype>(s.size()));
            subtype_->addItem(name, name);
        }
    subtype_->setEnabled(subtype_->count() > 1);
}

void MarkPalette::finish() {
    if (!currentCategory()) return;
    const MarkChoice c = choice();
    hide();
    emit chosen(c);
}

bool MarkPalette::eventFilter(QObject* watched, QEvent* event) {
    if (event->type() != QEvent::KeyPress) return QDialog::eventFilter(watched, event);
    auto* key = static_cast<QKeyEvent*>(event);
    const int k = key->key();
    if (k == Qt::Key_Return || k == Qt::Key_Enter) {
        finish();
        return true;
    }
    if (k == Qt::Key_Escape) {
        reject();
        return true;
    }
    if (watched == filter_) {
        if (k >= Qt::Key_1 && k <= Qt::Key_6 && key->modifiers() == Qt::NoModifier) {
            filter_->clear();
            categories_->setCurrentRow(k - Qt::Key_1);
            return true;
        }
        if (k == Qt::Key_Up || k == Qt::Key_Down) {
            int row = categories_->currentRow();
            do row += k == Qt::Key_Down ? 1 : -1;
            while (row >= 0 && row < categories_->count() && categories_->item(row)->isHidden());
            if (row >= 0 && row < categories_->count()) categories_->setCurrentRow(row);
            return true;
        }
    }
    return QDialog::eventFilter(watched, event);
}

}  // namespace earmark::widgets
