// Everything a program prints for people passes through this filter: text from files, sessions
// and meters (an operator's name, a *IDN? reply, a setup value) reaches the terminal as valid
// UTF-8 with control characters shown (\x1B), never obeyed, so a hostile file cannot recolour,
// move or clear the terminal. Lines are passed on whole; line breaks stay line breaks.
#pragma once

#include <ostream>
#include <streambuf>
#include <string>

namespace sagline {

class PrintableOutput : private std::streambuf {
public:
    // Filters `stream` until this object goes (the stream's buffer is restored then).
    explicit PrintableOutput(std::ostream &stream);
    ~PrintableOutput() override;
    PrintableOutput(const PrintableOutput &) = delete;
    PrintableOutput &operator=(const PrintableOutput &) = delete;

private:
    int overflow(int c) override;
    std::streamsize xsputn(const char *text, std::streamsize count) override;
    int sync() override;
    void emitLines(bool all);

    std::ostream &m_stream;
    std::streambuf *m_target;
    std::string m_pending;
};

} // namespace sagline
