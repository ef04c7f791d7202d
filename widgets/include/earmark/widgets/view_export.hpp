// Writes a widget (the lane stack) to an image: PNG (at the screen's pixel
// ratio) or PDF (one page sized to the widget, vector where the lanes draw
// vectors). The format follows the file's suffix.
#pragma once

#include <QString>

class QWidget;

namespace earmark::widgets {

// Returns an empty string on success, else a message naming the file.
QString exportWidget(QWidget& widget, const QString& path);

}  // namespace earmark::widgets
