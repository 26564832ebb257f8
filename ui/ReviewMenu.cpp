#include "ReviewMenu.h"

#include "LabSheet.h"
#include "ReviewWindow.h"
#include "SupervisedWindow.h"

#include <QFileDialog>
#include <QMainWindow>
#include <QMenu>
#include <QMenuBar>
#include <QMessageBox>

namespace sagline {

void addReviewMenu(QMainWindow *window)
{
    QMenu *menu = window->menuBar()->addMenu(QObject::tr("Re&view"));
    menu->addAction(QObject::tr("&Review and compare sessions…"), window, [window] {
        auto *review = new ReviewWindow; // its own top-level window
        review->setAttribute(Qt::WA_DeleteOnClose);
        review->show();
        (void)window;
    });
    menu->addAction(QObject::tr("&Supervised session from a lab sheet…"), window, [window] {
        const QString path = QFileDialog::getOpenFileName(window, QObject::tr("Open a lab sheet"), QString(),
                                                          QObject::tr("Lab sheets (*.json);;All files (*)"));
        if (path.isEmpty())
            return;
        const LabSheetParse parsed = loadLabSheetFile(path.toStdString());
        if (!parsed.sheet) {
            QStringList lines;
            for (const FieldError &error : parsed.errors)
                lines << QString::fromStdString(error.message());
            QMessageBox::warning(window, QObject::tr("Lab sheet not usable"), lines.join(QLatin1Char('\n')));
            return;
        }
        auto *supervised = new SupervisedWindow(*parsed.sheet);
        supervised->setAttribute(Qt::WA_DeleteOnClose);
        supervised->show();
    });
}

} // namespace sagline
