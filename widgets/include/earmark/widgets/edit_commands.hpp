// Undoable edits for the window's one QUndoStack, each with text people can
// read in the Edit menu ("Undo add intonation mark").
//
// MarkCommand wraps a MarkEdit the session has already made: pushing it does
// not repeat the edit; undo reverts it and redo applies it again through the
// SessionDocument (which refuses, and reports, when the mark was changed
// elsewhere in the meantime).
//
// TierCommand holds the whole tier set before and after, and an `apply`
// function that shows and stores a set (the window writes it to the session
// or keeps it for File > Save timings). Pushing it applies `after`.
#pragma once

#include "earmark/store/mark_edit.hpp"
#include "earmark/tiers/tier.hpp"

#include <QPointer>
#include <QUndoCommand>

#include <functional>

namespace earmark::widgets {

class SessionDocument;

// "add intonation mark", "edit timing mark", "delete artifact mark".
QString describeMarkEdit(const MarkEdit& edit);

class MarkCommand : public QUndoCommand {
public:
    MarkCommand(SessionDocument* document, MarkEdit edit);
    void undo() override;
    void redo() override;
    const MarkEdit& edit() const { return edit_; }

private:
    QPointer<SessionDocument> document_;
    MarkEdit edit_;
    bool done_ = true;  // the session made the edit before the push
};

class TierCommand : public QUndoCommand {
public:
    using Apply = std::function<void(const TierSet&)>;
    TierCommand(const QString& text, TierSet before, TierSet after, Apply apply);
    void undo() override { apply_(before_); }
    void redo() override { apply_(after_); }

private:
    TierSet before_, after_;
    Apply apply_;
};

}  // namespace earmark::widgets
