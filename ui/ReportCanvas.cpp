#include "ReportCanvas.h"

#include <QFontMetricsF>
#include <QPagedPaintDevice>
#include <QPainter>

#include <algorithm>

namespace sagline {

namespace {
constexpr double footerHeightPt = 26.0; // two lines: a long file name wraps instead of being cut
constexpr double cellPaddingPt = 2.0;
} // namespace

ReportCanvas::ReportCanvas(QPagedPaintDevice &device, QPainter &painter, QString footerText, int totalPages)
    : m_device(device), m_painter(painter), m_footerText(std::move(footerText)), m_totalPages(totalPages),
      m_unit(device.logicalDpiY() / 72.0), m_cursorPt(0.0)
{
    const QRectF paint = device.pageLayout().paintRect(QPageLayout::Point);
    m_contentPt = QRectF(0, 0, paint.width(), paint.height() - footerHeightPt);
    m_painter.setPen(QPen(Qt::black, toDevice(0.5)));
}

QFont ReportCanvas::font(double sizePt, bool bold, bool italic) const
{
    QFont f(QStringLiteral("DejaVu Sans"));
    f.setStyleHint(QFont::SansSerif);
    f.setPointSizeF(sizePt);
    f.setBold(bold);
    f.setItalic(italic);
    return f;
}

double ReportCanvas::contentWidthPt() const
{
    return m_contentPt.width();
}

double ReportCanvas::remainingPt() const
{
    return m_contentPt.height() - m_cursorPt;
}

void ReportCanvas::ensureSpace(double heightPt)
{
    if (heightPt > remainingPt() && m_cursorPt > 0.0)
        newPage();
}

void ReportCanvas::newPage()
{
    drawFooter();
    m_device.newPage();
    ++m_page;
    m_cursorPt = 0.0;
}

void ReportCanvas::skip(double heightPt)
{
    m_cursorPt += heightPt;
}

QRectF ReportCanvas::takeBlock(double heightPt)
{
    ensureSpace(heightPt);
    const QRectF block(toDevice(m_contentPt.left()), toDevice(m_cursorPt), toDevice(m_contentPt.width()), toDevice(heightPt));
    m_cursorPt += heightPt;
    return block;
}

double ReportCanvas::textHeightPt(const QString &text, const QFont &f, double widthPt) const
{
    const QFontMetricsF metrics(f, &m_device);
    const QRectF bounds = metrics.boundingRect(QRectF(0, 0, toDevice(widthPt), 1e9), Qt::TextWordWrap, text);
    return bounds.height() / m_unit;
}

void ReportCanvas::title(const QString &text, const QString &subtitle)
{
    const QFont big = font(16.0, true);
    const QFont small = font(9.0);
    const double height = textHeightPt(text, big, contentWidthPt()) + textHeightPt(subtitle, small, contentWidthPt()) + 8.0;
    const QRectF block = takeBlock(height);
    m_painter.setFont(big);
    m_painter.drawText(block, Qt::AlignLeft | Qt::AlignTop | Qt::TextWordWrap, text);
    m_painter.setFont(small);
    m_painter.drawText(block, Qt::AlignLeft | Qt::AlignBottom | Qt::TextWordWrap, subtitle);
    m_painter.setPen(QPen(Qt::black, toDevice(1.5)));
    m_painter.drawLine(QPointF(block.left(), block.bottom() + toDevice(2)), QPointF(block.right(), block.bottom() + toDevice(2)));
    m_painter.setPen(QPen(Qt::black, toDevice(0.5)));
    skip(8.0);
}

void ReportCanvas::heading(const QString &text)
{
    const QFont f = font(11.0, true);
    // Keep a heading with at least a few lines of what follows it.
    ensureSpace(textHeightPt(text, f, contentWidthPt()) + 60.0);
    skip(6.0);
    const double height = textHeightPt(text, f, contentWidthPt()) + 3.0;
    const QRectF block = takeBlock(height);
    m_painter.setFont(f);
    m_painter.drawText(block, Qt::AlignLeft | Qt::AlignTop, text);
    m_painter.drawLine(QPointF(block.left(), block.bottom()), QPointF(block.right(), block.bottom()));
    skip(4.0);
}

void ReportCanvas::paragraph(const QString &text, double sizePt, bool bold, bool italic)
{
    const QFont f = font(sizePt, bold, italic);
    const double height = textHeightPt(text, f, contentWidthPt());
    const QRectF block = takeBlock(height + 2.0);
    m_painter.setFont(f);
    m_painter.drawText(block, Qt::AlignLeft | Qt::AlignTop | Qt::TextWordWrap, text);
}

void ReportCanvas::keyValues(const QList<QPair<QString, QString>> &rows, int columns)
{
    const QFont nameFont = font(8.5, true);
    const QFont valueFont = font(8.5);
    const double pairWidth = contentWidthPt() / columns;
    const double nameWidth = pairWidth * 0.42;
    const double valueWidth = pairWidth - nameWidth - 6.0;
    for (int start = 0; start < rows.size(); start += columns) {
        double height = 0.0;
        for (int c = 0; c < columns && start + c < rows.size(); ++c) {
            height = std::max({height, textHeightPt(rows[start + c].first, nameFont, nameWidth - 4.0),
                               textHeightPt(rows[start + c].second, valueFont, valueWidth)});
        }
        const QRectF block = takeBlock(height + 2.0);
        for (int c = 0; c < columns && start + c < rows.size(); ++c) {
            const double left = block.left() + toDevice(c * pairWidth);
            m_painter.setFont(nameFont);
            m_painter.drawText(QRectF(left, block.top(), toDevice(nameWidth - 4.0), block.height()),
                               Qt::AlignLeft | Qt::AlignTop | Qt::TextWordWrap, rows[start + c].first);
            m_painter.setFont(valueFont);
            m_painter.drawText(QRectF(left + toDevice(nameWidth), block.top(), toDevice(valueWidth), block.height()),
                               Qt::AlignLeft | Qt::AlignTop | Qt::TextWordWrap, rows[start + c].second);
        }
    }
}

double ReportCanvas::paragraphHeightPt(const QString &text, double sizePt, bool bold) const
{
    return textHeightPt(text, font(sizePt, bold), contentWidthPt()) + 2.0; // as paragraph() takes it
}

double ReportCanvas::rowHeightPt(const QList<ReportTableColumn> &columns, const QStringList &cells, const QFont &f) const
{
    double height = 0.0;
    for (int c = 0; c < columns.size() && c < cells.size(); ++c)
        height = std::max(height, textHeightPt(cells[c], f, columns[c].widthFraction * contentWidthPt() - 2 * cellPaddingPt));
    return height + 2 * cellPaddingPt;
}

QStringList ReportCanvas::headersOf(const QList<ReportTableColumn> &columns)
{
    QStringList headers;
    for (const auto &column : columns)
        headers.append(column.header);
    return headers;
}

double ReportCanvas::tableHeightPt(const QList<ReportTableColumn> &columns, const QList<QStringList> &rows,
                                   double sizePt) const
{
    double total = rowHeightPt(columns, headersOf(columns), font(sizePt, true));
    for (const QStringList &row : rows)
        total += rowHeightPt(columns, row, font(sizePt));
    return total;
}

void ReportCanvas::table(const QList<ReportTableColumn> &columns, const QList<QStringList> &rows, double sizePt)
{
    const QFont headerFont = font(sizePt, true);
    const QFont cellFont = font(sizePt);
    QList<double> widths;
    for (const auto &column : columns)
        widths.append(column.widthFraction * contentWidthPt());

    auto rowHeight = [&](const QStringList &cells, const QFont &f) { return rowHeightPt(columns, cells, f); };
    auto drawRow = [&](const QStringList &cells, const QFont &f, bool isHeader) {
        const QRectF block = takeBlock(rowHeight(cells, f));
        m_painter.setFont(f);
        double x = block.left();
        for (int c = 0; c < columns.size(); ++c) {
            const QRectF cell(x + toDevice(cellPaddingPt), block.top() + toDevice(cellPaddingPt),
                              toDevice(widths[c] - 2 * cellPaddingPt), block.height() - toDevice(2 * cellPaddingPt));
            if (c < cells.size())
                m_painter.drawText(cell, columns[c].alignment | Qt::AlignTop | Qt::TextWordWrap, cells[c]);
            x += toDevice(widths[c]);
        }
        m_painter.setPen(QPen(Qt::black, toDevice(isHeader ? 0.8 : 0.25)));
        m_painter.drawLine(block.bottomLeft(), block.bottomRight());
        m_painter.setPen(QPen(Qt::black, toDevice(0.5)));
    };

    const QStringList headers = headersOf(columns);
    const double headerHeight = rowHeight(headers, headerFont);
    ensureSpace(headerHeight + (rows.isEmpty() ? 0.0 : rowHeight(rows.first(), cellFont)));
    drawRow(headers, headerFont, true);
    for (const QStringList &row : rows) {
        const double height = rowHeight(row, cellFont);
        if (height > remainingPt()) {
            newPage();
            drawRow(headers, headerFont, true);
        }
        drawRow(row, cellFont, false);
    }
    skip(4.0);
}

void ReportCanvas::framedText(const QString &headline, const QString &body)
{
    const QFont big = font(13.0, true);
    const QFont small = font(8.5);
    const double inner = contentWidthPt() - 16.0;
    const double height = textHeightPt(headline, big, inner) + textHeightPt(body, small, inner) + 18.0;
    const QRectF block = takeBlock(height);
    m_painter.setPen(QPen(Qt::black, toDevice(2.0)));
    m_painter.drawRect(block.adjusted(toDevice(1), toDevice(1), -toDevice(1), -toDevice(1)));
    m_painter.setPen(QPen(Qt::black, toDevice(0.5)));
    const QRectF text = block.adjusted(toDevice(8), toDevice(6), -toDevice(8), -toDevice(6));
    m_painter.setFont(big);
    m_painter.drawText(text, Qt::AlignLeft | Qt::AlignTop | Qt::TextWordWrap, headline);
    m_painter.setFont(small);
    m_painter.drawText(text, Qt::AlignLeft | Qt::AlignBottom | Qt::TextWordWrap, body);
    skip(6.0);
}

void ReportCanvas::signatureLines(const QStringList &captions)
{
    const QFont f = font(8.0);
    const QRectF block = takeBlock(44.0);
    const double gap = 18.0;
    const double count = static_cast<double>(captions.size());
    const double width = (contentWidthPt() - gap * (count - 1.0)) / count;
    m_painter.setFont(f);
    for (int i = 0; i < captions.size(); ++i) {
        const double left = block.left() + toDevice(i * (width + gap));
        const double lineY = block.top() + toDevice(28.0);
        m_painter.drawLine(QPointF(left, lineY), QPointF(left + toDevice(width), lineY));
        m_painter.drawText(QRectF(left, lineY + toDevice(2), toDevice(width), toDevice(14)), Qt::AlignLeft | Qt::AlignTop,
                           captions[i]);
    }
}

void ReportCanvas::drawFooter()
{
    const QFont f = font(7.5);
    m_painter.setFont(f);
    const double top = toDevice(m_contentPt.height() + 4.0);
    const QRectF line(toDevice(m_contentPt.left()), top, toDevice(m_contentPt.width()), toDevice(footerHeightPt - 4.0));
    m_painter.drawLine(line.topLeft(), line.topRight());
    const QString page = m_totalPages > 0 ? QStringLiteral("page %1 of %2").arg(m_page).arg(m_totalPages)
                                          : QStringLiteral("page %1").arg(m_page);
    const double pageWidth = toDevice(60.0);
    double left = line.left();
    if (!m_pageMark.isEmpty()) {
        // Bold, first, on every page: a reader of any single page sees it.
        m_painter.setFont(font(7.5, true));
        const double markWidth = m_painter.fontMetrics().horizontalAdvance(m_pageMark) + toDevice(8.0);
        m_painter.drawText(QRectF(left, line.top(), markWidth, line.height()), Qt::AlignLeft | Qt::AlignVCenter, m_pageMark);
        left += markWidth;
        m_painter.setFont(f);
    }
    m_painter.drawText(QRectF(left, line.top(), line.right() - left - pageWidth, line.height()),
                       Qt::AlignLeft | Qt::AlignVCenter | Qt::TextWordWrap, m_footerText);
    m_painter.drawText(line, Qt::AlignRight | Qt::AlignVCenter, page);
}

void ReportCanvas::finish()
{
    drawFooter();
}

} // namespace sagline
