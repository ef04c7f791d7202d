// The analysis settings dialog: F0 range, hop, FFT size, mel bands, mel
// frequency range and scale. Returns the edited settings; the window saves
// them and re-analyses.
#pragma once

#include "earmark/widgets/analysis_settings.hpp"

#include <QDialog>

class QComboBox;
class QDoubleSpinBox;
class QLabel;
class QSpinBox;

namespace earmark::widgets {

class SettingsDialog : public QDialog {
    Q_OBJECT
public:
    explicit SettingsDialog(const AnalysisSettings& settings, QWidget* parent = nullptr);
    AnalysisSettings settings() const;

private:
    void checkValues();

    QDoubleSpinBox* f0Min_;
    QDoubleSpinBox* f0Max_;
    QDoubleSpinBox* hopMs_;
    QComboBox* fftSize_;
    QSpinBox* melBands_;
    QDoubleSpinBox* melFmin_;
    QDoubleSpinBox* melFmax_;
    QComboBox* melScale_;
    QLabel* problem_;
    class QPushButton* ok_ = nullptr;
};

}  // namespace earmark::widgets
