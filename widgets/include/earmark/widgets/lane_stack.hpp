// The stack of lanes on one time axis: fixed strips on top (overview, time
// ruler), resizable lanes in a vertical splitter below, and a horizontal
// scrollbar. One ViewState drives them all; the scrollbar follows it with a
// guard so that its own updates do not echo back.
//
// Adding a lane = writing one Lane subclass and calling addLane(). Visibility
// and heights persist in QSettings (group "lanes", keyed by lane id).
#pragma once

#include "earmark/widgets/lane.hpp"

#include <QWidget>

#include <vector>

class QScrollBar;
class QSplitter;
class QVBoxLayout;
class QSettings;

namespace earmark::widgets {

class LaneStack : public QWidget {
    Q_OBJECT
public:
    enum class Placement {
        Fixed,      // fixed height strip above the resizable lanes
        Resizable,  // in the splitter; the user drags its lower edge
    };

    explicit LaneStack(ViewState* view, QWidget* parent = nullptr);

    // Takes ownership (Qt parent). `stretch` shares spare height among resizable lanes.
    void addLane(Lane* lane, Placement placement, int stretch = 1);

    const std::vector<Lane*>& lanes() const { return lanes_; }
    Lane* lane(const QString& id) const;
    void setLaneVisible(const QString& id, bool visible);
    bool isLaneVisible(const QString& id) const;

    void setTake(TakeAudioPtr audio);
    void setTracks(TakeTracksPtr tracks);

    void saveLayout(QSettings& settings) const;
    void restoreLayout(QSettings& settings);

    ViewState* view() const { return view_; }

signals:
    void pointDescribed(const QString& text);
    void laneVisibilityChanged(const QString& id, bool visible);

private:
    void syncScrollBar();
    void onScrollBar(int value);

    ViewState* view_;
    std::vector<Lane*> lanes_;
    QVBoxLayout* fixedLayout_ = nullptr;
    QSplitter* splitter_ = nullptr;
    QScrollBar* scrollBar_ = nullptr;
    bool syncing_ = false;  // true while the scrollbar is being set from the view
};

}  // namespace earmark::widgets
