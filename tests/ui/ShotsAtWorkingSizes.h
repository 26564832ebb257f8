// Screenshots for people to look at (never compared): taken only when SAGLINE_SHOTS_DIR is set,
// at the two working sizes, as SAGLINE_SHOTS_DIR/<subfolder>/<name>-<w>x<h>.png.
#pragma once

#include <QDir>
#include <QSize>
#include <QTest>
#include <QWidget>

#include <functional>
#include <utility>
#include <vector>

namespace sagline::test {

// The folder for `subfolder`'s shots, made if needed; "" when no shots are wanted.
inline QString shotsFolder(const QString &subfolder)
{
    const QString root = qEnvironmentVariable("SAGLINE_SHOTS_DIR");
    if (root.isEmpty())
        return {};
    const QString folder = QDir(root).filePath(subfolder);
    QDir().mkpath(folder);
    return folder;
}

// Shows `window` at 1366x768 and 1600x1000; at each, `settle` runs (draw charts now, choose a
// tab) and each (widget, name) is saved. Returns false when a save failed.
inline bool saveAtWorkingSizes(QWidget &window, const QString &folder,
                               const std::vector<std::pair<QWidget *, QString>> &shots,
                               const std::function<void()> &settle = {})
{
    if (folder.isEmpty())
        return true;
    bool saved = true;
    const QSize before = window.size(); // given back, so the test goes on at the size it had
    for (const QSize size : {QSize(1366, 768), QSize(1600, 1000)}) {
        window.resize(size);
        window.show();
        if (!QTest::qWaitForWindowExposed(&window))
            return false;
        QTest::qWait(50);
        if (settle)
            settle();
        const QString suffix = QStringLiteral("-%1x%2.png").arg(size.width()).arg(size.height());
        for (const auto &[widget, name] : shots)
            saved = widget->grab().save(QDir(folder).filePath(name + suffix)) && saved;
    }
    window.resize(before);
    QTest::qWait(50);
    return saved;
}

} // namespace sagline::test
