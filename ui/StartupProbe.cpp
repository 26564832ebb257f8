#include "StartupProbe.h"

#include "MainWindow.h"
#include "SweepWorkspace.h"
#include "VoltageCurrentChart.h"

#include <QApplication>
#include <QElapsedTimer>
#include <QEvent>
#include <QTimer>
#include <QWidget>

#include <algorithm>
#include <charconv>
#include <cstdio>
#include <fstream>
#include <sstream>
#include <string>

#include <time.h>
#include <unistd.h>

namespace sagline {

namespace {

// Watches paint events; the first one for the window starts a zero timer, which runs once the
// whole paint pass (every child widget, then the flush to the screen) has finished.
class FirstPaintWatcher : public QObject {
public:
    FirstPaintWatcher(MainWindow &window, const QElapsedTimer &sinceMain)
        : QObject(&window), m_window(window), m_sinceMain(sinceMain)
    {
    }

    bool eventFilter(QObject *watched, QEvent *event) override
    {
        auto *widget = qobject_cast<QWidget *>(watched);
        if (!m_seen && event->type() == QEvent::Paint && widget && widget->window() == &m_window) {
            m_seen = true;
            QTimer::singleShot(0, this, [this] { report(); });
        }
        return false;
    }

private:
    void report()
    {
        const auto afterMain = static_cast<long long>(m_sinceMain.elapsed());
        QString described;
        if (const std::size_t readings = m_window.workspace()->readings().size())
            described = QStringLiteral("; %1 readings open, %2 points drawn")
                            .arg(readings)
                            .arg(m_window.chart()->drawnIncludedCount() + m_window.chart()->drawnExcludedCount());
        if (const auto sinceStart = millisecondsSinceProcessStart())
            std::printf("first painted frame after %.0f ms from process start (kernel start time, %ld ms steps; "
                        "%lld ms after main()%s)\n",
                        *sinceStart, 1000L / std::max(1L, sysconf(_SC_CLK_TCK)), afterMain,
                        described.toUtf8().constData());
        else
            std::printf("first painted frame after %lld ms from main() (/proc/self/stat unreadable%s)\n", afterMain,
                        described.toUtf8().constData());
        std::fflush(stdout);
        QApplication::quit();
    }

    MainWindow &m_window;
    const QElapsedTimer &m_sinceMain;
    bool m_seen = false;
};

} // namespace

std::optional<double> millisecondsSinceProcessStart()
{
    std::ifstream stat("/proc/self/stat");
    std::string line;
    if (!std::getline(stat, line))
        return std::nullopt;
    // Field 2 is the command name in parentheses and may itself hold spaces or ')': count
    // from the last ')'. Fields 3 onwards follow; the start time is field 22.
    const std::size_t close = line.rfind(')');
    if (close == std::string::npos)
        return std::nullopt;
    std::istringstream fields(line.substr(close + 1));
    std::string field;
    for (int index = 3; index <= 22; ++index) {
        if (!(fields >> field))
            return std::nullopt;
    }
    const long ticksPerSecond = sysconf(_SC_CLK_TCK);
    timespec now{};
    if (ticksPerSecond <= 0 || clock_gettime(CLOCK_BOOTTIME, &now) != 0)
        return std::nullopt;
    unsigned long long startTicks = 0;
    if (std::from_chars(field.data(), field.data() + field.size(), startTicks).ec != std::errc())
        return std::nullopt;
    const double nowSeconds = static_cast<double>(now.tv_sec) + static_cast<double>(now.tv_nsec) * 1e-9;
    return (nowSeconds - static_cast<double>(startTicks) / static_cast<double>(ticksPerSecond)) * 1000.0;
}

void quitAfterFirstPaint(MainWindow &window, const QElapsedTimer &sinceMain)
{
    qApp->installEventFilter(new FirstPaintWatcher(window, sinceMain));
}

} // namespace sagline
