#include "earmark/widgets/align_dialog.hpp"

#include "earmark/core/error.hpp"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QFormLayout>
#include <QLabel>
#include <QPlainTextEdit>
#include <QPushButton>
#include <QVBoxLayout>
#include <QtConcurrent/QtConcurrent>

namespace earmark::widgets {

AlignDialog::AlignDialog(QWidget* parent) : QDialog(parent) {
    setObjectName("alignDialog");
    setWindowTitle(tr("Align words from text"));
    auto* layout = new QVBoxLayout(this);
    layout->addWidget(new QLabel(tr("The words spoken in this take:"), this));
    text_ = new QPlainTextEdit(this);
    text_->setTabChangesFocus(true);
    layout->addWidget(text_, 1);
    auto* form = new QFormLayout;
    voice_ = new QComboBox(this);
    voice_->setEditable(true);  // any espeak-ng voice name or language tag
    voice_->addItems({"en-us", "en-gb", "en-gb-x-rp", "de", "fr", "es", "it", "nl"});
    voice_->setToolTip(tr("The espeak-ng voice whose reading is warped onto the take"));
    form->addRow(tr("reference voice"), voice_);
    layout->addLayout(form);
    status_ = new QLabel(this);
    status_->setWordWrap(true);
    layout->addWidget(status_);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Cancel, this);
    run_ = buttons->addButton(tr("Align"), QDialogButtonBox::AcceptRole);
    run_->setDefault(true);
    layout->addWidget(buttons);
    disconnect(buttons, nullptr, this, nullptr);
    connect(run_, &QPushButton::clicked, this, [this] { start(); });
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    resize(520, 260);
}

AlignDialog::~AlignDialog() {
    cancelJob();
}

void AlignDialog::begin(TakeAudioPtr audio, const QString& text) {
    cancelJob();
    audio_ = std::move(audio);
    text_->setPlainText(text);
    status_->clear();
    run_->setEnabled(true);
    show();
    raise();
    activateWindow();
    text_->setFocus();
}

bool AlignDialog::running() const { return watcher_ && watcher_->isRunning(); }

void AlignDialog::cancelJob() {
    if (stop_) stop_->store(true);
    if (watcher_) {
        watcher_->disconnect(this);
        watcher_->waitForFinished();  // the aligner checks the flag often; this is short
        watcher_.reset();
    }
    stop_.reset();
}

void AlignDialog::start() {
    if (!audio_ || running()) return;
    const std::string text = text_->toPlainText().trimmed().toStdString();
    if (text.empty()) {
        status_->setText(tr("Type or paste the words first."));
        return;
    }
    AlignParams params;
    params.speech.voice = voice_->currentText().trimmed().toStdString();
    stop_ = std::make_shared<std::atomic<bool>>(false);
    auto stop = stop_;
    TakeAudioPtr audio = audio_;
    watcher_ = std::make_unique<QFutureWatcher<AlignOutcome>>();
    connect(watcher_.get(), &QFutureWatcher<AlignOutcome>::finished, this, &AlignDialog::finished);
    watcher_->setFuture(QtConcurrent::run([audio, text, params, stop]() {
        AlignOutcome out;
        try {
            out.result = alignText(audio->signal, text, params, Progress([stop](double) { return !stop->load(); }));
        } catch (const Cancelled&) {
            out.error = QObject::tr("stopped");
        } catch (const std::exception& e) {
            out.error = QString::fromStdString(e.what());
        }
        return out;
    }));
    run_->setEnabled(false);
    status_->setText(tr("Aligning… (the reference is read by espeak-ng and warped onto the take)"));
}

void AlignDialog::finished() {
    if (!watcher_) return;
    const AlignOutcome out = watcher_->result();
    watcher_.reset();
    stop_.reset();
    run_->setEnabled(true);
    if (!out.error.isEmpty()) {
        status_->setText(out.error);
        emit failed(out.error);
        return;
    }
    const QString path = audio_ ? audio_->path : QString();
    hide();
    emit aligned(path, out.result);
}

void AlignDialog::done(int result) {
    cancelJob();
    QDialog::done(result);
}

}  // namespace earmark::widgets
