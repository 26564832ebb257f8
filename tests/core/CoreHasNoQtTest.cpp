// Layering rule of DESIGN.md: core is plain C++ and never includes a Qt header.
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <regex>
#include <string>

namespace fs = std::filesystem;

TEST(CoreLayering, NoCoreFileIncludesAQtHeader)
{
    const fs::path coreDir = fs::path(SAGLINE_SOURCE_DIR) / "core";
    ASSERT_TRUE(fs::is_directory(coreDir)) << coreDir;
    // <QString>, <QtCore/...>, "qglobal.h": any Qt include, angle or quote form.
    const std::regex qtInclude(R"(^\s*#\s*include\s*[<"](Q[A-Za-z]|Qt[A-Za-z]*/|q[a-z]+\.h))");
    int filesChecked = 0;
    for (const auto &entry : fs::recursive_directory_iterator(coreDir)) {
        if (!entry.is_regular_file())
            continue;
        const auto ext = entry.path().extension().string();
        if (ext != ".h" && ext != ".cpp" && ext != ".c" && ext != ".in")
            continue;
        ++filesChecked;
        std::ifstream in(entry.path());
        std::string line;
        int lineNumber = 0;
        while (std::getline(in, line)) {
            ++lineNumber;
            EXPECT_FALSE(std::regex_search(line, qtInclude))
                << entry.path().string() << ":" << lineNumber << " includes Qt: " << line;
        }
    }
    EXPECT_GT(filesChecked, 0);
}

TEST(CoreLayering, CoreTargetDoesNotLinkQt)
{
    std::ifstream in(fs::path(SAGLINE_SOURCE_DIR) / "core" / "CMakeLists.txt");
    ASSERT_TRUE(in.good());
    const std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
    EXPECT_EQ(text.find("Qt6::"), std::string::npos) << "core/CMakeLists.txt links a Qt target";
}
