// The chart view the UI's chart widgets use: zoom with the wheel (around the pointer) or by
// dragging a rectangle, pan with the middle button or the arrow keys, reset with Home or the
// context menu, copy the chart as an image, save it as PNG or SVG. Qt Charts stays behind this
// class and the chart widgets (DESIGN.md): nothing else in the UI talks to QChartView.
#pragma once

#include <QChartView>
#include <QImage>

namespace sagline {

class InteractiveChartView : public QChartView {
    Q_OBJECT
public:
    explicit InteractiveChartView(QWidget *parent = nullptr);

    // The chart as an image at the view's size (what Copy puts on the clipboard).
    QImage image() const;
    void copyImage() const;
    // Writes PNG or SVG by the name's extension (none: PNG); another extension is refused.
    // "" or the reason nothing was written.
    QString saveImage(const QString &path) const;
    // Zooms by `factor` (> 1 in) around `centre` in view coordinates (the plot's centre if null).
    void zoomBy(double factor, QPointF centre = {});

signals:
    // The person zoomed or panned: the owner stops autoscaling until resetRequested().
    void viewChangedByUser();
    void resetRequested();

protected:
    void wheelEvent(QWheelEvent *event) override;
    void mousePressEvent(QMouseEvent *event) override;
    void mouseMoveEvent(QMouseEvent *event) override;
    void mouseReleaseEvent(QMouseEvent *event) override;
    void keyPressEvent(QKeyEvent *event) override;
    void contextMenuEvent(QContextMenuEvent *event) override;

private:
    void saveDialog();
    QPointF m_panFrom;
    bool m_panning = false;
};

} // namespace sagline
