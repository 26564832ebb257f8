// Files the window writes (the report and review PDFs, the CSV exports): never over a session
// (by content), a folder or a device, and whole or not at all: the bytes are made in memory
// and core's atomic writer puts them under the name (temporary file, fsync, check, rename).
// Replacing another existing file is confirmed by the save dialog before these are called.
#pragma once

#include <QByteArray>
#include <QString>

#include <functional>

class QPdfWriter;

namespace sagline {

// Returns "" or the reason nothing was written.
QString writeOutputFile(const QString &path, const QByteArray &bytes);

// A PDF laid out in two passes (the first counts the pages, so every footer can say "page X
// of Y"): `render(writer, totalPages)` lays the document out (totalPages 0 on the counting
// pass) and returns the pages it drew, 0 when painting failed.
QString writePdfFile(const QString &pdfPath, const std::function<int(QPdfWriter &, int totalPages)> &render);

} // namespace sagline
