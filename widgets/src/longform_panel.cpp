#include "earmark/widgets/longform_panel.hpp"

#include "earmark/longform/navigation.hpp"

#include <QHeaderView>
#include <QLabel>
#include <QTreeWidget>
#include <QVBoxLayout>

#include <cmath>

namespace earmark::widgets {

namespace {
constexpr int startRole = Qt::UserRole;
constexpr int endRole = Qt::UserRole + 1;

QString clock(double s) {
    const int whole = static_cast<int>(std::floor(s));
    return QStringLiteral("%1:%2.%3")
        .arg(whole / 60)
        .arg(whole % 60, 2, 10, QLatin1Char('0'))
        .arg(static_cast<int>(std::floor((s - whole) * 10)));
}

QTreeWidgetItem* spanItem(QTreeWidgetItem* parent, double start, double end, const QString& what, const QString& tip) {
    auto* item = new QTreeWidgetItem(parent, {clock(start), what});
    item->setData(0, startRole, start);
    item->setData(0, endRole, end);
    item->setToolTip(1, tip);
    return item;
}
}  // namespace

LongformPanel::LongformPanel(QWidget* parent) : QWidget(parent) {
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    note_ = new QLabel(this);
    note_->setWordWrap(true);
    layout->addWidget(note_);
    tree_ = new QTreeWidget(this);
    tree_->setObjectName("longformList");
    tree_->setColumnCount(2);
    tree_->setHeaderLabels({tr("at"), tr("what")});
    tree_->header()->setSectionResizeMode(0, QHeaderView::ResizeToContents);
    tree_->setUniformRowHeights(true);
    layout->addWidget(tree_, 1);
    setMinimumWidth(320);
    findings_ = new QTreeWidgetItem(tree_, {QString(), tr("Findings")});
    outline_ = new QTreeWidgetItem(tree_, {QString(), tr("Outline")});
    for (QTreeWidgetItem* group : {findings_, outline_}) group->setFlags(Qt::ItemIsEnabled);
    connect(tree_, &QTreeWidget::itemClicked, this, [this](QTreeWidgetItem* item) { choose(item); });
    connect(tree_, &QTreeWidget::itemActivated, this, [this](QTreeWidgetItem* item) { choose(item); });
    setFindings({});
    setOutline(nullptr, nullptr);
}

void LongformPanel::choose(QTreeWidgetItem* item) {
    if (!item || !item->data(0, startRole).isValid()) return;
    emit spanChosen(item->data(0, startRole).toDouble(), item->data(0, endRole).toDouble());
}

void LongformPanel::setFindings(const std::vector<Finding>& findings) {
    qDeleteAll(findings_->takeChildren());
    for (const Finding& f : findings)
        spanItem(findings_, f.startS, f.endS,
                 QStringLiteral("%1 %2 %3 (limit %4)")
                     .arg(QString::fromLatin1(findingName(f.kind)))
                     .arg(f.value, 0, 'f', 1)
                     .arg(QString::fromStdString(f.unit))
                     .arg(f.threshold, 0, 'g', 3),
                 QString::fromStdString(f.reason));
    findings_->setText(1, tr("Findings (%1)").arg(findings.size()));
    findings_->setExpanded(true);
}

void LongformPanel::setOutline(const Tier* paragraphs, const Tier* sentences) {
    qDeleteAll(outline_->takeChildren());
    const std::vector<NavSpan> ps = paragraphs ? spansOf(*paragraphs) : std::vector<NavSpan>{};
    const std::vector<NavSpan> ss = sentences ? spansOf(*sentences) : std::vector<NavSpan>{};
    const std::vector<int> holder = containerOf(ps, ss);
    std::vector<QTreeWidgetItem*> paragraphItems;
    for (std::size_t k = 0; k < ps.size(); ++k)
        paragraphItems.push_back(spanItem(outline_, ps[k].startS, ps[k].endS, tr("¶ %1 %2").arg(k + 1).arg(QString::fromStdString(ps[k].label)),
                                          QString::fromStdString(ps[k].label)));
    for (std::size_t k = 0; k < ss.size(); ++k) {
        QTreeWidgetItem* parent = holder[k] >= 0 ? paragraphItems[static_cast<std::size_t>(holder[k])] : outline_;
        spanItem(parent, ss[k].startS, ss[k].endS, QString::fromStdString(ss[k].label), QString::fromStdString(ss[k].label));
    }
    outline_->setText(1, tr("%1 ¶, %2 sentences").arg(ps.size()).arg(ss.size()));
    outline_->setExpanded(true);
}

void LongformPanel::setNote(const QString& text) {
    note_->setText(text);
    note_->setVisible(!text.isEmpty());
}

QString LongformPanel::note() const { return note_->text(); }

void LongformPanel::showCurrent(double startS, double endS) {
    constexpr double same = 0.001;
    for (QTreeWidgetItemIterator it(tree_); *it; ++it) {
        const QVariant s = (*it)->data(0, startRole);
        if (s.isValid() && std::fabs(s.toDouble() - startS) <= same && std::fabs((*it)->data(0, endRole).toDouble() - endS) <= same) {
            const QSignalBlocker block(tree_);
            tree_->setCurrentItem(*it);
            tree_->scrollToItem(*it);
            return;
        }
    }
}

}  // namespace earmark::widgets
