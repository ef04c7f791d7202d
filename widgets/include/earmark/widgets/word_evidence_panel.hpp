// The word inspector: for the word under the cursor, its pronunciation
// score and class, whether its phones were guessed, and a table of its
// phones — expected, best-matching (what the free phone loop heard), score
// — with the phones heard as something else in bold and the worst one
// marked. A legend of the word tier's score strip sits underneath. It only
// shows rows computed by the engine (evidence_review.hpp).
#pragma once

#include "earmark/widgets/word_evidence_loader.hpp"

#include <QWidget>

class QLabel;
class QTableWidget;

namespace earmark::widgets {

class WordEvidencePanel : public QWidget {
    Q_OBJECT
public:
    explicit WordEvidencePanel(QWidget* parent = nullptr);
    // New evidence (null: none), or a line saying why there is none.
    void setEvidence(WordEvidencePtr evidence, const QString& why = {});
    // Shows script word `index` (-1: none selected).
    void showWord(int index);
    int shownWord() const { return word_; }
    QTableWidget* table() const { return table_; }
    QString headerText() const;
    // The rows shown, one "expected | heard | score" per line (for tests and copying).
    QString rowsText() const;

private:
    WordEvidencePtr evidence_;
    int word_ = -1;
    QLabel* header_ = nullptr;
    QTableWidget* table_ = nullptr;
};

}  // namespace earmark::widgets
