#include "ChartStyle.h"

#include <QFont>
#include <QPainter>
#include <QValueAxis>

#include <algorithm>
#include <QPolygonF>

namespace sagline {

bool isDarkPalette(const QPalette &palette)
{
    return palette.color(QPalette::Window).lightness() < 128;
}

ChartColours chartColours(bool dark)
{
    ChartColours c;
    if (dark) {
        c.background = QColor(0x20, 0x22, 0x25);
        c.text = QColor(0xe8, 0xe8, 0xe8);
        c.grid = QColor(0x48, 0x4b, 0x50);
        c.measured = QColor(0x56, 0xb4, 0xe9);   // sky blue
        c.excluded = QColor(0xb0, 0xb0, 0xb0);
        c.fitLine = QColor(0xf0, 0xe4, 0x42);    // yellow
        c.band = QColor(0xf0, 0xe4, 0x42, 60);
        c.predicted = QColor(0xe6, 0x9f, 0x00);  // orange
        c.ratedCurrent = QColor(0x00, 0x9e, 0x73); // bluish green
        c.vaCurve = QColor(0xcc, 0x79, 0xa7);    // reddish purple
        c.unsafe = QColor(0xd5, 0x5e, 0x00);     // vermillion
    } else {
        c.background = QColor(0xff, 0xff, 0xff);
        c.text = QColor(0x1a, 0x1a, 0x1a);
        c.grid = QColor(0xd8, 0xd8, 0xd8);
        c.measured = QColor(0x00, 0x72, 0xb2);   // blue
        c.excluded = QColor(0x70, 0x70, 0x70);
        c.fitLine = QColor(0x1a, 0x1a, 0x1a);    // black
        c.band = QColor(0x56, 0xb4, 0xe9, 70);   // sky blue, translucent
        c.predicted = QColor(0xe6, 0x9f, 0x00);  // orange
        c.ratedCurrent = QColor(0x00, 0x9e, 0x73);
        c.vaCurve = QColor(0xcc, 0x79, 0xa7);
        c.unsafe = QColor(0xd5, 0x5e, 0x00);
    }
    return c;
}

QImage markerImage(MarkerShape shape, const QColor &colour, int sizePx)
{
    QImage image(sizePx, sizePx, QImage::Format_ARGB32_Premultiplied);
    image.fill(Qt::transparent);
    QPainter painter(&image);
    painter.setRenderHint(QPainter::Antialiasing);
    const double s = sizePx;
    const double pen = std::max(1.5, s / 6.0);
    switch (shape) {
    case MarkerShape::FilledCircle:
        painter.setPen(Qt::NoPen);
        painter.setBrush(colour);
        painter.drawEllipse(QRectF(1, 1, s - 2, s - 2));
        break;
    case MarkerShape::HollowSquare:
        painter.setPen(QPen(colour, pen));
        painter.setBrush(Qt::NoBrush);
        painter.drawRect(QRectF(pen / 2 + 0.5, pen / 2 + 0.5, s - pen - 1, s - pen - 1));
        break;
    case MarkerShape::FilledDiamond: {
        painter.setPen(Qt::NoPen);
        painter.setBrush(colour);
        const QPolygonF diamond{{s / 2, 0.5}, {s - 0.5, s / 2}, {s / 2, s - 0.5}, {0.5, s / 2}};
        painter.drawPolygon(diamond);
        break;
    }
    }
    return image;
}

void styleAxis(QValueAxis *axis, const ChartColours &colours, const QFont &baseFont)
{
    QFont labelFont = baseFont;
    labelFont.setPointSizeF(labelFont.pointSizeF() * 1.1);
    QFont titleFont = labelFont;
    titleFont.setBold(true);
    axis->setLabelsColor(colours.text);
    axis->setTitleBrush(colours.text);
    axis->setLabelsFont(labelFont);
    axis->setTitleFont(titleFont);
    axis->setGridLineColor(colours.grid);
    axis->setLinePenColor(colours.text);
}

} // namespace sagline
