// Pure parsing of SCPI / IEEE 488.2 replies: numbers (with the SCPI overload and not-a-number
// codes), *IDN? identities and SYSTem:ERRor? entries. No Qt, no exceptions; fuzzed by
// fuzz/ScpiResponseFuzz.cpp.
#pragma once

#include <string>
#include <string_view>

namespace sagline {

enum class ScpiNumberKind {
    Value,      // a finite reading
    Overload,   // +/-9.9E37: SCPI +INFinity / NINFinity, what meters send on overload or overrange
    NotANumber, // 9.91E37: SCPI NAN
    Invalid,    // not a SCPI number; error says why
};

struct ScpiNumber {
    ScpiNumberKind kind = ScpiNumberKind::Invalid;
    double value = 0.0; // set only for Value; never NaN or infinite
    std::string error;  // set only for Invalid: the rule the text broke
};

// SCPI-99 9.9E37 (+INF, overload) and 9.91E37 (NAN), parsed with a tolerance because
// instruments print them with varying digits ("9.90000E+37", "9.9E37", "+9.91000000E+37").
// Source: FACTS.md §8 (public SCPI constants module; NINF = -9.9E37 from memory).
inline constexpr double scpiOverloadValue = 9.9e37;
inline constexpr double scpiNotANumberValue = 9.91e37;

// Parses one reply field: optional surrounding white space, an optional sign, digits with an
// optional '.', an optional exponent (E or e), and an optional unit suffix (V, A, VAC...) as
// some meters append. Also accepts the mnemonics INF, NINF, NAN (any case). The decimal
// separator is '.' only (IEEE 488.2 <NR3>); a ',' separates fields and is refused here.
ScpiNumber parseScpiNumber(std::string_view text);

struct ScpiIdentity {
    bool ok = false;
    std::string manufacturer;
    std::string model;
    std::string serialNumber;     // "0" when the instrument has none (IEEE 488.2)
    std::string firmwareVersion;  // "0" when the instrument has none
    std::string error;            // when !ok

    std::string text() const;     // the four fields joined with ','
};

// *IDN? reply: exactly four comma-separated fields (IEEE 488.2 10.14, from memory; FACTS.md §8).
// Fields are trimmed; manufacturer and model must not be empty.
ScpiIdentity parseScpiIdentity(std::string_view text);

struct ScpiError {
    bool ok = false;      // the reply had the <code>,"<text>" form
    int code = 0;         // 0 (also sent as +0) means the queue is empty
    std::string message;  // the quoted text without quotes ("" doubled quotes undone)
    std::string error;    // when !ok: why the reply is not an error-queue entry

    bool isNoError() const { return ok && code == 0; }
};

// SYSTem:ERRor? reply `<code>,"<text>"`; accepts 0 and +0 for the empty queue, negative
// SCPI-standard codes and positive device codes (FACTS.md §8). A device that omits the
// quotes is tolerated: the rest of the line is the text.
ScpiError parseScpiError(std::string_view text);

// For messages: the raw reply made printable (control bytes as \xNN, at most maxLength bytes).
std::string printableReply(std::string_view raw, std::size_t maxLength = 80);

} // namespace sagline
