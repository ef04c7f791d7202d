#include "earmark/widgets/word_score_look.hpp"

#include <QCoreApplication>

namespace earmark::widgets {

QColor wordScoreColour(WordScoreClass c) {
    switch (c) {
        case WordScoreClass::Good: return QColor(0, 114, 178);     // blue
        case WordScoreClass::Doubtful: return QColor(230, 159, 0); // amber
        case WordScoreClass::Poor: return QColor(213, 94, 0);      // vermilion
        case WordScoreClass::Unspoken: return QColor(213, 94, 0);  // vermilion, cross-hatched
    }
    return Qt::gray;
}

int wordScoreStripPixels(WordScoreClass c) {
    switch (c) {
        case WordScoreClass::Good: return 2;
        case WordScoreClass::Doubtful: return 4;
        case WordScoreClass::Poor: return 6;
        case WordScoreClass::Unspoken: return 6;
    }
    return 2;
}

QString wordScoreLegend(const ScoreBands& bands) {
    auto swatch = [](WordScoreClass c, const QString& text) {
        return QStringLiteral("<span style='color:%1'>&#9644;</span>&nbsp;%2").arg(wordScoreColour(c).name(), text);
    };
    const auto tr = [](const char* s) { return QCoreApplication::translate("WordScore", s); };
    return QStringList{swatch(WordScoreClass::Good, tr("good (≥ %1)").arg(bands.doubtfulBelow, 0, 'f', 1)),
                       swatch(WordScoreClass::Doubtful, tr("doubtful")),
                       swatch(WordScoreClass::Poor, tr("poor (&lt; %1 nats/frame)").arg(bands.poorBelow, 0, 'f', 1)),
                       swatch(WordScoreClass::Unspoken, tr("cross-hatched: not said as written")),
                       tr("dotted top line: phones guessed")}
        .join(QStringLiteral("<br>"));
}

}  // namespace earmark::widgets
