#include "earmark/widgets/edit_commands.hpp"

#include "earmark/widgets/session_document.hpp"

namespace earmark::widgets {

QString describeMarkEdit(const MarkEdit& edit) {
    const Mark& m = edit.after ? *edit.after : *edit.before;
    const QString category = QString::fromUtf8(categoryName(m.category).data(),
                                               static_cast<qsizetype>(categoryName(m.category).size()));
    if (!edit.before) return QObject::tr("add %1 mark").arg(category);
    if (!edit.after) return QObject::tr("delete %1 mark").arg(category);
    if (edit.before->startSeconds != edit.after->startSeconds || edit.before->endSeconds != edit.after->endSeconds)
        return QObject::tr("move %1 mark").arg(category);
    return QObject::tr("edit %1 mark").arg(category);
}

MarkCommand::MarkCommand(SessionDocument* document, MarkEdit edit)
    : QUndoCommand(describeMarkEdit(edit)), document_(document), edit_(std::move(edit)) {}

void MarkCommand::undo() {
    if (document_) document_->revertEdit(edit_);
    done_ = false;
}

void MarkCommand::redo() {
    if (done_) return;  // first push: already in the session
    if (document_) document_->applyEdit(edit_);
    done_ = true;
}

TierCommand::TierCommand(const QString& text, TierSet before, TierSet after, Apply apply)
    : QUndoCommand(text), before_(std::move(before)), after_(std::move(after)), apply_(std::move(apply)) {}

}  // namespace earmark::widgets
