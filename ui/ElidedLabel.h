// A one-line label that fits whatever width it is given: the text is shortened with "…"
// (at the end, or in the middle for paths) and the whole text is its tooltip. For the
// status bar, where a long message or a long session path must never push into or cover its
// neighbours. text() is what is shown; fullText() what was set.
#pragma once

#include <QLabel>

namespace sagline {

class ElidedLabel : public QLabel {
    Q_OBJECT
public:
    explicit ElidedLabel(Qt::TextElideMode mode = Qt::ElideRight, QWidget *parent = nullptr);
    void setFullText(const QString &text);
    QString fullText() const { return m_fullText; }
    QSize minimumSizeHint() const override;
    QSize sizeHint() const override;

protected:
    void resizeEvent(QResizeEvent *event) override;

private:
    void elide();
    QString m_fullText;
    Qt::TextElideMode m_mode;
};

} // namespace sagline
