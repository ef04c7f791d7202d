#include "earmark/widgets/word_evidence_panel.hpp"

#include "earmark/acoustic/evidence_review.hpp"
#include "earmark/widgets/word_score_look.hpp"

#include <QHeaderView>
#include <QLabel>
#include <QTableWidget>
#include <QVBoxLayout>

#include <algorithm>

namespace earmark::widgets {

WordEvidencePanel::WordEvidencePanel(QWidget* parent) : QWidget(parent) {
    auto* layout = new QVBoxLayout(this);
    header_ = new QLabel(this);
    header_->setWordWrap(true);
    header_->setTextFormat(Qt::RichText);
    layout->addWidget(header_);
    table_ = new QTableWidget(0, 4, this);
    table_->setObjectName("wordPhones");
    table_->setHorizontalHeaderLabels({tr("expected"), tr("heard"), tr("score"), tr("from (s)")});
    table_->verticalHeader()->hide();
    table_->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    table_->horizontalHeader()->setStretchLastSection(true);
    table_->setEditTriggers(QAbstractItemView::NoEditTriggers);
    table_->setSelectionMode(QAbstractItemView::NoSelection);
    layout->addWidget(table_, 1);
    auto* legend = new QLabel(wordScoreLegend(), this);
    legend->setWordWrap(true);
    legend->setTextFormat(Qt::RichText);
    layout->addWidget(legend);
    setEvidence(nullptr);
}

void WordEvidencePanel::setEvidence(WordEvidencePtr evidence, const QString& why) {
    evidence_ = std::move(evidence);
    word_ = -2;
    showWord(-1);
    if (!evidence_) header_->setText(why.isEmpty() ? tr("No word evidence for this take.") : why.toHtmlEscaped());
}

void WordEvidencePanel::showWord(int index) {
    if (!evidence_ || index == word_) return;
    word_ = index;
    table_->setRowCount(0);
    if (index < 0 || index >= static_cast<int>(evidence_->words.size())) {
        header_->setText(tr("Click a word to see its phones. Mean confidence %1; %2 coverage finding(s).")
                             .arg(evidence_->meanConfidence, 0, 'f', 2)
                             .arg(evidence_->coverage.size()));
        return;
    }
    const WordEvidence& w = evidence_->words[static_cast<std::size_t>(index)];
    const WordScoreClass cls = classifyWord(w);
    QString head = tr("<b>%1</b> — <span style='color:%2'>%3</span>")
                       .arg(QString::fromStdString(w.label).toHtmlEscaped(), wordScoreColour(cls).name(),
                            QString::fromLatin1(wordScoreClassName(cls)));
    if (w.spoken) head += tr(", score %1 nats/frame, confidence %2, %3–%4 s")
                              .arg(w.score, 0, 'f', 2).arg(w.confidence, 0, 'f', 2)
                              .arg(w.startS, 0, 'f', 2).arg(w.endS, 0, 'f', 2);
    if (w.substituted) head += tr(", something else was said in its place (%1–%2 s)").arg(w.startS, 0, 'f', 2).arg(w.endS, 0, 'f', 2);
    for (const CoverageFinding& c : evidence_->coverage)
        if (std::find(c.words.begin(), c.words.end(), w.label) != c.words.end())
            head += "<br>" + QString::fromStdString(c.detail).toHtmlEscaped();
    if (w.occurrences > 1) head += tr(", said %1 times").arg(w.occurrences);
    if (w.guessed) head += tr("<br><i>phones guessed: the word is not in the dictionary</i>");
    header_->setText(head);
    const std::vector<PhoneRow> rows = phoneRows(w);
    table_->setRowCount(static_cast<int>(rows.size()));
    for (int r = 0; r < static_cast<int>(rows.size()); ++r) {
        const PhoneRow& row = rows[static_cast<std::size_t>(r)];
        const QStringList cells{QString::fromStdString(row.expected) + (row.worst ? QStringLiteral(" ◂") : QString()),
                                row.heard.empty() ? tr("(no frames)") : QString::fromStdString(row.heard),
                                QString::number(row.score, 'f', 2), QString::number(row.startS, 'f', 3)};
        for (int c = 0; c < cells.size(); ++c) {
            auto* item = new QTableWidgetItem(cells[c]);
            if (!row.matches) {
                QFont f = item->font();
                f.setBold(true);
                item->setFont(f);
            }
            if (c == 2) item->setTextAlignment(Qt::AlignRight | Qt::AlignVCenter);
            table_->setItem(r, c, item);
        }
    }
}

QString WordEvidencePanel::headerText() const { return header_->text(); }

QString WordEvidencePanel::rowsText() const {
    QStringList lines;
    for (int r = 0; r < table_->rowCount(); ++r)
        lines << QStringLiteral("%1 | %2 | %3").arg(table_->item(r, 0)->text(), table_->item(r, 1)->text(), table_->item(r, 2)->text());
    return lines.join('\n');
}

}  // namespace earmark::widgets
