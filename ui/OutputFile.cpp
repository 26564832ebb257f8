#include "OutputFile.h"

#include "AtomicFile.h"
#include "OutputTarget.h"

#include <QBuffer>
#include <QFile>
#include <QPdfWriter>

namespace sagline {

QString writeOutputFile(const QString &path, const QByteArray &bytes)
{
    const std::string name = QFile::encodeName(path).toStdString();
    if (const StoreStatus allowed = checkOutputPath(name, {}, true); !allowed.ok())
        return QString::fromStdString(allowed.message);
    const StoreStatus written =
        writeFileAtomically(name, std::string_view(bytes.constData(), static_cast<std::size_t>(bytes.size())));
    return written.ok() ? QString() : QString::fromStdString(written.message);
}

QString writePdfFile(const QString &pdfPath, const std::function<int(QPdfWriter &, int totalPages)> &render)
{
    // Refused before the work of laying it out.
    if (const StoreStatus allowed = checkOutputPath(QFile::encodeName(pdfPath).toStdString(), {}, true); !allowed.ok())
        return QString::fromStdString(allowed.message);
    int pages = 0;
    {
        QBuffer counting;
        counting.open(QIODevice::WriteOnly);
        QPdfWriter writer(&counting);
        pages = render(writer, 0);
    }
    if (pages == 0)
        return QStringLiteral("%1: cannot lay out the PDF; nothing was written").arg(pdfPath);
    QBuffer document;
    document.open(QIODevice::WriteOnly);
    {
        QPdfWriter writer(&document);
        if (render(writer, pages) != pages)
            return QStringLiteral("%1: cannot lay out the PDF; nothing was written").arg(pdfPath);
    } // the writer finishes the document when it goes
    return writeOutputFile(pdfPath, document.data());
}

} // namespace sagline
