// A model's attention matrix of the current take, ready for the attention
// lane: the matrix as an image, the token tier of its monotonic path and the
// skip/repeat faults, all computed by the engine (model/attention.hpp,
// model/attention_alignment.hpp). Decoder frame f lasts [f·hop, (f+1)·hop)
// seconds, hop from AttentionParams (256 samples at 22 050 Hz by default).
//
// Thread-safety: loadModelAttention is reentrant.
#pragma once

#include "earmark/model/attention_alignment.hpp"

#include <QImage>
#include <QMetaType>
#include <QString>

#include <memory>
#include <string>
#include <vector>

namespace earmark::widgets {

struct ModelAttention {
    QString path, tokensPath;
    std::vector<std::string> labels;  // one per token
    AttentionAlignment alignment;     // path, token tier, argmax, faults
    double hopSeconds = 0.0;
    int frames = 0, tokens = 0;
    // Format_Indexed8, frames × tokens: column f is frame f, row k token k
    // (token 0 on top); index = round(255 · weight) with the weight clamped to 0…1.
    QImage image;

    // Faults whose span (a skip: its frame) contains time t (s); a skip is
    // widened to `slackS` either side so it can be pointed at.
    std::vector<const AttentionEvent*> faultsAt(double t, double slackS = 0.0) const;
    // "skip of "from" at 1.985 s" / "repeat of "half" at 3.669–3.762 s".
    QString describe(const AttentionEvent& e) const;
};
using ModelAttentionPtr = std::shared_ptr<const ModelAttention>;

// Reads the matrix and the token list and aligns them. Throws what
// readTokenList, readAttentionNpy and alignAttention throw.
ModelAttentionPtr loadModelAttention(const QString& npyPath, const QString& tokensPath,
                                     const AttentionParams& params = {});

}  // namespace earmark::widgets

Q_DECLARE_METATYPE(earmark::widgets::ModelAttentionPtr)
