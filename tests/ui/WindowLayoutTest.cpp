// The bench window at working sizes, after a virtual-bench sweep with the primary side (so the
// efficiency chart is shown too), on each left-hand tab: the window keeps the size it was given,
// no label or button is cut short (its text is compared with what its width can show), the
// tables and the results column need no horizontal scroll bar, and no two neighbouring widgets
// overlap. ctest runs it again with QT_SCALE_FACTOR=1.5 (WindowLayoutAtScale1_5).
#include "UiTestSupport.h"

#include "DemoSweep.h"
#include "ElidedLabel.h"
#include "EfficiencyChart.h"
#include "PlanPanel.h"

#include <gtest/gtest.h>

#include <QAbstractButton>
#include <QPushButton>
#include <QHeaderView>
#include <QAbstractScrollArea>
#include <QLabel>
#include <QScrollBar>
#include <QSplitter>
#include <QStatusBar>
#include <QTabWidget>
#include <QTableView>
#include <QLayout>
#include <QTextDocument>
#include <QTextEdit>

#include <string>
#include <vector>

using namespace sagline;
using namespace sagline::test;

namespace {

std::string describe(const QWidget *widget)
{
    std::string path;
    for (const QWidget *w = widget; w; w = w->parentWidget()) {
        const QString name = w->objectName().isEmpty() ? QString::fromLatin1(w->metaObject()->className()) : w->objectName();
        path = name.toStdString() + (path.empty() ? "" : "/" + path);
        if (w->isWindow())
            break;
    }
    return path;
}

bool insideStatusBar(const QWidget *widget)
{
    for (const QWidget *w = widget; w; w = w->parentWidget())
        if (qobject_cast<const QStatusBar *>(w))
            return true; // the status bar's fields shorten with "…" by design (whole text as tooltip)
    return false;
}

// Text a label shows cut short: a one-line text wider than the label, or wrapped text taller.
std::vector<std::string> cutLabels(QWidget *window)
{
    std::vector<std::string> cut;
    for (QLabel *label : window->findChildren<QLabel *>()) {
        if (!label->isVisibleTo(window) || label->text().isEmpty() || insideStatusBar(label))
            continue;
        if (auto *elided = qobject_cast<ElidedLabel *>(label)) {
            if (elided->text() != elided->fullText())
                cut.push_back(describe(label) + ": \"" + elided->fullText().toStdString() + "\" shown as \""
                              + elided->text().toStdString() + "\"");
            continue;
        }
        // Wrapped or rich text: the height it needs at its width (margins and padding included)
        // against its height; one plain line: the text's width against the room inside.
        QSize needed;
        QSize room;
        if (label->wordWrap() || Qt::mightBeRichText(label->text())) {
            room = label->size();
            needed = label->wordWrap() ? QSize(room.width(), label->heightForWidth(room.width())) : label->sizeHint();
        } else {
            room = label->contentsRect().size() - QSize(2 * label->margin(), 2 * label->margin());
            needed = label->fontMetrics().size(Qt::TextShowMnemonic, label->text());
        }
        if (needed.width() > room.width() + 1 || needed.height() > room.height() + 1)
            cut.push_back(describe(label) + ": \"" + label->text().left(80).toStdString() + "\" needs "
                          + std::to_string(needed.width()) + "x" + std::to_string(needed.height()) + ", has "
                          + std::to_string(room.width()) + "x" + std::to_string(room.height()));
    }
    for (QAbstractButton *button : window->findChildren<QAbstractButton *>()) {
        if (!button->isVisibleTo(window) || button->text().isEmpty() || insideStatusBar(button))
            continue;
        if (button->sizeHint().width() > button->width() + 1)
            cut.push_back(describe(button) + ": button \"" + button->text().toStdString() + "\" needs "
                          + std::to_string(button->sizeHint().width()) + ", has " + std::to_string(button->width()));
    }
    return cut;
}

// Scroll areas (tables, the results column, the setup form) that need a horizontal scroll bar.
std::vector<std::string> sidewaysScrolling(QWidget *window)
{
    std::vector<std::string> scrolling;
    for (QAbstractScrollArea *area : window->findChildren<QAbstractScrollArea *>()) {
        if (!area->isVisibleTo(window) || qobject_cast<QTextEdit *>(area))
            continue;
        // A table whose columns run past its viewport hides them even when its scroll bar is off.
        const auto *table = qobject_cast<QTableView *>(area);
        const int pastTheEdge = table ? table->horizontalHeader()->length() - table->viewport()->width() : 0;
        if (area->horizontalScrollBar()->maximum() > 0 || pastTheEdge > 1)
        {
            std::string sections;
            if (table)
                for (int c = 0; c < table->model()->columnCount(); ++c)
                    if (!table->isColumnHidden(c))
                        sections += std::to_string(table->columnWidth(c)) + " ";
            scrolling.push_back(describe(area) + ": scrolls sideways by "
                                + std::to_string(area->horizontalScrollBar()->maximum()) + " px; width "
                                + std::to_string(area->width()) + ", viewport " + std::to_string(area->viewport()->width())
                                + ", columns " + sections);
        }
    }
    return scrolling;
}

// Visible siblings laid out in the same parent whose rectangles cross.
std::vector<std::string> overlaps(QWidget *window)
{
    std::vector<std::string> crossing;
    for (QWidget *parent : window->findChildren<QWidget *>()) {
        if (!parent->isVisibleTo(window) || !parent->layout())
            continue;
        std::vector<QWidget *> children;
        for (int i = 0; i < parent->layout()->count(); ++i)
            if (QWidget *child = parent->layout()->itemAt(i)->widget(); child && child->isVisibleTo(window))
                children.push_back(child);
        for (std::size_t a = 0; a < children.size(); ++a)
            for (std::size_t b = a + 1; b < children.size(); ++b)
                if (children[a]->geometry().intersects(children[b]->geometry()))
                    crossing.push_back(describe(children[a]) + " crosses " + describe(children[b]));
    }
    return crossing;
}

std::string joined(const std::vector<std::string> &lines)
{
    std::string all;
    for (const auto &line : lines)
        all += "\n  " + line;
    return all;
}

void checkAtSize(const QSize size)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->resize(size);
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    const DemoResult demo = runVirtualBenchDemo(*window, 5); // paused mid-sweep: strip, verdict and tables full
    ASSERT_TRUE(demo.ok) << demo.message.toStdString();
    window->flushCharts();
    ASSERT_TRUE(waitUntil([&] { return window->efficiencyOffered(); }, 10000));
    auto *tabs = window->findChild<QTabWidget *>();
    for (int shown = 0; shown < 2 * tabs->count(); ++shown) { // each left tab, with each chart under the V–I chart
        const int tab = shown % tabs->count();
        tabs->setCurrentIndex(tab);
        window->lowerCharts()->setCurrentIndex(shown / tabs->count());
        QTest::qWait(50);
        QApplication::processEvents();
        const std::string where = std::to_string(size.width()) + "x" + std::to_string(size.height()) + ", tab "
                                  + tabs->tabText(tab).toStdString() + ", "
                                  + window->lowerCharts()->tabText(shown / tabs->count()).toStdString();
        std::string widths;
        for (QSplitter *splitter : window->findChildren<QSplitter *>()) {
            widths += "\n  splitter " + std::to_string(splitter->minimumSizeHint().width()) + ": ";
            for (int i = 0; i < splitter->count(); ++i)
                widths += describe(splitter->widget(i)) + " "
                          + std::to_string(std::max(splitter->widget(i)->minimumSizeHint().width(),
                                                    splitter->widget(i)->minimumWidth()))
                          + "; ";
        }
        EXPECT_LE(window->width(), size.width()) << where << ": the window grew; minimum widths:" << widths;
        std::string heights;
        for (QWidget *w : window->findChildren<QWidget *>())
            if (w->isVisibleTo(window.get()) && w->minimumSizeHint().expandedTo(w->minimumSize()).height() > 150)
                heights += "\n  " + describe(w) + " " + std::to_string(w->minimumSizeHint().expandedTo(w->minimumSize()).height());
        EXPECT_LE(window->height(), size.height()) << where << ": the window grew; minimum heights:" << heights;
        const auto cut = cutLabels(window.get());
        EXPECT_TRUE(cut.empty()) << where << ", text cut short:" << joined(cut);
        const auto sideways = sidewaysScrolling(window.get());
        EXPECT_TRUE(sideways.empty()) << where << ":" << joined(sideways);
        const auto crossing = overlaps(window.get());
        EXPECT_TRUE(crossing.empty()) << where << ":" << joined(crossing);
    }
}

} // namespace

// 1366 × 768 less a task bar; 1600 × 1000. At QT_SCALE_FACTOR=1.5 the same logical sizes stand
// for 2049 × 1110 and 2400 × 1500 screens.
TEST(WindowLayout, NothingIsCutShortOrScrolledSidewaysAt1366x740) { checkAtSize(QSize(1366, 740)); }

TEST(WindowLayout, NothingIsCutShortOrScrolledSidewaysAt1600x1000) { checkAtSize(QSize(1600, 1000)); }

// The plan panel shows the columns the bench acts on; "Every column…" opens the whole step
// table in a window wide enough for all of them.
TEST(WindowLayout, EveryPlanColumnIsOneClickAway)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    QTableView *panelTable = window->planPanel()->table();
    int hidden = 0;
    for (int column = 0; column < panelTable->model()->columnCount(); ++column)
        hidden += panelTable->isColumnHidden(column) ? 1 : 0;
    EXPECT_GT(hidden, 0);
    window->findChild<QTabWidget *>()->setCurrentIndex(1);
    QTest::qWait(50);
    // Each shown column lies inside the table, with its header and its cells' text.
    for (int column = 0; column < panelTable->model()->columnCount(); ++column) {
        if (panelTable->isColumnHidden(column))
            continue;
        const int left = panelTable->columnViewportPosition(column);
        const int width = panelTable->columnWidth(column);
        EXPECT_GE(left, 0) << column;
        EXPECT_LE(left + width, panelTable->viewport()->width()) << column;
        EXPECT_GT(width, panelTable->fontMetrics().horizontalAdvance(panelTable->model()->index(1, column).data().toString()))
            << column << " " << panelTable->model()->index(1, column).data().toString().toStdString();
        EXPECT_FALSE(panelTable->model()->headerData(column, Qt::Horizontal).toString().isEmpty()) << column;
    }
    QTest::mouseClick(window->planPanel()->everyColumnButton(), Qt::LeftButton);
    QWidget *dialog = window->planPanel()->everyColumnDialog();
    ASSERT_NE(dialog, nullptr);
    ASSERT_TRUE(QTest::qWaitForWindowExposed(dialog));
    auto *table = dialog->findChild<QTableView *>();
    ASSERT_NE(table, nullptr);
    for (int column = 0; column < table->model()->columnCount(); ++column)
        EXPECT_FALSE(table->isColumnHidden(column)) << column;
    EXPECT_EQ(table->horizontalScrollBar()->maximum(), 0) << "the dialog needs a sideways scroll bar";
    dialog->close();
}
