#include "ActionButton.h"

#include <QAbstractButton>
#include <QAction>
#include <QEvent>
#include <QPointer>

namespace sagline {

namespace {

// Watches the button for an explicit setEnabled() and hands it to the action.
class EnabledRelay : public QObject {
public:
    EnabledRelay(QAbstractButton *button, QAction *action) : QObject(button), m_button(button), m_action(action) {}

    bool eventFilter(QObject *watched, QEvent *event) override
    {
        if (watched == m_button && event->type() == QEvent::EnabledChange && m_action && !m_syncing) {
            // WA_ForceDisabled is set only by the button's own setEnabled(false).
            const bool wanted = !m_button->testAttribute(Qt::WA_ForceDisabled);
            if (m_action->isEnabled() != wanted) {
                m_syncing = true;
                m_action->setEnabled(wanted);
                m_syncing = false;
            }
        }
        return QObject::eventFilter(watched, event);
    }

    void copyFromAction()
    {
        if (!m_action || m_syncing)
            return;
        m_syncing = true;
        QString text = m_action->text();
        text.remove(QLatin1Char('&')); // a button shows no menu mnemonic
        if (m_button->text() != text)
            m_button->setText(text);
        m_button->setToolTip(m_action->toolTip());
        m_button->setEnabled(m_action->isEnabled());
        m_syncing = false;
    }

private:
    QAbstractButton *m_button;
    QPointer<QAction> m_action;
    bool m_syncing = false;
};

} // namespace

void bindButtonToAction(QAbstractButton *button, QAction *action)
{
    auto *relay = new EnabledRelay(button, action);
    button->installEventFilter(relay);
    QObject::connect(button, &QAbstractButton::clicked, action, [action] { action->trigger(); });
    QObject::connect(action, &QAction::changed, relay, [relay] { relay->copyFromAction(); });
    relay->copyFromAction();
}

} // namespace sagline
