// Durability under a crash (after SQLite's test/crash.test idea, with a real process kill):
// a child process records readings and reports each one the store acknowledged; the parent
// kills it with SIGKILL at a random moment, reopens the file, and requires every acknowledged
// reading to be there and PRAGMA integrity_check to pass. Repeated many times on one file, so
// recovery from a hot journal left by the previous kill is exercised as well.
#include "SessionTestSupport.h"

#include <gtest/gtest.h>

#include <chrono>
#include <csignal>
#include <cstdio>
#include <map>
#include <random>
#include <string>
#include <sys/wait.h>
#include <unistd.h>
#include <poll.h>

using namespace sagline;
using sagline::test::TempFolder;

namespace {

// The child: open (or resume) the session, then append until killed. After each append that
// returned an id, write "<sequence> <id>\n" to the pipe with write(2), unbuffered.
[[noreturn]] void runWriter(const std::string &path, int firstSequence, int pipeFd)
{
    auto opened = SessionStore::openForWriting(path);
    if (!opened.ok()) {
        const std::string line = "open-failed " + opened.message + "\n";
        (void)!write(pipeFd, line.data(), line.size());
        _exit(2);
    }
    if (write(pipeFd, "ready\n", 6) != 6)
        _exit(4);
    for (int sequence = firstSequence;; ++sequence) {
        Reading reading;
        reading.step = sequence;
        reading.currentA = sequence * 0.001;
        reading.voltageV = 1000.0 - sequence * 0.01;
        reading.rawText = "seq " + std::to_string(sequence);
        const auto id = opened.value->appendReading(reading);
        if (!id.ok())
            _exit(3);
        const std::string line = std::to_string(sequence) + " " + std::to_string(id.value) + "\n";
        if (write(pipeFd, line.data(), line.size()) != static_cast<ssize_t>(line.size()))
            _exit(4);
    }
}

// Reads complete lines from the pipe until it is closed (the child is dead by then).
std::string drain(int fd)
{
    std::string text;
    char buffer[4096];
    ssize_t got;
    while ((got = read(fd, buffer, sizeof buffer)) > 0)
        text.append(buffer, static_cast<std::size_t>(got));
    return text;
}

} // namespace

TEST(SessionStoreCrash, EveryAcknowledgedReadingSurvivesSigkill)
{
    TempFolder folder;
    const std::string path = folder.file("crash.sagline");
    ASSERT_TRUE(SessionStore::create(path, sagline::test::sampleSession()).ok());

    std::mt19937 random(20261202); // fixed seed: a failure repeats
    std::uniform_int_distribution<int> delayMs(0, 100);
    std::map<int, std::int64_t> acknowledged; // sequence -> row id
    int nextSequence = 0;
    int killsMidWrite = 0;
    int recoveredForReview = 0; // hot journal rolled back in a private copy
    const int rounds = 40;
    for (int round = 0; round < rounds; ++round) {
        int fds[2];
        ASSERT_EQ(pipe(fds), 0);
        const pid_t child = fork();
        ASSERT_GE(child, 0);
        if (child == 0) {
            close(fds[0]);
            runWriter(path, nextSequence, fds[1]);
        }
        close(fds[1]);
        // Most rounds wait until the writer has opened the file (slow under sanitizers or load);
        // every fifth kills it wherever it is, often while it recovers the previous hot journal.
        std::string text;
        if (round % 5 != 4) {
            const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(20);
            while (text.find("ready\n") == std::string::npos && std::chrono::steady_clock::now() < deadline) {
                pollfd poller{fds[0], POLLIN, 0};
                if (poll(&poller, 1, 10) > 0 && (poller.revents & (POLLIN | POLLHUP))) {
                    char buffer[4096];
                    const ssize_t got = read(fds[0], buffer, sizeof buffer);
                    if (got <= 0)
                        break;
                    text.append(buffer, static_cast<std::size_t>(got));
                }
            }
        }
        // Let it write for a random time, reading acknowledgements as they come, then kill it.
        const auto until = std::chrono::steady_clock::now() + std::chrono::milliseconds(delayMs(random));
        while (std::chrono::steady_clock::now() < until) {
            pollfd poller{fds[0], POLLIN, 0};
            if (poll(&poller, 1, 1) > 0 && (poller.revents & POLLIN)) {
                char buffer[4096];
                const ssize_t got = read(fds[0], buffer, sizeof buffer);
                if (got > 0)
                    text.append(buffer, static_cast<std::size_t>(got));
            }
        }
        ASSERT_EQ(kill(child, SIGKILL), 0);
        int status = 0;
        ASSERT_EQ(waitpid(child, &status, 0), child);
        text += drain(fds[0]); // acknowledgements written before the kill are still in the pipe
        close(fds[0]);
        ASSERT_TRUE(WIFSIGNALED(status)) << "writer ended by itself (status " << status << "): " << text;

        std::size_t start = 0;
        while (true) {
            const std::size_t end = text.find('\n', start);
            if (end == std::string::npos)
                break; // a partial line: the kill came mid-write(2); that reading was not acknowledged
            if (text.compare(start, end - start, "ready") == 0) {
                start = end + 1;
                continue;
            }
            int sequence = 0;
            long long id = 0;
            ASSERT_EQ(std::sscanf(text.c_str() + start, "%d %lld", &sequence, &id), 2) << text.substr(start, end - start);
            acknowledged[sequence] = id;
            nextSequence = std::max(nextSequence, sequence + 1);
            start = end + 1;
        }
        if (std::filesystem::exists(path + "-journal")) {
            // A reviewer opening the file now sees every acknowledged reading, and the file and
            // its journal stay byte for byte as the crash left them.
            ++killsMidWrite;
            const std::string fileBefore = sagline::test::fileBytes(path);
            const std::string journalBefore = sagline::test::fileBytes(path + "-journal");
            {
                auto review = SessionStore::openForReview(path);
                ASSERT_TRUE(review.ok()) << "round " << round << ": " << review.message;
                const auto count = review.value->readingCount();
                ASSERT_TRUE(count.ok()) << count.message;
                EXPECT_GE(count.value, static_cast<std::int64_t>(acknowledged.size()));
                if (!review.value->notice().empty())
                    ++recoveredForReview;
            }
            EXPECT_EQ(sagline::test::fileBytes(path), fileBefore);
            EXPECT_EQ(sagline::test::fileBytes(path + "-journal"), journalBefore);
        }

        // Reopen as the app would after a crash and check everything acknowledged is there.
        auto reopened = SessionStore::openForWriting(path);
        ASSERT_TRUE(reopened.ok()) << "round " << round << ": " << reopened.message;
        ASSERT_TRUE(reopened.value->integrityCheck().ok()) << reopened.value->integrityCheck().message;
        const auto readings = reopened.value->readings();
        ASSERT_TRUE(readings.ok()) << readings.message;
        std::map<std::int64_t, const Reading *> byId;
        for (const Reading &reading : readings.value)
            byId[reading.id] = &reading;
        for (const auto &[sequence, id] : acknowledged) {
            const auto found = byId.find(id);
            ASSERT_NE(found, byId.end()) << "round " << round << ": acknowledged reading " << sequence << " (id " << id
                                         << ") is missing";
            EXPECT_EQ(found->second->step, sequence);
            EXPECT_DOUBLE_EQ(found->second->currentA, sequence * 0.001);
        }
        // A reading committed but killed before its acknowledgement may exist; its sequence
        // continues after the ones we know, so the next writer starts after it.
        for (const Reading &reading : readings.value)
            nextSequence = std::max(nextSequence, reading.step + 1);
    }
    EXPECT_GT(acknowledged.size(), static_cast<std::size_t>(rounds / 2)) << "the writer hardly wrote; the test proved little";
    std::printf("[ crash ] %d kills, %zu acknowledged readings, %d left a journal, %d reviews recovered a hot journal\n",
                rounds, acknowledged.size(), killsMidWrite, recoveredForReview);
}
