// ui_tests: GoogleTest with a QApplication on the offscreen platform (QT-NOTES §3).
#include <gtest/gtest.h>

#include <QApplication>
#include <QStandardPaths>

int main(int argc, char **argv)
{
    if (!qEnvironmentVariableIsSet("QT_QPA_PLATFORM"))
        qputenv("QT_QPA_PLATFORM", "offscreen");
    ::testing::InitGoogleTest(&argc, argv);
    QApplication app(argc, argv);
    // Settings and documents of the test run never touch the user's own.
    QStandardPaths::setTestModeEnabled(true);
    QApplication::setOrganizationName(QStringLiteral("SaglineTests"));
    QApplication::setApplicationName(QStringLiteral("ui_tests"));
    return RUN_ALL_TESTS();
}
