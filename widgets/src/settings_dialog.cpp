#include "earmark/widgets/settings_dialog.hpp"

#include "earmark/core/error.hpp"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QDoubleSpinBox>
#include <QFormLayout>
#include <QLabel>
#include <QPushButton>
#include <QSpinBox>
#include <QVBoxLayout>

namespace earmark::widgets {

namespace {

QDoubleSpinBox* spin(double lo, double hi, double value, int decimals, const QString& suffix, QWidget* parent) {
    auto* s = new QDoubleSpinBox(parent);
    s->setRange(lo, hi);
    s->setDecimals(decimals);
    s->setValue(value);
    s->setSuffix(suffix);
    return s;
}

}  // namespace

SettingsDialog::SettingsDialog(const AnalysisSettings& s, QWidget* parent) : QDialog(parent) {
    setWindowTitle(tr("Analysis settings"));
    auto* layout = new QVBoxLayout(this);
    auto* form = new QFormLayout;
    layout->addLayout(form);
    f0Min_ = spin(20, 1000, s.f0MinHz, 0, tr(" Hz"), this);
    f0Max_ = spin(40, 2000, s.f0MaxHz, 0, tr(" Hz"), this);
    hopMs_ = spin(1, 50, s.hopMs, 1, tr(" ms"), this);
    fftSize_ = new QComboBox(this);
    for (int n : {128, 256, 512, 1024, 2048, 4096}) fftSize_->addItem(QString::number(n), n);
    fftSize_->setCurrentIndex(std::max(0, fftSize_->findData(s.fftSize)));
    melBands_ = new QSpinBox(this);
    melBands_->setRange(8, 256);
    melBands_->setValue(s.melBands);
    melFmin_ = spin(0, 20000, s.melFminHz, 0, tr(" Hz"), this);
    melFmax_ = spin(500, 48000, s.melFmaxHz, 0, tr(" Hz"), this);
    melScale_ = new QComboBox(this);
    melScale_->addItem(tr("Slaney (linear below 1 kHz)"), static_cast<int>(MelScale::Slaney));
    melScale_->addItem(tr("HTK (2595·log10(1 + f/700))"), static_cast<int>(MelScale::Htk));
    melScale_->setCurrentIndex(s.melScale == MelScale::Htk ? 1 : 0);

    form->addRow(tr("Lowest F0"), f0Min_);
    form->addRow(tr("Highest F0"), f0Max_);
    form->addRow(tr("Frame step (hop)"), hopMs_);
    form->addRow(tr("FFT size (spectrograms)"), fftSize_);
    form->addRow(tr("Mel bands"), melBands_);
    form->addRow(tr("Mel lowest frequency"), melFmin_);
    form->addRow(tr("Mel highest frequency"), melFmax_);
    form->addRow(tr("Mel scale"), melScale_);
    auto* note = new QLabel(tr("The mel highest frequency is cut to half the sample rate of each take. "
                               "Changing a setting analyses the take again."),
                            this);
    note->setWordWrap(true);
    layout->addWidget(note);
    problem_ = new QLabel(this);
    problem_->setStyleSheet("color: #c0392b");
    layout->addWidget(problem_);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel | QDialogButtonBox::RestoreDefaults, this);
    layout->addWidget(buttons);
    ok_ = buttons->button(QDialogButtonBox::Ok);
    connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    connect(buttons->button(QDialogButtonBox::RestoreDefaults), &QPushButton::clicked, this, [this] {
        const AnalysisSettings d;
        f0Min_->setValue(d.f0MinHz);
        f0Max_->setValue(d.f0MaxHz);
        hopMs_->setValue(d.hopMs);
        fftSize_->setCurrentIndex(fftSize_->findData(d.fftSize));
        melBands_->setValue(d.melBands);
        melFmin_->setValue(d.melFminHz);
        melFmax_->setValue(d.melFmaxHz);
        melScale_->setCurrentIndex(0);
    });
    for (QDoubleSpinBox* b : {f0Min_, f0Max_, hopMs_, melFmin_, melFmax_})
        connect(b, &QDoubleSpinBox::valueChanged, this, &SettingsDialog::checkValues);
    checkValues();
}

AnalysisSettings SettingsDialog::settings() const {
    AnalysisSettings s;
    s.f0MinHz = f0Min_->value();
    s.f0MaxHz = f0Max_->value();
    s.hopMs = hopMs_->value();
    s.fftSize = fftSize_->currentData().toInt();
    s.melBands = melBands_->value();
    s.melFminHz = melFmin_->value();
    s.melFmaxHz = melFmax_->value();
    s.melScale = static_cast<MelScale>(melScale_->currentData().toInt());
    return s;
}

void SettingsDialog::checkValues() {
    try {
        settings().validate();
        problem_->clear();
        ok_->setEnabled(true);
    } catch (const Error& e) {
        problem_->setText(QString::fromStdString(e.problem()));
        ok_->setEnabled(false);
    }
}

}  // namespace earmark::widgets
