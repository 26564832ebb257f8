// The mouse wheel scrolls the setup form; it never changes a combo box it passes over (the
// fuse type once turned from time-lag to quick-acting that way). A control the person has
// clicked or tabbed into takes the wheel as usual.
#include "UiTestSupport.h"

#include "WheelGuard.h"

#include <gtest/gtest.h>

#include <QComboBox>
#include <QScrollArea>
#include <QSpinBox>
#include <QWheelEvent>

using namespace sagline;
using namespace sagline::test;

namespace {

void wheelOver(QWidget *widget, int steps)
{
    const QPointF at(widget->width() / 2.0, widget->height() / 2.0);
    QWheelEvent wheel(at, widget->mapToGlobal(at), QPoint(), QPoint(0, -120 * steps), Qt::NoButton, Qt::NoModifier,
                      Qt::NoScrollPhase, false);
    QApplication::sendEvent(widget, &wheel);
}

QComboBox *comboNamed(QWidget *root, const QString &accessibleName)
{
    for (QComboBox *combo : root->findChildren<QComboBox *>()) {
        if (combo->accessibleName() == accessibleName)
            return combo;
    }
    return nullptr;
}

} // namespace

TEST(WheelGuard, ScrollingTheSetupFormLeavesTheFuseTypeAlone)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->resize(1366, 768);
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    QComboBox *fuseType = comboNamed(window.get(), QStringLiteral("bench.fuse.type"));
    ASSERT_NE(fuseType, nullptr);
    const int before = fuseType->currentIndex();
    auto *scroll = qobject_cast<QScrollArea *>(window->setupForm()->parentWidget()->parentWidget());
    ASSERT_NE(scroll, nullptr);
    scroll->ensureWidgetVisible(fuseType);
    fuseType->clearFocus();
    wheelOver(fuseType, 1);
    EXPECT_EQ(fuseType->currentIndex(), before);
    // (A real wheel event then goes on to the scroll area; one sent by a test is not passed on
    // to parents by QApplication, so the page's scrolling is not checked here.)

    fuseType->setFocus();
    ASSERT_TRUE(waitUntil([&] { return fuseType->hasFocus(); }, 2000));
    wheelOver(fuseType, 1);
    EXPECT_NE(fuseType->currentIndex(), before); // focused: the person means it
}

TEST(WheelGuard, EveryComboAndSpinBoxOfTheWindowIsGuarded)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    for (QComboBox *combo : window->findChildren<QComboBox *>()) {
        EXPECT_EQ(combo->focusPolicy(), Qt::StrongFocus) << combo->accessibleName().toStdString();
        const int before = combo->currentIndex();
        if (combo->count() < 2)
            continue;
        wheelOver(combo, before == 0 ? 1 : -1);
        EXPECT_EQ(combo->currentIndex(), before) << combo->accessibleName().toStdString();
    }
    // A spin box added later is guarded when its panel is guarded again.
    auto *spin = new QSpinBox(window->setupForm());
    spin->setRange(0, 10);
    guardWheelInside(window.get());
    wheelOver(spin, 1);
    EXPECT_EQ(spin->value(), 0);
}
