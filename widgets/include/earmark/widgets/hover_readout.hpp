// The status-bar read-out of what is under the pointer: time, F0 and energy
// at that time (looked up in the take's tracks), and whatever the lane under
// the pointer adds (frequency and level in the spectrogram).
#pragma once

#include "earmark/widgets/take_data.hpp"
#include "earmark/widgets/view_state.hpp"

#include <QLabel>

namespace earmark::widgets {

class HoverReadout : public QLabel {
    Q_OBJECT
public:
    explicit HoverReadout(ViewState* view, QWidget* parent = nullptr);
    void setTracks(TakeTracksPtr tracks);
    void setLaneDetail(const QString& text);

    // The text for a time (exposed for tests).
    QString textFor(std::optional<double> time) const;

private:
    void refresh();

    ViewState* view_;
    TakeTracksPtr tracks_;
    QString laneDetail_;
};

}  // namespace earmark::widgets
