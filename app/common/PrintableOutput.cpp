#include "PrintableOutput.h"

#include "OutputText.h"

#include <string_view>

namespace sagline {

namespace {
constexpr std::size_t maxPendingBytes = 64 * 1024; // a line longer than this is passed on in parts

// Printable ASCII: what printableText passes on unchanged.
bool isPlainByte(char c)
{
    return c >= 0x20 && c < 0x7F;
}

// Whether `text` is plain ASCII and line breaks only (what the filter passes on as it is). In
// blocks of a fixed 32 bytes without an early exit, which the compiler turns into vector
// compares: a 200 MB JSON document is checked in a few tens of milliseconds.
bool isPlainLines(std::string_view text)
{
    constexpr std::size_t block = 32;
    const auto *bytes = reinterpret_cast<const unsigned char *>(text.data());
    std::size_t i = 0;
    for (; i + block <= text.size(); i += block) {
        unsigned char other = 0;
        for (std::size_t k = 0; k < block; ++k) {
            const unsigned char c = bytes[i + k];
            other |= static_cast<unsigned char>((c < 0x20 && c != '\n') | (c >= 0x7F));
        }
        if (other)
            return false;
    }
    for (; i < text.size(); ++i)
        if (!isPlainByte(text[i]) && text[i] != '\n')
            return false;
    return true;
}
} // namespace

PrintableOutput::PrintableOutput(std::ostream &stream) : m_stream(stream), m_target(stream.rdbuf(this)) {}

PrintableOutput::~PrintableOutput()
{
    emitLines(true);
    m_stream.rdbuf(m_target);
}

int PrintableOutput::overflow(int c)
{
    if (c == traits_type::eof())
        return sync() == 0 ? 0 : traits_type::eof();
    m_pending += static_cast<char>(c);
    if (c == '\n' || m_pending.size() >= maxPendingBytes)
        emitLines(m_pending.size() >= maxPendingBytes);
    return c;
}

std::streamsize PrintableOutput::xsputn(const char *text, std::streamsize count)
{
    // Whole lines of plain ASCII (a streamed JSON array of numbers) go on from the caller's
    // buffer, without a copy into m_pending: they are what printableText would make of them.
    const std::string_view view(text, static_cast<std::size_t>(count));
    const std::size_t lastBreak = view.rfind('\n');
    if (lastBreak != std::string_view::npos && isPlainLines(m_pending) && isPlainLines(view.substr(0, lastBreak))) {
        m_target->sputn(m_pending.data(), static_cast<std::streamsize>(m_pending.size()));
        m_target->sputn(text, static_cast<std::streamsize>(lastBreak + 1));
        m_pending.assign(view.substr(lastBreak + 1));
        if (m_pending.size() >= maxPendingBytes)
            emitLines(true);
        return count;
    }
    m_pending.append(text, static_cast<std::size_t>(count));
    if (m_pending.find('\n') != std::string::npos || m_pending.size() >= maxPendingBytes)
        emitLines(m_pending.size() >= maxPendingBytes);
    return count;
}

int PrintableOutput::sync()
{
    emitLines(true);
    return m_target->pubsync();
}

// Passes on every complete line (all of it when `all`), made printable; a line break ends each.
// Runs of lines of plain ASCII go on in one write, as they are (printableText would copy them
// unchanged): a million-line JSON document costs one scan, not a copy per character.
void PrintableOutput::emitLines(bool all)
{
    const auto write = [this](std::string_view text) {
        m_target->sputn(text.data(), static_cast<std::streamsize>(text.size()));
    };
    const std::string_view pending = m_pending;
    std::size_t start = 0;     // first byte not yet passed on
    std::size_t lineStart = 0; // first byte after the last line break seen
    bool plainLine = true;
    for (std::size_t i = 0; i < pending.size(); ++i) {
        const char c = pending[i];
        if (isPlainByte(c))
            continue;
        if (c != '\n') {
            plainLine = false;
            continue;
        }
        if (!plainLine) {
            write(pending.substr(start, lineStart - start));
            write(printableText(pending.substr(lineStart, i - lineStart)) + '\n');
            start = i + 1;
            plainLine = true;
        }
        lineStart = i + 1;
    }
    write(pending.substr(start, lineStart - start));
    m_pending.erase(0, lineStart);
    if (all && !m_pending.empty()) {
        write(printableText(m_pending));
        m_pending.clear();
    }
}

} // namespace sagline
