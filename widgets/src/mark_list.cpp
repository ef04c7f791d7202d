#include "earmark/widgets/mark_list.hpp"

#include "earmark/widgets/mark_lane.hpp"
#include "earmark/widgets/session_document.hpp"

#include <QComboBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QTableWidget>
#include <QVBoxLayout>

namespace earmark::widgets {

namespace {
constexpr int markIdRole = Qt::UserRole + 1;
enum Column { TakeCol, StartCol, EndCol, CategoryCol, SubtypeCol, SeverityCol, WordsCol, RaterCol, NoteCol, ColumnCount };

// A cell that sorts by a rank instead of its text (severity: minor < major < blocker).
class RankedCell : public QTableWidgetItem {
public:
    RankedCell(const QString& text, int rank) : QTableWidgetItem(text), rank_(rank) {
        setFlags(Qt::ItemIsSelectable | Qt::ItemIsEnabled);
    }
    bool operator<(const QTableWidgetItem& other) const override {
        if (const auto* o = dynamic_cast<const RankedCell*>(&other)) return rank_ < o->rank_;
        return QTableWidgetItem::operator<(other);
    }

private:
    int rank_;
};

QTableWidgetItem* cell(const QVariant& value) {
    auto* item = new QTableWidgetItem;
    item->setData(Qt::DisplayRole, value);  // numbers sort as numbers
    item->setFlags(Qt::ItemIsSelectable | Qt::ItemIsEnabled);
    return item;
}
}  // namespace

MarkList::MarkList(QWidget* parent) : QWidget(parent) {
    setObjectName("markList");
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    auto* filters = new QHBoxLayout;
    category_ = new QComboBox(this);
    category_->addItem(tr("every category"), -1);
    for (MarkCategory c : allMarkCategories()) category_->addItem(categoryLabel(c), static_cast<int>(c));
    severity_ = new QComboBox(this);
    severity_->addItem(tr("every severity"), -1);
    for (Severity s : allSeverities()) severity_->addItem(severityLabel(s), static_cast<int>(s));
    take_ = new QComboBox(this);
    take_->addItem(tr("every take"), QVariant::fromValue<qint64>(0));
    count_ = new QLabel(this);
    filters->addWidget(category_);
    filters->addWidget(severity_);
    filters->addWidget(take_);
    filters->addStretch(1);
    filters->addWidget(count_);
    layout->addLayout(filters);
    table_ = new QTableWidget(this);
    table_->setColumnCount(ColumnCount);
    table_->setHorizontalHeaderLabels(
        {tr("take"), tr("start s"), tr("end s"), tr("category"), tr("subtype"), tr("severity"), tr("words"), tr("rater"),
         tr("note")});
    table_->verticalHeader()->hide();
    table_->setSelectionBehavior(QAbstractItemView::SelectRows);
    table_->setSelectionMode(QAbstractItemView::SingleSelection);
    table_->setSortingEnabled(true);
    table_->horizontalHeader()->setStretchLastSection(true);
    layout->addWidget(table_, 1);
    for (QComboBox* box : {category_, severity_, take_})
        connect(box, &QComboBox::currentIndexChanged, this, [this] { rebuild(); });
    connect(table_, &QTableWidget::cellClicked, this, [this](int row) {
        if (const MarkId id = markAtRow(row)) emit markChosen(id);
    });
    connect(table_, &QTableWidget::cellDoubleClicked, this, [this](int row) {
        if (const MarkId id = markAtRow(row)) emit markPlayRequested(id);
    });
}

void MarkList::setDocument(SessionDocument* document) {
    if (document_) disconnect(document_, nullptr, this, nullptr);
    document_ = document;
    if (document_) {
        connect(document_, &SessionDocument::marksChanged, this, [this] { rebuild(); });
        connect(document_, &SessionDocument::takesChanged, this, [this] { rebuildTakes(); });
    }
    rebuildTakes();
    rebuild();
}

int MarkList::shownCount() const { return table_->rowCount(); }

MarkId MarkList::markAtRow(int row) const {
    const QTableWidgetItem* item = table_->item(row, TakeCol);
    return item ? item->data(markIdRole).value<qint64>() : 0;
}

void MarkList::rebuildTakes() {
    const qint64 keep = take_->currentData().value<qint64>();
    const QSignalBlocker block(take_);
    while (take_->count() > 1) take_->removeItem(1);
    if (document_)
        for (const Take& t : document_->takes())
            take_->addItem(QString::fromStdString(t.lineId.empty() ? std::to_string(t.id) : t.lineId),
                           QVariant::fromValue<qint64>(t.id));
    take_->setCurrentIndex(std::max(0, take_->findData(QVariant::fromValue<qint64>(keep))));
}

void MarkList::rebuild() {
    table_->setSortingEnabled(false);
    table_->setRowCount(0);
    if (!document_) {
        count_->clear();
        table_->setSortingEnabled(true);
        return;
    }
    const int wantCategory = category_->currentData().toInt();
    const int wantSeverity = severity_->currentData().toInt();
    const qint64 wantTake = take_->currentData().value<qint64>();
    const auto marks = document_->marks();
    for (const Mark& m : marks) {
        if (wantCategory >= 0 && static_cast<int>(m.category) != wantCategory) continue;
        if (wantSeverity >= 0 && static_cast<int>(m.severity) != wantSeverity) continue;
        if (wantTake != 0 && m.takeId != wantTake) continue;
        const int row = table_->rowCount();
        table_->insertRow(row);
        const Take* t = document_->take(m.takeId);
        auto* take = cell(t ? QString::fromStdString(t->lineId) : QString::number(m.takeId));
        take->setData(markIdRole, QVariant::fromValue<qint64>(m.id));
        table_->setItem(row, TakeCol, take);
        table_->setItem(row, StartCol, cell(std::round(m.startSeconds * 1000.0) / 1000.0));
        table_->setItem(row, EndCol, cell(std::round(m.endSeconds * 1000.0) / 1000.0));
        auto* category = cell(categoryLabel(m.category));
        category->setForeground(categoryColour(m.category));
        table_->setItem(row, CategoryCol, category);
        table_->setItem(row, SubtypeCol, cell(QString::fromStdString(m.subtype)));
        table_->setItem(row, SeverityCol, new RankedCell(severityLabel(m.severity), static_cast<int>(m.severity)));
        table_->setItem(row, WordsCol, cell(QString::fromStdString(m.words)));
        table_->setItem(row, RaterCol, cell(QString::fromStdString(m.rater)));
        table_->setItem(row, NoteCol, cell(QString::fromStdString(m.note)));
    }
    table_->setSortingEnabled(true);
    table_->resizeColumnsToContents();
    count_->setText(tr("%1 of %2 marks").arg(table_->rowCount()).arg(marks.size()));
}

}  // namespace earmark::widgets
