#include "NearestFolder.h"

#include <QDir>
#include <QFileInfo>

namespace sagline {

QString nearestExistingFolder(const QString &folder)
{
    QString at = folder.isEmpty() ? QString() : QFileInfo(folder).absoluteFilePath();
    while (!at.isEmpty() && !QFileInfo(at).isDir()) {
        const QString parent = QFileInfo(at).absolutePath();
        if (parent == at)
            break;
        at = parent;
    }
    return !at.isEmpty() && QFileInfo(at).isDir() ? at : QDir::homePath();
}

} // namespace sagline
