// A layout that places its items left to right and starts a new row when the next one would
// not fit: the chart legends use it, so a narrow chart gets a taller legend instead of a legend
// that forces the chart (and the window) wider or cuts its entries short.
#pragma once

#include <QLayout>
#include <QList>

namespace sagline {

class FlowLayout : public QLayout {
public:
    explicit FlowLayout(QWidget *parent = nullptr, int horizontalSpacing = 14, int verticalSpacing = 2);
    ~FlowLayout() override;

    void addItem(QLayoutItem *item) override;
    int count() const override { return static_cast<int>(m_items.size()); }
    QLayoutItem *itemAt(int index) const override;
    QLayoutItem *takeAt(int index) override;
    Qt::Orientations expandingDirections() const override { return {}; }
    bool hasHeightForWidth() const override { return true; }
    int heightForWidth(int width) const override;
    QSize minimumSize() const override; // the widest item: one entry a row
    QSize sizeHint() const override;    // every entry on one row
    void setGeometry(const QRect &rect) override;

private:
    int arrange(const QRect &rect, bool move) const; // returns the height used
    QList<QLayoutItem *> m_items;
    int m_horizontalSpacing;
    int m_verticalSpacing;
};

} // namespace sagline
