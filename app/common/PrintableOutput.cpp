#include "PrintableOutput.h"

#include "OutputText.h"

namespace sagline {

namespace {
constexpr std::size_t maxPendingBytes = 64 * 1024; // a line longer than this is passed on in parts
}

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
void PrintableOutput::emitLines(bool all)
{
    std::size_t start = 0;
    for (std::size_t end = m_pending.find('\n'); end != std::string::npos; end = m_pending.find('\n', start)) {
        const std::string line = printableText(std::string_view(m_pending).substr(start, end - start)) + '\n';
        m_target->sputn(line.data(), static_cast<std::streamsize>(line.size()));
        start = end + 1;
    }
    m_pending.erase(0, start);
    if (all && !m_pending.empty()) {
        const std::string rest = printableText(m_pending);
        m_target->sputn(rest.data(), static_cast<std::streamsize>(rest.size()));
        m_pending.clear();
    }
}

} // namespace sagline
