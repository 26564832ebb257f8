// The report chart with very many points (long logging runs): markers that would print on top
// of one another are drawn once, so the PDF stays small, and the printed chart looks the same.
#include "ReportChart.h"

#include <gtest/gtest.h>

#include <QImage>
#include <QPainter>
#include <QPicture>

using namespace sagline;

namespace {

ChartSpec lineOfPoints(int count)
{
    ChartSpec spec;
    spec.title = QStringLiteral("dense");
    spec.xLabel = QStringLiteral("x");
    spec.yLabel = QStringLiteral("y");
    ChartSeriesPoints series{QStringLiteral("points"), ChartMarker::FilledCircle, {}};
    for (int i = 0; i < count; ++i) {
        const double x = 3.3 * i / (count - 1);
        series.points.append(QPointF(x, 19.6 - 0.48 * x));
    }
    spec.series = {series};
    return spec;
}

// Recorded paint commands: a measure of what would go into the PDF.
qsizetype recordedBytes(const ChartSpec &spec)
{
    QPicture picture;
    QPainter painter(&picture);
    drawChart(painter, QRectF(0, 0, 450, 250), 1.0, spec);
    painter.end();
    return picture.size();
}

QImage rendered(const ChartSpec &spec)
{
    QImage image(900, 500, QImage::Format_Grayscale8);
    image.fill(Qt::white);
    QPainter painter(&image);
    painter.setRenderHint(QPainter::Antialiasing);
    drawChart(painter, QRectF(0, 0, 900, 500), 2.0, spec); // 450 × 250 pt at 144 dpi
    return image;
}

} // namespace

TEST(ReportChart, OverlappingMarkersAreDrawnOnceAndThePictureIsUnchanged)
{
    const ChartSpec dense = lineOfPoints(100000);
    const ChartSpec sparse = lineOfPoints(2000); // about one point per 0.2 pt along the line
    // 100 000 markers would take megabytes; each 0.5 pt cell along the line holds one.
    EXPECT_LT(recordedBytes(dense), 3 * recordedBytes(sparse));

    const QImage a = rendered(dense);
    const QImage b = rendered(sparse);
    int different = 0, ink = 0;
    for (int y = 0; y < a.height(); ++y) {
        const uchar *ra = a.constScanLine(y);
        const uchar *rb = b.constScanLine(y);
        for (int x = 0; x < a.width(); ++x) {
            ink += ra[x] < 128;
            different += std::abs(int(ra[x]) - int(rb[x])) > 96;
        }
    }
    ASSERT_GT(ink, 5000); // the line of markers is there
    EXPECT_LT(different, ink / 100) << different << " of " << ink;
}
