#include "earmark/widgets/take_list.hpp"

#include "earmark/core/error.hpp"

#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QTextStream>

namespace earmark::widgets {

QStringList splitCsvLine(const QString& line) {
    QStringList fields;
    QString field;
    bool quoted = false;
    for (qsizetype i = 0; i < line.size(); ++i) {
        const QChar ch = line[i];
        if (quoted) {
            if (ch == '"' && i + 1 < line.size() && line[i + 1] == '"') {
                field += '"';
                ++i;
            } else if (ch == '"') {
                quoted = false;
            } else {
                field += ch;
            }
        } else if (ch == '"') {
            quoted = true;
        } else if (ch == ',') {
            fields << field;
            field.clear();
        } else if (ch != '\r') {
            field += ch;
        }
    }
    fields << field;
    return fields;
}

std::vector<TakeEntry> readTakeList(const QString& csvPath) {
    QFile file(csvPath);
    if (!file.open(QIODevice::ReadOnly | QIODevice::Text))
        throw InputError(csvPath.toStdString(), "cannot open the take list");
    QTextStream in(&file);
    const QStringList header = splitCsvLine(in.readLine().trimmed());
    const auto audioCol = header.indexOf("audio");
    const auto idCol = header.indexOf("id");
    const auto textCol = header.indexOf("text");
    if (audioCol < 0) throw InputError(csvPath.toStdString(), "take list has no 'audio' column");
    const QDir base = QFileInfo(csvPath).absoluteDir();
    std::vector<TakeEntry> out;
    while (!in.atEnd()) {
        const QString line = in.readLine();
        if (line.trimmed().isEmpty()) continue;
        const QStringList f = splitCsvLine(line);
        if (f.size() <= audioCol || f[audioCol].isEmpty()) continue;
        TakeEntry e;
        e.audio = QDir::cleanPath(base.absoluteFilePath(f[audioCol]));
        e.id = idCol >= 0 && idCol < f.size() && !f[idCol].isEmpty() ? f[idCol] : QFileInfo(e.audio).completeBaseName();
        if (textCol >= 0 && textCol < f.size()) e.text = f[textCol];
        out.push_back(e);
    }
    return out;
}

std::vector<TakeEntry> takesFromArguments(const QStringList& arguments) {
    std::vector<TakeEntry> out;
    for (const QString& a : arguments) {
        if (a.endsWith(".csv", Qt::CaseInsensitive)) {
            auto list = readTakeList(a);
            out.insert(out.end(), list.begin(), list.end());
        } else {
            const QFileInfo info(a);
            out.push_back({info.completeBaseName(), info.absoluteFilePath(), {}});
        }
    }
    return out;
}

}  // namespace earmark::widgets
