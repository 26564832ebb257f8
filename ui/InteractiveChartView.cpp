#include "InteractiveChartView.h"

#include "OutputExtension.h"
#include "OutputFile.h"

#include <QBuffer>
#include <QClipboard>
#include <QContextMenuEvent>
#include <QFile>
#include <QFileDialog>
#include <QGuiApplication>
#include <QKeyEvent>
#include <QMenu>
#include <QMessageBox>
#include <QPainter>
#include <QSvgGenerator>
#include <QWheelEvent>

#include <cmath>

namespace sagline {

namespace {
constexpr double wheelStepFactor = 1.25; // per notch (120 eighths of a degree)
constexpr int keyPanPx = 40;
} // namespace

InteractiveChartView::InteractiveChartView(QWidget *parent) : QChartView(parent)
{
    setRubberBand(QChartView::RectangleRubberBand);
    setFocusPolicy(Qt::ClickFocus); // arrow keys and Home once clicked; never taken by Tab from the form
    setToolTip(tr("Wheel or drag a rectangle to zoom, middle button or arrow keys to pan, Home to reset; "
                  "right-click to copy or save"));
}

void InteractiveChartView::zoomBy(double factor, QPointF centre)
{
    const QRectF plot = chart()->plotArea();
    if (plot.isEmpty() || factor <= 0.0)
        return;
    const QPointF anchor = centre.isNull() ? plot.center() : chart()->mapFromScene(mapToScene(centre.toPoint()));
    // The point under the pointer stays where it is.
    QRectF zoomed(0, 0, plot.width() / factor, plot.height() / factor);
    zoomed.moveLeft(anchor.x() - (anchor.x() - plot.left()) / factor);
    zoomed.moveTop(anchor.y() - (anchor.y() - plot.top()) / factor);
    chart()->zoomIn(zoomed);
    emit viewChangedByUser();
}

void InteractiveChartView::wheelEvent(QWheelEvent *event)
{
    const int notches = event->angleDelta().y() / 120;
    if (notches == 0) {
        event->ignore();
        return;
    }
    zoomBy(std::pow(wheelStepFactor, notches), event->position());
    event->accept();
}

void InteractiveChartView::mousePressEvent(QMouseEvent *event)
{
    if (event->button() == Qt::MiddleButton) {
        m_panning = true;
        m_panFrom = event->position();
        event->accept();
        return;
    }
    QChartView::mousePressEvent(event);
}

void InteractiveChartView::mouseMoveEvent(QMouseEvent *event)
{
    if (m_panning) {
        const QPointF delta = event->position() - m_panFrom;
        m_panFrom = event->position();
        chart()->scroll(-delta.x(), delta.y());
        emit viewChangedByUser();
        event->accept();
        return;
    }
    QChartView::mouseMoveEvent(event);
}

void InteractiveChartView::mouseReleaseEvent(QMouseEvent *event)
{
    if (event->button() == Qt::MiddleButton && m_panning) {
        m_panning = false;
        event->accept();
        return;
    }
    if (event->button() == Qt::RightButton) {
        event->accept(); // the context menu, not QChartView's zoom-out on a right click
        return;
    }
    const bool dragged = rubberBand() != QChartView::NoRubberBand && event->button() == Qt::LeftButton;
    QChartView::mouseReleaseEvent(event);
    if (dragged)
        emit viewChangedByUser();
}

void InteractiveChartView::keyPressEvent(QKeyEvent *event)
{
    switch (event->key()) {
    case Qt::Key_Left: chart()->scroll(-keyPanPx, 0); break;
    case Qt::Key_Right: chart()->scroll(keyPanPx, 0); break;
    case Qt::Key_Up: chart()->scroll(0, keyPanPx); break;
    case Qt::Key_Down: chart()->scroll(0, -keyPanPx); break;
    case Qt::Key_Plus:
    case Qt::Key_Equal: zoomBy(wheelStepFactor); return;
    case Qt::Key_Minus: zoomBy(1.0 / wheelStepFactor); return;
    case Qt::Key_Home: emit resetRequested(); return;
    default: QChartView::keyPressEvent(event); return;
    }
    emit viewChangedByUser();
}

void InteractiveChartView::contextMenuEvent(QContextMenuEvent *event)
{
    QMenu menu(this);
    menu.addAction(tr("Zoom in"), this, [this] { zoomBy(wheelStepFactor); });
    menu.addAction(tr("Zoom out"), this, [this] { zoomBy(1.0 / wheelStepFactor); });
    menu.addAction(tr("Reset the view (Home)"), this, &InteractiveChartView::resetRequested);
    menu.addSeparator();
    menu.addAction(tr("Copy the chart as an image"), this, &InteractiveChartView::copyImage);
    menu.addAction(tr("Save the chart as PNG or SVG…"), this, &InteractiveChartView::saveDialog);
    menu.exec(event->globalPos());
}

QImage InteractiveChartView::image() const { return const_cast<InteractiveChartView *>(this)->grab().toImage(); }

void InteractiveChartView::copyImage() const { QGuiApplication::clipboard()->setImage(image()); }

QString InteractiveChartView::saveImage(const QString &requestedPath) const
{
    const OutputName name = outputNameFor(QFile::encodeName(requestedPath).toStdString(), "chart image", {"png", "svg"});
    if (!name.ok())
        return QFile::decodeName(QByteArray::fromStdString(name.error));
    const QString path = QFile::decodeName(QByteArray::fromStdString(name.path));
    QBuffer bytes;
    bytes.open(QIODevice::WriteOnly);
    if (path.endsWith(QLatin1String(".svg"), Qt::CaseInsensitive)) {
        // Vector output: the scene drawn into an SVG painter, at the view's size.
        QSvgGenerator svg;
        svg.setOutputDevice(&bytes);
        svg.setSize(size());
        svg.setViewBox(QRect(QPoint(0, 0), size()));
        svg.setTitle(accessibleName());
        QPainter painter;
        if (!painter.begin(&svg))
            return tr("%1: cannot draw the chart as SVG; nothing was written").arg(path);
        const_cast<InteractiveChartView *>(this)->render(&painter);
        painter.end();
    } else if (!image().save(&bytes, "PNG")) {
        return tr("%1: cannot encode the chart as PNG; nothing was written").arg(path);
    }
    return writeOutputFile(path, bytes.data());
}

void InteractiveChartView::saveDialog()
{
    const QString path = QFileDialog::getSaveFileName(this, tr("Save the chart"), QString(),
                                                      tr("PNG image (*.png);;SVG drawing (*.svg)"));
    if (path.isEmpty())
        return;
    if (const QString problem = saveImage(path); !problem.isEmpty())
        QMessageBox::warning(this, tr("Save the chart"), problem);
}

} // namespace sagline
