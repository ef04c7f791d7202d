#include "earmark/widgets/model_attention.hpp"

#include "earmark/model/attention.hpp"

#include <QObject>
#include <QStringList>

#include <algorithm>
#include <cmath>

namespace earmark::widgets {

ModelAttentionPtr loadModelAttention(const QString& npyPath, const QString& tokensPath, const AttentionParams& params) {
    auto out = std::make_shared<ModelAttention>();
    out->path = npyPath;
    out->tokensPath = tokensPath;
    out->labels = readTokenList(tokensPath.toStdString());
    const AttentionMatrix m = readAttentionNpy(npyPath.toStdString(), static_cast<int>(out->labels.size()));
    out->alignment = alignAttention(m, out->labels, params);
    out->hopSeconds = params.hopSeconds();
    out->frames = m.frames;
    out->tokens = m.tokens;
    out->image = QImage(m.frames, m.tokens, QImage::Format_Indexed8);
    for (int k = 0; k < m.tokens; ++k) {
        uchar* row = out->image.scanLine(k);
        for (int f = 0; f < m.frames; ++f)
            row[f] = static_cast<uchar>(std::lround(255.0 * std::clamp(static_cast<double>(m.at(f, k)), 0.0, 1.0)));
    }
    return out;
}

std::vector<const AttentionEvent*> ModelAttention::faultsAt(double t, double slackS) const {
    std::vector<const AttentionEvent*> out;
    for (const AttentionEvent& e : alignment.faults) {
        const double slack = e.kind == AttentionFault::Skip ? slackS : 0.0;
        if (t >= e.startS - slack && t <= e.endS + slack) out.push_back(&e);
    }
    return out;
}

QString ModelAttention::describe(const AttentionEvent& e) const {
    auto words = [this](int first, int last) {
        QStringList w;
        for (int k = first; k <= last && k < static_cast<int>(labels.size()); ++k)
            w << QString::fromStdString(labels[static_cast<std::size_t>(k)]);
        return QStringLiteral("“%1”").arg(w.join(' '));
    };
    if (e.kind == AttentionFault::Skip)
        return QObject::tr("skip of %1 (token %2) at %3 s")
            .arg(words(e.firstToken, e.lastToken))
            .arg(e.firstToken == e.lastToken ? QString::number(e.firstToken)
                                             : QStringLiteral("%1–%2").arg(e.firstToken).arg(e.lastToken))
            .arg(e.startS, 0, 'f', 3);
    return QObject::tr("repeat of %1 at %2–%3 s (frames %4–%5)")
        .arg(words(e.firstToken, e.lastToken))
        .arg(e.startS, 0, 'f', 3)
        .arg(e.endS, 0, 'f', 3)
        .arg(e.firstFrame)
        .arg(e.lastFrame);
}

}  // namespace earmark::widgets
