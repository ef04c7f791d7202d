// How word pronunciation scores look in the window: one colour per score
// class, told apart by lightness as well as hue (blue, amber, vermilion
// stay distinct for the common colour-vision deficiencies; Okabe & Ito 2008,
// "Color Universal Design"), and by the strip's thickness, so the class
// never rests on colour alone.
#pragma once

#include "earmark/acoustic/evidence_review.hpp"

#include <QColor>
#include <QString>

namespace earmark::widgets {

QColor wordScoreColour(WordScoreClass c);
// Strip thickness under a word, px: grows as the score falls.
int wordScoreStripPixels(WordScoreClass c);
// The legend as one line of rich text (colour swatches and words).
QString wordScoreLegend(const ScoreBands& bands = {});

}  // namespace earmark::widgets
