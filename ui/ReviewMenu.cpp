#include "ReviewMenu.h"

#include "DataDirectory.h"
#include "ReviewWindow.h"
#include "StudentBenchWindow.h"

#include <QDir>
#include <QMainWindow>
#include <QMenu>
#include <QMenuBar>
#include <QSettings>

namespace sagline {

namespace {

// The lab-sheet folder a supervisor chose last; at first the installed examples.
QString sheetFolder()
{
    const QString chosen = QSettings().value(QStringLiteral("supervised/sheetFolder")).toString();
    if (!chosen.isEmpty())
        return chosen;
    const DataDirectoryResult data = findDataDirectory();
    return data.ok() ? QString::fromStdString(data.path.string()) : QDir::homePath();
}

QString sessionFolder()
{
    return QSettings()
        .value(QStringLiteral("supervised/sessionFolder"), QDir::home().filePath(QStringLiteral("sagline-sessions")))
        .toString();
}

} // namespace

void addReviewMenu(QMainWindow *window)
{
    QMenu *menu = window->menuBar()->addMenu(QObject::tr("Re&view"));
    menu->addAction(QObject::tr("&Review and compare sessions…"), window, [window] {
        auto *review = new ReviewWindow; // its own top-level window
        review->setAttribute(Qt::WA_DeleteOnClose);
        review->show();
        (void)window;
    });
    menu->addAction(QObject::tr("&Supervised session from a lab sheet…"), window, [] {
        auto *student = new StudentBenchWindow; // its own top-level window: the bench, locked by the sheet
        student->setAttribute(Qt::WA_DeleteOnClose);
        student->setSessionFolder(sessionFolder());
        student->setSheetFolder(sheetFolder());
        student->show();
    });
}

} // namespace sagline
