// "Align from text": the person types or pastes the words spoken in the take
// (prefilled with the take's script line) and picks an espeak-ng voice; the
// alignment (earmark/align/text_aligner.hpp) runs off the UI thread and its
// word and phone tiers come back through `aligned`.
//
// Thread-safety: GUI thread only; the job copies what it needs. A newer
// request, close() or the destructor cancels the running job (its result is
// dropped).
#pragma once

#include "earmark/align/text_aligner.hpp"
#include "earmark/widgets/take_data.hpp"

#include <QDialog>
#include <QFutureWatcher>

#include <atomic>
#include <memory>

class QComboBox;
class QLabel;
class QPlainTextEdit;
class QPushButton;

namespace earmark::widgets {

struct AlignOutcome {
    AlignResult result;
    QString error;  // non-empty when the alignment failed
};

class AlignDialog : public QDialog {
    Q_OBJECT
public:
    explicit AlignDialog(QWidget* parent = nullptr);
    ~AlignDialog() override;

    // Shows the dialog for a take, with its script line as the text.
    void begin(TakeAudioPtr audio, const QString& text);
    // Starts the job with the text and voice shown (also the Align button).
    void start();
    bool running() const;
    QPlainTextEdit* textEdit() const { return text_; }
    QComboBox* voiceBox() const { return voice_; }

signals:
    void aligned(const QString& audioPath, const earmark::AlignResult& result);
    void failed(const QString& message);

protected:
    void done(int result) override;

private:
    void finished();
    void cancelJob();

    TakeAudioPtr audio_;
    QPlainTextEdit* text_ = nullptr;
    QComboBox* voice_ = nullptr;
    QLabel* status_ = nullptr;
    QPushButton* run_ = nullptr;
    std::unique_ptr<QFutureWatcher<AlignOutcome>> watcher_;
    std::shared_ptr<std::atomic<bool>> stop_;
};

}  // namespace earmark::widgets

Q_DECLARE_METATYPE(earmark::AlignResult)
