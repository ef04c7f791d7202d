// Keeps a newcomer's terminal clean: Qt's own notices that the user can do
// nothing about (no sound server, no XDG runtime folder, the offscreen
// platform's limits) are dropped; every other message goes on as before.
// The window says "no audio device" itself when there is no sound output.
#pragma once

#include <QString>

namespace earmark::widgets {

// True for a framework notice that is dropped (matched by its fixed start).
bool isFrameworkNoise(const QString& message);

// Installs the filter in front of the current Qt message handler. Call once,
// first thing in main (before QApplication). Not thread-safe against other installers.
void keepTerminalClean();

}  // namespace earmark::widgets
