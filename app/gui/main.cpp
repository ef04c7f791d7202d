// earmark [AUDIO… | TAKES.csv | SESSION.earmark] [--take KEY] [--voice VOICE] [--screenshot PATH [--size WxH]]
//         [--view START:END] [--select START:END] [--timings FILE] [--speed RATE] [--loop] [--predicted-mel FILE.npy]
//         [--attention FILE.npy --tokens FILE]
// earmark SESSION.earmark --rate TEST [--rater NAME] [--screenshot PATH [--size WxH]]
// earmark --compare A B [--text "…" | --words-a FILE --words-b FILE] [--screenshot PATH [--size WxH]]
//
// --compare opens the compare window on two takes of the same text (words
// from the timings files, else aligned from the text, else frame-wise only).
// --predicted-mel shows a model's predicted mel of the (first) take and its
// difference from the take's own mel; --attention a model's attention matrix
// of it with its input tokens. With --screenshot the picture waits for them.
//
// A `.earmark` argument opens that review session (its queue, tiers, marks
// and suspects); --take shows one of its takes first (id, line id or file name),
// and --select on the span of one of its marks selects that mark. --speed
// sets the playback speed (0.25–2, pitch kept) the window starts with, and
// --loop starts it with the selection repeating.
//
// With --screenshot the window loads the first take, waits for its analysis,
// writes the window to PATH as PNG and exits: 0 on success, 1 when the take
// could not be shown or the image not written, 2 for bad arguments.
#include "main_window.hpp"

#include "earmark/store/session_address.hpp"
#include "earmark/widgets/audio_player.hpp"
#include "earmark/widgets/compare_window.hpp"
#include "earmark/widgets/rating_window.hpp"

#include "earmark/widgets/quiet_terminal.hpp"
#include "earmark/widgets/take_list.hpp"

#include <QApplication>
#include <QCommandLineParser>
#include <QRegularExpression>
#include <QSettings>
#include <QTemporaryDir>
#include <QTimer>

#include <cstdio>
#include <memory>

namespace {

int fail(const QString& message, int code) {
    std::fprintf(stderr, "earmark: %s\n", qPrintable(message));
    return code;
}

}  // namespace

int main(int argc, char** argv) {
    earmark::widgets::keepTerminalClean();  // before QApplication: its start-up notices too
    QApplication app(argc, argv);
    QApplication::setOrganizationName(QStringLiteral("Earmark"));
    QApplication::setApplicationName(QStringLiteral("earmark"));
    QApplication::setApplicationVersion(QStringLiteral("0.1.0"));
    QApplication::setDesktopFileName(QStringLiteral("earmark"));

    QCommandLineParser parser;
    parser.setApplicationDescription(QStringLiteral("Earmark: look at, listen to and measure speech takes."));
    parser.addHelpOption();
    parser.addVersionOption();
    parser.addPositionalArgument(QStringLiteral("takes"),
                                 QStringLiteral("Audio files, a CSV take list (id,audio,text,…), or a review session (.earmark)."),
                                 QStringLiteral("[AUDIO… | TAKES.csv | SESSION.earmark]"));
    const QCommandLineOption takeOption(QStringLiteral("take"),
                                        QStringLiteral("With a session: the take to show first (its id, line id or file name)."),
                                        QStringLiteral("KEY"));
    const QCommandLineOption screenshot(QStringLiteral("screenshot"),
                                        QStringLiteral("Render the window to PATH (PNG) once the take is analysed, then exit."),
                                        QStringLiteral("PATH"));
    const QCommandLineOption size(QStringLiteral("size"), QStringLiteral("Window size for --screenshot (default 1600x900)."),
                                  QStringLiteral("WxH"), QStringLiteral("1600x900"));
    const QCommandLineOption view(QStringLiteral("view"), QStringLiteral("Visible range in seconds, e.g. 0.5:1.75."),
                                  QStringLiteral("START:END"));
    const QCommandLineOption select(QStringLiteral("select"), QStringLiteral("Selection in seconds, e.g. 1.2:1.6."),
                                    QStringLiteral("START:END"));
    const QCommandLineOption speed(QStringLiteral("speed"),
                                   QStringLiteral("Playback speed to start with, 0.25 to 2 (1 = as recorded; the pitch is kept)."),
                                   QStringLiteral("RATE"));
    const QCommandLineOption loop(QStringLiteral("loop"), QStringLiteral("Start with the loop on (playing the selection repeats it)."));
    const QCommandLineOption predictedMel(QStringLiteral("predicted-mel"),
                                          QStringLiteral("A model's predicted mel spectrogram (.npy) of the take, shown with its difference from the take's own mel."),
                                          QStringLiteral("FILE.npy"));
    const QCommandLineOption attention(QStringLiteral("attention"),
                                       QStringLiteral("A model's attention matrix (.npy, frames × tokens) of the take; needs --tokens."),
                                       QStringLiteral("FILE.npy"));
    const QCommandLineOption tokens(QStringLiteral("tokens"),
                                    QStringLiteral("The attention matrix's input tokens: one per line, or a JSON array of strings."),
                                    QStringLiteral("FILE"));
    const QCommandLineOption compare(QStringLiteral("compare"),
                                     QStringLiteral("Compare two takes of the same text, given as the two arguments A B."));
    const QCommandLineOption text(QStringLiteral("text"), QStringLiteral("With --compare: the script, to align words from."),
                                  QStringLiteral("TEXT"));
    const QCommandLineOption wordsA(QStringLiteral("words-a"), QStringLiteral("With --compare: word timings of take A."),
                                    QStringLiteral("FILE"));
    const QCommandLineOption wordsB(QStringLiteral("words-b"), QStringLiteral("With --compare: word timings of take B."),
                                    QStringLiteral("FILE"));
    const QCommandLineOption rate(QStringLiteral("rate"),
                                  QStringLiteral("With a session: rate its listening test TEST in the full-window rating mode."),
                                  QStringLiteral("TEST"));
    const QCommandLineOption rater(QStringLiteral("rater"), QStringLiteral("With --rate: start (or resume) as this rater."),
                                   QStringLiteral("NAME"));
    const QCommandLineOption timings(QStringLiteral("timings"),
                                     QStringLiteral("Timings of the (first) take to open with it (.json, .csv, .vtt), e.g. the "
                                                    "paragraph and sentence tiers of `earmark-cli longform --tiers`."),
                                     QStringLiteral("FILE"));
    const QCommandLineOption voice(QStringLiteral("voice"),
                                   QStringLiteral("espeak-ng voice the texts are read in (default en-us); word evidence "
                                                  "is shown when the acoustic model covers it."),
                                   QStringLiteral("VOICE"));
    parser.addOptions({voice, timings, screenshot, size, view, select, speed, loop, takeOption, predictedMel, attention, tokens, compare, text, wordsA, wordsB,
                       rate, rater});
    parser.process(app);

    const QRegularExpression sizeRe(QStringLiteral("^(\\d+)x(\\d+)$"));
    const auto sizeMatch = sizeRe.match(parser.value(size));
    if (!sizeMatch.hasMatch()) return fail(QStringLiteral("--size wants WxH, e.g. 1600x900"), 2);
    const QSize windowSize(sizeMatch.captured(1).toInt(), sizeMatch.captured(2).toInt());
    if (windowSize.width() < 200 || windowSize.height() < 150 || windowSize.width() > 10000 || windowSize.height() > 10000)
        return fail(QStringLiteral("--size must be between 200x150 and 10000x10000"), 2);

    auto parseSpan = [&](const QCommandLineOption& option) -> std::optional<earmark::widgets::TimeRange> {
        const QStringList parts = parser.value(option).split(':');
        bool ok1 = false, ok2 = false;
        const double a = parts.value(0).toDouble(&ok1), b = parts.value(1).toDouble(&ok2);
        if (parts.size() != 2 || !ok1 || !ok2 || !(b > a) || a < 0) return std::nullopt;
        return earmark::widgets::TimeRange{a, b};
    };
    std::optional<earmark::widgets::TimeRange> range, selection;
    if (parser.isSet(view) && !(range = parseSpan(view)))
        return fail(QStringLiteral("--view wants START:END in seconds with END > START >= 0"), 2);
    if (parser.isSet(select) && !(selection = parseSpan(select)))
        return fail(QStringLiteral("--select wants START:END in seconds with END > START >= 0"), 2);

    double startSpeed = 1.0;
    if (parser.isSet(speed)) {
        bool ok = false;
        startSpeed = parser.value(speed).toDouble(&ok);
        if (!ok || !(startSpeed >= 0.25 && startSpeed <= 2.0)) return fail(QStringLiteral("--speed wants a number from 0.25 to 2"), 2);
    }

    if (parser.isSet(attention) != parser.isSet(tokens))
        return fail(QStringLiteral("--attention and --tokens go together"), 2);

    const QStringList arguments = parser.positionalArguments();
    if (parser.isSet(compare)) {
        if (arguments.size() != 2) return fail(QStringLiteral("--compare wants two takes: A B"), 2);
        earmark::widgets::TakePairRequest request{arguments[0], arguments[1], parser.value(text), parser.value(wordsA),
                                                  parser.value(wordsB)};
        QTemporaryDir compareSettings;
        earmark::widgets::CompareWindow window;
        int exitCode = 0;
        if (parser.isSet(screenshot)) {
            const QString path = parser.value(screenshot);
            QObject::connect(&window, &earmark::widgets::CompareWindow::pairSettled, &app, [&, path](bool ok, const QString& message) {
                if (!ok) fail(message, 1);
                QTimer::singleShot(50, &app, [&, path, ok] {
                    exitCode = window.grab().save(path, "PNG") && ok ? 0 : 1;
                    window.close();
                    app.quit();
                });
            });
        }
        window.resize(windowSize);
        window.show();
        window.open(request);
        const int code = app.exec();
        return parser.isSet(screenshot) ? exitCode : code;
    }
    QString sessionPath;
    // A session file, or a team session on a server (docs/team-sessions.md).
    if (arguments.size() == 1 && (arguments.front().endsWith(QStringLiteral(".earmark"), Qt::CaseInsensitive) ||
                                  earmark::isServerSession(arguments.front().toStdString())))
        sessionPath = arguments.front();
    if (parser.isSet(takeOption) && sessionPath.isEmpty()) return fail(QStringLiteral("--take needs a session (.earmark)"), 2);
    if (parser.isSet(rate)) {
        if (sessionPath.isEmpty()) return fail(QStringLiteral("--rate needs a session (.earmark)"), 2);
        std::unique_ptr<earmark::widgets::RatingWindow> rating;
        try {
            rating = std::make_unique<earmark::widgets::RatingWindow>(sessionPath, parser.value(rate));
        } catch (const std::exception& e) {
            return fail(QString::fromLocal8Bit(e.what()), 3);
        }
        rating->resize(windowSize);
        rating->show();
        if (parser.isSet(rater) && !rating->begin(parser.value(rater)) && parser.isSet(screenshot))
            return fail(rating->statusText(), 3);
        if (!parser.isSet(screenshot)) return app.exec();
        int shotCode = 0;
        QTimer::singleShot(100, &app, [&] {
            shotCode = rating->grab().save(parser.value(screenshot), "PNG") ? 0 : 1;
            app.quit();
        });
        app.exec();
        return shotCode;
    }
    std::vector<earmark::widgets::TakeEntry> takes;
    try {
        if (sessionPath.isEmpty()) takes = earmark::widgets::takesFromArguments(arguments);
    } catch (const std::exception& e) {
        return fail(QString::fromLocal8Bit(e.what()), 1);
    }

    const bool shooting = parser.isSet(screenshot);
    // Screenshots do not depend on (or change) the user's saved settings.
    QTemporaryDir settingsDir;
    if (shooting) {
        if (takes.empty() && sessionPath.isEmpty()) return fail(QStringLiteral("--screenshot needs a take to show"), 2);
        QSettings::setDefaultFormat(QSettings::IniFormat);
        QSettings::setPath(QSettings::IniFormat, QSettings::UserScope, settingsDir.path());
    }

    earmark::gui::MainWindow window;
    if (parser.isSet(voice)) window.setVoice(parser.value(voice));
    if (range || selection) window.setInitialView(range, selection);
    if (parser.isSet(timings)) window.setInitialTimings(parser.value(timings));
    window.player()->setRate(startSpeed);
    if (parser.isSet(loop)) window.player()->setLooping(true);
    int exitCode = 0;
    if (shooting) {
        const QString path = parser.value(screenshot);
        // Shoot once the take and (when asked for) the predicted mel have settled.
        // Word evidence always settles once the take's audio is in (shown, or not to be had).
        // So does the long-take review (immediately for a take that is not long).
        auto pending = std::make_shared<int>(3 + parser.isSet(predictedMel) + parser.isSet(attention));
        auto allOk = std::make_shared<bool>(true);
        auto settle = [&, path, pending, allOk](bool ok, const QString& message) {
            if (*pending <= 0) return;  // already shot
            *allOk = *allOk && ok;
            if (!ok) {
                fail(message, 1);
                *pending = 1;  // a failure ends the wait: nothing more will come
            }
            if (--*pending > 0) return;
            // Let queued plot replots and layout run before grabbing.
            QTimer::singleShot(50, &app, [&, path, ok = *allOk] {
                if (!window.grab().save(path, "PNG")) {
                    fail(QStringLiteral("%1: cannot write the image").arg(path), 1);
                    exitCode = 1;
                } else {
                    exitCode = ok ? 0 : 1;
                }
                window.close();
                app.quit();
            });
        };
        QObject::connect(&window, &earmark::gui::MainWindow::takeSettled, &app, settle);
        QObject::connect(&window, &earmark::gui::MainWindow::modelSettled, &app, settle);
        // No evidence (no text, a voice the model does not cover) is not a failure of the picture.
        QObject::connect(&window, &earmark::gui::MainWindow::evidenceSettled, &app,
                         [settle](bool, const QString&) { settle(true, {}); });
        QObject::connect(&window, &earmark::gui::MainWindow::longformSettled, &app, settle);
        window.resize(windowSize);
    }
    window.show();
    if (shooting) window.resize(windowSize);
    if (!sessionPath.isEmpty()) {
        if (!window.openSession(sessionPath)) {
            if (shooting) return fail(QStringLiteral("%1: cannot open the session")
                                            .arg(QString::fromStdString(
                                                earmark::shownSessionAddress(sessionPath.toStdString()))),
                                        1);
        } else if (parser.isSet(takeOption) && !window.showSessionTake(parser.value(takeOption))) {
            return fail(QStringLiteral("%1: no take '%2' in the session").arg(sessionPath, parser.value(takeOption)), 2);
        }
    } else {
        window.openTakes(takes);
    }
    if (parser.isSet(predictedMel)) window.openPredictedMel(parser.value(predictedMel));
    if (parser.isSet(attention)) window.openAttention(parser.value(attention), parser.value(tokens));
    const int code = app.exec();
    return shooting ? exitCode : code;
}
