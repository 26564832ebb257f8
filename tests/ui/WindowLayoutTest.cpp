// The window at working size: at 1366 × 768 (a laptop, less the panel) and 1600 × 1000, light
// and dark, during a sweep, no label is cut short (each label's text against the text its
// width shows: elided, or wrapped taller than the label), no chart title is shortened, no
// widget overlaps a sibling, and the results column, the plan table (every column) and the
// readings table need no horizontal scroll bar at 1600 px. Run once more under
// QT_SCALE_FACTOR=1.5 by ctest (WindowLayoutScaled). The window's size is remembered.
#include "UiTestSupport.h"

#include "ElidedLabel.h"
#include "PlanPanel.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QAbstractScrollArea>
#include <QGraphicsTextItem>
#include <QGraphicsView>
#include <QLabel>
#include <QScreen>
#include <QScrollBar>
#include <QSettings>
#include <QStyle>
#include <QTabWidget>
#include <QTableView>
#include <QTextDocument>

using namespace sagline;
using namespace sagline::test;

namespace {

QString describe(const QWidget *widget)
{
    QString path;
    for (const QWidget *w = widget; w; w = w->parentWidget())
        path.prepend(QLatin1String(w->metaObject()->className()) + (w->objectName().isEmpty() ? QString() : QLatin1Char('#') + w->objectName()) + QLatin1Char('/'));
    return path;
}

QString plainTextOf(const QLabel *label)
{
    if (label->textFormat() == Qt::PlainText || (label->textFormat() == Qt::AutoText && !Qt::mightBeRichText(label->text())))
        return label->text();
    QTextDocument document;
    document.setHtml(label->text());
    return document.toPlainText();
}

// Every problem a person would see: a label elided or clipped, a chart title shortened.
QStringList cutShort(QWidget *window)
{
    QStringList problems;
    for (QLabel *label : window->findChildren<QLabel *>()) {
        if (!label->isVisible() || label->text().isEmpty() || label->pixmap().cacheKey() != 0)
            continue;
        if (qobject_cast<ElidedLabel *>(label))
            continue; // shortens on purpose, the whole text in its tooltip (the status bar)
        const QRect box = label->contentsRect().adjusted(label->margin(), label->margin(), -label->margin(), -label->margin());
        const QFontMetrics metrics(label->font());
        if (label->wordWrap()) {
            const int needed = label->heightForWidth(label->width());
            if (needed > label->height() + 1)
                problems << QStringLiteral("clipped (needs %1 px, has %2): %3 \"%4\"")
                                .arg(needed).arg(label->height()).arg(describe(label), plainTextOf(label).left(60));
            // One word per line is no layout either.
            const QString words = plainTextOf(label).simplified();
            if (words.count(QLatin1Char(' ')) >= 3 && metrics.horizontalAdvance(words) > 4 * box.width()
                && box.width() < 8 * metrics.averageCharWidth())
                problems << QStringLiteral("squeezed to %1 px: %2 \"%3\"").arg(box.width()).arg(describe(label), words.left(60));
            continue;
        }
        for (const QString &line : plainTextOf(label).split(QLatin1Char('\n'))) {
            if (metrics.elidedText(line, Qt::ElideRight, box.width()) != line)
                problems << QStringLiteral("elided (needs %1 px, has %2): %3 \"%4\"")
                                .arg(metrics.horizontalAdvance(line)).arg(box.width()).arg(describe(label), line.left(60));
        }
    }
    for (QGraphicsView *view : window->findChildren<QGraphicsView *>()) {
        if (!view->isVisible() || !view->scene())
            continue;
        for (QGraphicsItem *item : view->scene()->items()) {
            if (item->type() != QGraphicsTextItem::Type || !item->isVisible())
                continue;
            const QString text = static_cast<QGraphicsTextItem *>(item)->toPlainText();
            if (text.contains(QStringLiteral("...")) || text.contains(QChar(0x2026)))
                problems << QStringLiteral("chart text shortened: %1 \"%2\"").arg(describe(view), text);
        }
    }
    return problems;
}

bool isLayoutChild(const QWidget *widget)
{
    if (widget->isWindow() || !widget->isVisible() || widget->objectName().startsWith(QLatin1String("qt_")))
        return false;
    const QWidget *parent = widget->parentWidget();
    return parent && parent->layout() && parent->layout()->indexOf(const_cast<QWidget *>(widget)) >= 0;
}

// Siblings in one layout never overlap (a layout squeezed below its minimum does that).
QStringList overlaps(QWidget *window)
{
    QStringList problems;
    for (QWidget *parent : window->findChildren<QWidget *>()) {
        QList<QWidget *> children;
        for (QObject *object : parent->children()) {
            auto *child = qobject_cast<QWidget *>(object);
            if (child && isLayoutChild(child))
                children << child;
        }
        for (int i = 0; i < children.size(); ++i) {
            for (int j = i + 1; j < children.size(); ++j) {
                if (children[i]->geometry().intersects(children[j]->geometry()))
                    problems << QStringLiteral("overlap: %1 and %2").arg(describe(children[i]), describe(children[j]));
            }
            if (!parent->rect().contains(children[i]->geometry()) && !qobject_cast<QAbstractScrollArea *>(parent->parentWidget()))
                problems << QStringLiteral("outside its parent: %1").arg(describe(children[i]));
        }
    }
    return problems;
}

QStringList horizontalScrollBars(MainWindow &window)
{
    QStringList problems;
    QList<QAbstractScrollArea *> areas{window.planPanel()->table(), window.readingsView()};
    areas << qobject_cast<QAbstractScrollArea *>(window.results()->parentWidget()->parentWidget());
    for (QAbstractScrollArea *area : areas) {
        if (area && area->isVisible() && area->horizontalScrollBar()->isVisible())
            problems << QStringLiteral("horizontal scroll bar: %1").arg(describe(area));
    }
    return problems;
}

std::string joined(const QStringList &problems) { return problems.join(QLatin1Char('\n')).toStdString(); }

// A window of that size in the middle of a sweep on the virtual bench, in the palette asked.
std::unique_ptr<MainWindow> windowDuringASweep(const QString &folder, QSize size, bool dark)
{
    if (dark) {
        QPalette palette;
        palette.setColor(QPalette::Window, QColor(0x30, 0x30, 0x30));
        palette.setColor(QPalette::WindowText, Qt::white);
        palette.setColor(QPalette::Base, QColor(0x20, 0x20, 0x20));
        palette.setColor(QPalette::AlternateBase, QColor(0x38, 0x38, 0x38));
        palette.setColor(QPalette::Text, Qt::white);
        palette.setColor(QPalette::Button, QColor(0x40, 0x40, 0x40));
        palette.setColor(QPalette::ButtonText, Qt::white);
        QApplication::setPalette(palette);
    } else {
        QApplication::setPalette(QApplication::style()->standardPalette());
    }
    auto window = demoWindow(folder);
    window->resize(size);
    window->show();
    window->workspace()->setSimulatedTime(true);
    window->setupForm()->setSessionDetails({QStringLiteral("Layout tester"), QStringLiteral("LT-1"), QStringLiteral("20 °C"), {}});
    window->planPanel()->acceptButton()->click();
    waitUntil([&] { return window->workspace()->readings().size() >= 4; }, 20000);
    window->workspace()->pauseOrResume(); // a paused sweep: the strip at its tallest
    window->flushCharts();
    QTest::qWait(200);
    return window;
}

void checkAtSize(QSize size, bool dark, bool scrollBarsToo)
{
    QTemporaryDir folder;
    auto window = windowDuringASweep(folder.path(), size, dark);
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    EXPECT_EQ(window->size(), size);
    for (int tab : {0, 1, 2}) {
        window->findChild<QTabWidget *>()->setCurrentIndex(tab);
        QTest::qWait(50);
        EXPECT_TRUE(cutShort(window.get()).isEmpty()) << "tab " << tab << ":\n" << joined(cutShort(window.get()));
        EXPECT_TRUE(overlaps(window.get()).isEmpty()) << "tab " << tab << ":\n" << joined(overlaps(window.get()));
        if (scrollBarsToo)
            EXPECT_TRUE(horizontalScrollBars(*window).isEmpty()) << "tab " << tab << ":\n" << joined(horizontalScrollBars(*window));
    }
    QApplication::setPalette(QApplication::style()->standardPalette());
}

} // namespace

TEST(WindowLayout, NothingCutShortAtALaptopSize)
{
    checkAtSize(QSize(1366, 740), false, false);
}

TEST(WindowLayout, NothingCutShortAndNoSideScrollingAt1600)
{
    checkAtSize(QSize(1600, 1000), false, true);
    checkAtSize(QSize(1600, 1000), true, true);
}

TEST(WindowLayout, RemembersTheSizeItWasLeftAt)
{
    QSettings().remove(QStringLiteral("window/geometry"));
    QSize left;
    {
        MainWindow window;
        window.resize(1500, 900);
        left = window.size();
        window.close(); // writes the settings
    }
    const QByteArray saved = QSettings().value(QStringLiteral("window/geometry")).toByteArray();
    ASSERT_FALSE(saved.isEmpty());
    QWidget probe;
    EXPECT_TRUE(probe.restoreGeometry(saved));
    MainWindow again;
    const QSize screen = QGuiApplication::primaryScreen()->availableGeometry().size();
    // Restored as left, unless the screen is smaller than that (then it is fitted to it).
    if (screen.width() >= left.width() && screen.height() >= left.height())
        EXPECT_EQ(again.size(), left);
    else
        EXPECT_GE(again.width(), std::min(screen.width(), again.minimumSizeHint().width()));
    QSettings().remove(QStringLiteral("window/geometry"));
}
