#include "earmark/widgets/view_export.hpp"

#include <QCoreApplication>
#include <QFileInfo>
#include <QPageSize>
#include <QPainter>
#include <QPdfWriter>
#include <QPixmap>
#include <QWidget>

namespace earmark::widgets {

QString exportWidget(QWidget& widget, const QString& path) {
    const QString suffix = QFileInfo(path).suffix().toLower();
    if (suffix == "pdf") {
        QPdfWriter pdf(path);
        pdf.setCreator(QStringLiteral("Earmark"));
        pdf.setResolution(96);
        // One page the size of the widget: 1 px at 96 dpi = 0.75 pt.
        pdf.setPageSize(QPageSize(QSizeF(widget.width() * 0.75, widget.height() * 0.75), QPageSize::Point));
        pdf.setPageMargins(QMarginsF(0, 0, 0, 0));
        QPainter painter;
        if (!painter.begin(&pdf)) return QCoreApplication::translate("earmark", "%1: cannot write a PDF here").arg(path);
        const double scale = pdf.width() / static_cast<double>(widget.width());
        painter.scale(scale, scale);
        widget.render(&painter);
        painter.end();
        return {};
    }
    if (suffix != "png")
        return QCoreApplication::translate("earmark", "%1: choose a .png or .pdf file name").arg(path);
    const QPixmap image = widget.grab();
    if (!image.save(path, "PNG"))
        return QCoreApplication::translate("earmark", "%1: cannot write the image").arg(path);
    return {};
}

}  // namespace earmark::widgets
