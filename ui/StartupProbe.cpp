#include "StartupProbe.h"

#include <QApplication>
#include <QElapsedTimer>
#include <QEvent>
#include <QTimer>
#include <QWidget>

#include <cstdio>

namespace sagline {

namespace {

// Watches paint events; the first one for the window starts a zero timer, which runs once the
// whole paint pass (every child widget, then the flush to the screen) has finished.
class FirstPaintWatcher : public QObject {
public:
    FirstPaintWatcher(QWidget &window, const QElapsedTimer &sinceStart)
        : QObject(&window), m_window(window), m_sinceStart(sinceStart)
    {
    }

    bool eventFilter(QObject *watched, QEvent *event) override
    {
        auto *widget = qobject_cast<QWidget *>(watched);
        if (!m_seen && event->type() == QEvent::Paint && widget && widget->window() == &m_window) {
            m_seen = true;
            QTimer::singleShot(0, this, [this] {
                std::printf("first painted frame after %lld ms\n", static_cast<long long>(m_sinceStart.elapsed()));
                std::fflush(stdout);
                QApplication::quit();
            });
        }
        return false;
    }

private:
    QWidget &m_window;
    const QElapsedTimer &m_sinceStart;
    bool m_seen = false;
};

} // namespace

void quitAfterFirstPaint(QWidget &window, const QElapsedTimer &sinceStart)
{
    qApp->installEventFilter(new FirstPaintWatcher(window, sinceStart));
}

} // namespace sagline
