// The file dialogs open in a folder that exists: the session folder before the first sweep has
// made it is not offered as a file name (seen: the Open dialog's name box read "Sagline sessions").
#include "NearestFolder.h"

#include <gtest/gtest.h>

#include <QDir>
#include <QTemporaryDir>

using sagline::nearestExistingFolder;

TEST(NearestFolder, AFolderNotYetMadeOpensItsNearestExistingParent)
{
    QTemporaryDir scratch;
    ASSERT_TRUE(scratch.isValid());
    const QString root = QDir(scratch.path()).absolutePath();
    EXPECT_EQ(nearestExistingFolder(root), root);
    EXPECT_EQ(nearestExistingFolder(root + QStringLiteral("/Sagline sessions")), root);
    EXPECT_EQ(nearestExistingFolder(root + QStringLiteral("/not/yet/made")), root);
    ASSERT_TRUE(QDir(root).mkdir(QStringLiteral("made")));
    EXPECT_EQ(nearestExistingFolder(root + QStringLiteral("/made/Sagline sessions")), root + QStringLiteral("/made"));
    EXPECT_EQ(nearestExistingFolder(QString()), QDir::homePath());
}
