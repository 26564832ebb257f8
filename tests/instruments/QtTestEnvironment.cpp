// A QCoreApplication for the whole instruments_tests run (GoogleTest's main creates none).
#include <QCoreApplication>

#include <gtest/gtest.h>

namespace {

class QtEnvironment final : public ::testing::Environment {
public:
    void SetUp() override
    {
        if (!QCoreApplication::instance())
            m_app = new QCoreApplication(m_argc, m_argv);
    }
    void TearDown() override
    {
        delete m_app;
        m_app = nullptr;
    }

private:
    int m_argc = 1;
    char m_name[32] = "instruments_tests";
    char *m_argv[2] = {m_name, nullptr};
    QCoreApplication *m_app = nullptr;
};

const auto *registered = ::testing::AddGlobalTestEnvironment(new QtEnvironment);

} // namespace
