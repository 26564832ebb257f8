// A printed page flow for the PDF report: margins, a cursor that moves down the page, page
// breaks, a running footer ("page X of Y"), and text, key-value and table blocks. All sizes
// are in points (1/72 in) and converted to device units here, so the report looks the same at
// any printer resolution. Black and white only: emphasis by weight, rules and hatching.
#pragma once

#include <QFont>
#include <QList>
#include <QPair>
#include <QRectF>
#include <QString>
#include <QStringList>

class QPainter;
class QPagedPaintDevice;

namespace sagline {

struct ReportTableColumn {
    QString header;
    double widthFraction = 0.1;              // share of the content width
    Qt::Alignment alignment = Qt::AlignLeft; // numbers: Qt::AlignRight
};

class ReportCanvas {
public:
    // `totalPages` = 0 while counting (the footer then says "page X").
    ReportCanvas(QPagedPaintDevice &device, QPainter &painter, QString footerText, int totalPages);

    double toDevice(double points) const { return points * m_unit; }
    QPainter &painter() { return m_painter; }
    double contentWidthPt() const;
    double remainingPt() const;               // space left on this page
    int pageNumber() const { return m_page; }

    // Starts a new page when less than `heightPt` is left.
    void ensureSpace(double heightPt);
    void newPage();
    void skip(double heightPt);
    // Reserves a block of `heightPt` (after ensureSpace) and returns its rectangle in device units.
    QRectF takeBlock(double heightPt);

    void title(const QString &text, const QString &subtitle);
    void heading(const QString &text);
    // Wrapped text; `sizePt` font size.
    void paragraph(const QString &text, double sizePt = 9.0, bool bold = false, bool italic = false);
    // Rows of "name  value" in `columns` side-by-side pairs.
    void keyValues(const QList<QPair<QString, QString>> &rows, int columns = 2);
    // Heights the blocks above would take, so a caller can keep a title and its table on one page.
    double paragraphHeightPt(const QString &text, double sizePt = 9.0, bool bold = false) const;
    double tableHeightPt(const QList<ReportTableColumn> &columns, const QList<QStringList> &rows,
                         double sizePt = 7.5) const;
    // A ruled table; the header row repeats after a page break. Cells wrap within their column.
    void table(const QList<ReportTableColumn> &columns, const QList<QStringList> &rows, double sizePt = 7.5);
    // A framed box with a heavy border, for the verdict.
    void framedText(const QString &headline, const QString &body);
    // A blank line to sign on, with a caption under it, `count` side by side.
    void signatureLines(const QStringList &captions);

    // Draws the last page's footer; call once at the end.
    void finish();
    // A mark printed in bold on every page's footer from now on ("SIMULATED ..."); "" for none.
    void setPageMark(const QString &mark) { m_pageMark = mark; }

private:
    QFont font(double sizePt, bool bold = false, bool italic = false) const;
    double textHeightPt(const QString &text, const QFont &font, double widthPt) const;
    double rowHeightPt(const QList<ReportTableColumn> &columns, const QStringList &cells, const QFont &font) const;
    static QStringList headersOf(const QList<ReportTableColumn> &columns);
    void drawFooter();

    QPagedPaintDevice &m_device;
    QPainter &m_painter;
    QString m_footerText;
    QString m_pageMark;
    int m_totalPages;
    double m_unit;       // device units per point
    QRectF m_contentPt;  // content area in points, relative to the paint rectangle
    double m_cursorPt;   // y of the next block, points from the top of the content area
    int m_page = 1;
};

} // namespace sagline
