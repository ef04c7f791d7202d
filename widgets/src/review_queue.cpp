#include "earmark/widgets/review_queue.hpp"

#include "earmark/widgets/session_document.hpp"

#include <QComboBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QPushButton>
#include <QTreeWidget>
#include <QVBoxLayout>

namespace earmark::widgets {

namespace {
constexpr int takeIdRole = Qt::UserRole + 1;

QColor statusColour(ReviewStatus s) {
    switch (s) {
    case ReviewStatus::Clean: return QColor(46, 139, 87);
    case ReviewStatus::HasMarks: return QColor(200, 100, 30);
    case ReviewStatus::Skipped: return QColor(128, 128, 128);
    case ReviewStatus::InReview: return QColor(60, 110, 190);
    case ReviewStatus::Unreviewed: break;
    }
    return {};
}
}  // namespace

QString statusLabel(ReviewStatus s) {
    switch (s) {
    case ReviewStatus::Unreviewed: return QObject::tr("unreviewed");
    case ReviewStatus::InReview: return QObject::tr("in review");
    case ReviewStatus::Clean: return QObject::tr("clean");
    case ReviewStatus::HasMarks: return QObject::tr("has marks");
    case ReviewStatus::Skipped: return QObject::tr("skipped");
    }
    return {};
}

ReviewQueue::ReviewQueue(QWidget* parent) : QWidget(parent) {
    setObjectName("reviewQueue");
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    auto* top = new QHBoxLayout;
    progress_ = new QLabel(this);
    progress_->setObjectName("queueProgress");
    top->addWidget(progress_, 1);
    filter_ = new QComboBox(this);
    filter_->setObjectName("queueFilter");
    filter_->addItem(tr("all takes"), -1);
    for (ReviewStatus s : {ReviewStatus::Unreviewed, ReviewStatus::InReview, ReviewStatus::Clean, ReviewStatus::HasMarks,
                           ReviewStatus::Skipped})
        filter_->addItem(statusLabel(s), static_cast<int>(s));
    filter_->setToolTip(tr("Show only takes of one status"));
    top->addWidget(filter_);
    layout->addLayout(top);
    list_ = new QTreeWidget(this);
    list_->setObjectName("queueList");
    list_->setColumnCount(3);
    list_->setHeaderLabels({tr("take"), tr("status"), tr("marks")});
    list_->setRootIsDecorated(false);
    list_->setUniformRowHeights(true);
    list_->header()->setStretchLastSection(false);
    list_->header()->setSectionResizeMode(0, QHeaderView::Stretch);
    list_->header()->setSectionResizeMode(1, QHeaderView::ResizeToContents);
    list_->header()->setSectionResizeMode(2, QHeaderView::ResizeToContents);
    layout->addWidget(list_, 1);
    locate_ = new QPushButton(tr("Locate audio…"), this);
    locate_->setObjectName("locateButton");
    locate_->setToolTip(tr("This take's audio file is not where the session says; point to where it is now"));
    locate_->hide();
    layout->addWidget(locate_);
    connect(filter_, &QComboBox::currentIndexChanged, this, [this] { rebuild(); });
    connect(list_, &QTreeWidget::currentItemChanged, this, [this] { onCurrentChanged(); });
    connect(locate_, &QPushButton::clicked, this, [this] {
        if (const auto t = currentTake()) emit locateRequested(*t);
    });
}

void ReviewQueue::setDocument(SessionDocument* document) {
    if (document_) disconnect(document_, nullptr, this, nullptr);
    document_ = document;
    if (document_) connect(document_, &SessionDocument::takesChanged, this, [this] { rebuild(); });
    rebuild();
}

void ReviewQueue::setStatusFilter(std::optional<ReviewStatus> status) {
    filter_->setCurrentIndex(status ? filter_->findData(static_cast<int>(*status)) : 0);
}

QString ReviewQueue::progressText() const { return progress_->text(); }
int ReviewQueue::shownCount() const { return list_->topLevelItemCount(); }

void ReviewQueue::rebuild() {
    const std::optional<TakeId> keep = currentTake();
    rebuilding_ = true;
    list_->clear();
    if (!document_) {
        progress_->clear();
        locate_->hide();
        rebuilding_ = false;
        return;
    }
    const int wanted = filter_->currentData().toInt();
    const auto& takes = document_->takes();
    progress_->setText(tr("%1 / %2 reviewed").arg(document_->reviewedCount()).arg(takes.size()));
    QTreeWidgetItem* current = nullptr;
    for (const Take& t : takes) {
        if (wanted >= 0 && static_cast<int>(t.status) != wanted) continue;
        const bool missing = document_->audioMissing(t.id);
        auto* item = new QTreeWidgetItem(list_);
        const QString name = QString::fromStdString(t.lineId.empty() ? std::to_string(t.id) : t.lineId);
        item->setText(0, name);
        item->setData(0, takeIdRole, QVariant::fromValue<qint64>(t.id));
        item->setToolTip(0, QString::fromStdString(t.text + "\n" + t.audioPath));
        item->setText(1, missing ? tr("missing audio") : statusLabel(t.status));
        item->setForeground(1, missing ? QColor(192, 40, 40) : statusColour(t.status));
        if (t.markCount > 0) item->setText(2, QString::number(t.markCount));
        item->setTextAlignment(2, Qt::AlignRight | Qt::AlignVCenter);
        if (keep && *keep == t.id) current = item;
    }
    if (current) list_->setCurrentItem(current);
    rebuilding_ = false;
    locate_->setVisible(keep && document_->audioMissing(*keep));
}

std::optional<TakeId> ReviewQueue::currentTake() const {
    const QTreeWidgetItem* item = list_->currentItem();
    if (!item) return std::nullopt;
    return item->data(0, takeIdRole).value<qint64>();
}

void ReviewQueue::setCurrentTake(TakeId id) {
    for (int i = 0; i < list_->topLevelItemCount(); ++i)
        if (list_->topLevelItem(i)->data(0, takeIdRole).value<qint64>() == id) {
            list_->setCurrentItem(list_->topLevelItem(i));
            return;
        }
    // Filtered out: show every take so that the chosen one can be current.
    if (filter_->currentIndex() != 0) {
        filter_->setCurrentIndex(0);
        setCurrentTake(id);
    }
}

bool ReviewQueue::step(int delta) {
    const int n = list_->topLevelItemCount();
    if (n == 0) return false;
    QTreeWidgetItem* item = list_->currentItem();
    const int row = item ? list_->indexOfTopLevelItem(item) + delta : (delta > 0 ? 0 : n - 1);
    if (row < 0 || row >= n) return false;
    list_->setCurrentItem(list_->topLevelItem(row));
    return true;
}

void ReviewQueue::onCurrentChanged() {
    if (rebuilding_) return;
    const auto t = currentTake();
    locate_->setVisible(t && document_ && document_->audioMissing(*t));
    if (t) emit takeChosen(*t);
}

}  // namespace earmark::widgets
