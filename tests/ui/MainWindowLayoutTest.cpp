// The window must fit an ordinary laptop screen (1366 × 768) and show every panel.
#include "UiTestSupport.h"

#include "CautionStrip.h"
#include "NextStepStrip.h"

#include <gtest/gtest.h>

#include <QSplitter>

using namespace sagline;
using namespace sagline::test;

TEST(MainWindowLayout, FitsAnOrdinaryLaptopScreen)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    const QSize minimum = window->minimumSizeHint().expandedTo(window->minimumSize());
    std::string parts;
    for (QWidget *child : window->findChildren<QWidget *>(Qt::FindDirectChildrenOnly))
        parts += child->metaObject()->className() + std::string(" ") + std::to_string(child->minimumSizeHint().width()) + "; ";
    parts += "strip " + std::to_string(window->nextStep()->minimumSizeHint().width()) + "; ";
    for (QSplitter *splitter : window->findChildren<QSplitter *>()) {
        parts += "splitter " + std::to_string(splitter->minimumSizeHint().width()) + " [";
        for (int i = 0; i < splitter->count(); ++i)
            parts += splitter->widget(i)->metaObject()->className() + std::string(" ")
                     + std::to_string(std::max(splitter->widget(i)->minimumSizeHint().width(), splitter->widget(i)->minimumWidth())) + ", ";
        parts += "]; ";
    }
    EXPECT_LE(minimum.width(), 1366) << parts;
    EXPECT_LE(minimum.height(), 740) << minimum.height();
}
