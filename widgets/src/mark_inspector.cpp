#include "earmark/widgets/mark_inspector.hpp"

#include "earmark/widgets/mark_lane.hpp"
#include "earmark/widgets/mark_snapshot.hpp"

#include <QComboBox>
#include <QFormLayout>
#include <QGroupBox>
#include <QLabel>
#include <QLineEdit>
#include <QVBoxLayout>

namespace earmark::widgets {

MarkInspector::MarkInspector(QWidget* parent) : QWidget(parent) {
    setObjectName("markInspector");
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(6, 6, 6, 6);
    header_ = new QLabel(this);
    header_->setWordWrap(true);
    header_->setTextFormat(Qt::RichText);
    layout->addWidget(header_);
    fields_ = new QWidget(this);
    auto* form = new QFormLayout(fields_);
    form->setContentsMargins(0, 0, 0, 0);
    category_ = new QComboBox(fields_);
    for (MarkCategory c : allMarkCategories()) category_->addItem(categoryLabel(c), static_cast<int>(c));
    subtype_ = new QComboBox(fields_);
    severity_ = new QComboBox(fields_);
    for (Severity s : allSeverities()) severity_->addItem(severityLabel(s), static_cast<int>(s));
    note_ = new QLineEdit(fields_);
    note_->setPlaceholderText(tr("what is wrong, for the voice team"));
    form->addRow(tr("category"), category_);
    form->addRow(tr("subtype"), subtype_);
    form->addRow(tr("severity"), severity_);
    form->addRow(tr("note"), note_);
    layout->addWidget(fields_);
    measuresBox_ = new QGroupBox(this);
    measures_ = new QFormLayout(measuresBox_);
    for (const auto& [label, value] : describeMeasures({})) measures_->addRow(label, new QLabel(value, measuresBox_));
    layout->addWidget(measuresBox_);
    layout->addStretch(1);
    connect(category_, &QComboBox::currentIndexChanged, this, [this] {
        if (filling_) return;
        fillSubtypes(static_cast<MarkCategory>(category_->currentData().toInt()), {});
        emitDraft();
    });
    connect(subtype_, &QComboBox::currentIndexChanged, this, [this] { emitDraft(); });
    connect(severity_, &QComboBox::currentIndexChanged, this, [this] { emitDraft(); });
    connect(note_, &QLineEdit::editingFinished, this, [this] { emitDraft(); });
    setMark(std::nullopt);
}

void MarkInspector::fillSubtypes(MarkCategory category, const std::string& current) {
    const bool was = filling_;
    filling_ = true;
    subtype_->clear();
    subtype_->addItem(tr("(none)"), QString());
    for (std::string_view s : subtypesOf(category)) {
        const QString name = QString::fromUtf8(s.data(), static_cast<qsizetype>(s.size()));
        subtype_->addItem(name, name);
    }
    subtype_->setCurrentIndex(std::max(0, subtype_->findData(QString::fromStdString(current))));
    subtype_->setEnabled(subtype_->count() > 1);
    filling_ = was;
}

void MarkInspector::setMark(std::optional<Mark> mark) {
    mark_ = std::move(mark);
    filling_ = true;
    fields_->setEnabled(mark_.has_value());
    if (!mark_) {
        header_->setText(tr("<i>No mark selected. Click a mark, or select a span and press N.</i>"));
        note_->clear();
    } else {
        const Mark& m = *mark_;
        header_->setText(tr("<b>%1 mark</b>, %2–%3 s%4%5")
                             .arg(categoryLabel(m.category))
                             .arg(m.startSeconds, 0, 'f', 3)
                             .arg(m.endSeconds, 0, 'f', 3)
                             .arg(m.words.empty() ? QString() : tr("<br>words: %1").arg(QString::fromStdString(m.words).toHtmlEscaped()))
                             .arg(m.rater.empty() ? QString() : tr("<br>by %1").arg(QString::fromStdString(m.rater).toHtmlEscaped())));
        category_->setCurrentIndex(category_->findData(static_cast<int>(m.category)));
        fillSubtypes(m.category, m.subtype);
        severity_->setCurrentIndex(severity_->findData(static_cast<int>(m.severity)));
        if (!note_->hasFocus()) note_->setText(QString::fromStdString(m.note));
    }
    showMeasures();
    filling_ = false;
}

void MarkInspector::setSelection(std::optional<std::pair<double, double>> span, const MeasureSnapshot& measures) {
    selection_ = span;
    selectionMeasures_ = span ? measures : MeasureSnapshot{};
    if (!mark_) showMeasures();
}

QString MarkInspector::measuresTitle() const { return measuresBox_->title(); }

void MarkInspector::showMeasures() {
    const bool ofSelection = !mark_ && selection_;
    if (mark_)
        measuresBox_->setTitle(tr("Measures of the mark"));
    else if (ofSelection)
        measuresBox_->setTitle(tr("Measures of the selection, %1–%2 s").arg(selection_->first, 0, 'f', 3).arg(selection_->second, 0, 'f', 3));
    else
        measuresBox_->setTitle(tr("Measures of the span"));
    const auto rows = describeMeasures(mark_ ? mark_->measures : ofSelection ? selectionMeasures_ : MeasureSnapshot{});
    for (int i = 0; i < static_cast<int>(rows.size()) && i < measures_->rowCount(); ++i)
        if (auto* value = qobject_cast<QLabel*>(measures_->itemAt(i, QFormLayout::FieldRole)->widget()))
            value->setText(rows[static_cast<std::size_t>(i)].second);
}

QString MarkInspector::measuresText() const {
    QStringList lines;
    for (int i = 0; i < measures_->rowCount(); ++i) {
        auto* label = qobject_cast<QLabel*>(measures_->itemAt(i, QFormLayout::LabelRole)->widget());
        auto* value = qobject_cast<QLabel*>(measures_->itemAt(i, QFormLayout::FieldRole)->widget());
        if (label && value) lines << label->text() + ": " + value->text();
    }
    return lines.join('\n');
}

void MarkInspector::focusNote() {
    if (mark_) note_->setFocus();
}

void MarkInspector::emitDraft() {
    if (filling_ || !mark_) return;
    MarkDraft d = mark_->draft();
    d.category = static_cast<MarkCategory>(category_->currentData().toInt());
    d.subtype = subtype_->currentData().toString().toStdString();
    d.severity = static_cast<Severity>(severity_->currentData().toInt());
    d.note = note_->text().toStdString();
    if (d == mark_->draft()) return;
    emit draftEdited(mark_->id, d);
}

}  // namespace earmark::widgets
