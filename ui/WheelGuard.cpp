#include "WheelGuard.h"

#include <QAbstractSpinBox>
#include <QComboBox>
#include <QEvent>
#include <QWheelEvent>

namespace sagline {

namespace {

constexpr const char *guardedProperty = "saglineWheelGuarded";
constexpr const char *filterName = "saglineWheelGuard";

class WheelGuard : public QObject {
public:
    explicit WheelGuard(QObject *parent) : QObject(parent) {}

    bool eventFilter(QObject *watched, QEvent *event) override
    {
        if (event->type() == QEvent::Wheel) {
            auto *widget = qobject_cast<QWidget *>(watched);
            if (widget && !widget->hasFocus()) {
                // Ignored and filtered: QApplication hands the wheel on to the parents, so the
                // scroll area scrolls and the value stays.
                event->ignore();
                return true;
            }
        }
        return QObject::eventFilter(watched, event);
    }
};

void guard(QWidget *widget, WheelGuard *filter)
{
    if (widget->property(guardedProperty).toBool())
        return;
    widget->setProperty(guardedProperty, true);
    // Wheel focus would let the wheel itself give the control focus and so pass the guard.
    widget->setFocusPolicy(Qt::StrongFocus);
    widget->installEventFilter(filter);
}

} // namespace

void guardWheelInside(QWidget *root)
{
    auto *filter = static_cast<WheelGuard *>(root->findChild<QObject *>(QLatin1String(filterName), Qt::FindDirectChildrenOnly));
    if (!filter) {
        filter = new WheelGuard(root);
        filter->setObjectName(QLatin1String(filterName));
    }
    if (qobject_cast<QComboBox *>(root) || qobject_cast<QAbstractSpinBox *>(root))
        guard(root, filter);
    for (QComboBox *combo : root->findChildren<QComboBox *>())
        guard(combo, filter);
    for (QAbstractSpinBox *spin : root->findChildren<QAbstractSpinBox *>())
        guard(spin, filter);
}

} // namespace sagline
