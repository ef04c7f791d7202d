#include "earmark/widgets/quiet_terminal.hpp"

#include <QtGlobal>

#include <array>

namespace earmark::widgets {
namespace {

QtMessageHandler previousHandler = nullptr;

void filteredHandler(QtMsgType type, const QMessageLogContext& context, const QString& message) {
    if (type != QtFatalMsg && isFrameworkNoise(message)) return;
    if (previousHandler) previousHandler(type, context, message);
}

}  // namespace

bool isFrameworkNoise(const QString& message) {
    static const std::array<QString, 3> starts{
        QStringLiteral("PulseAudioService: pa_context_connect() failed"),   // no sound server
        QStringLiteral("QStandardPaths: XDG_RUNTIME_DIR not set"),           // Qt falls back by itself
        QStringLiteral("This plugin does not support propagateSizeHints()"),  // offscreen platform
    };
    for (const QString& start : starts)
        if (message.startsWith(start)) return true;
    return false;
}

void keepTerminalClean() { previousHandler = qInstallMessageHandler(filteredHandler); }

}  // namespace earmark::widgets
