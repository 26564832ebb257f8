// SCPI / IEEE 488.2 reply parsing. Special values from FACTS.md §8: +INF = 9.9E37 (overload),
// NAN = 9.91E37 (public SCPI constants module); NINF = -9.9E37 (SCPI-99 7.2.1.5, from memory).
#include "ScpiCommand.h"
#include "ScpiResponse.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace sagline;

TEST(ScpiResponse, ParsesEveryDecimalForm)
{
    struct Case {
        const char *text;
        double value;
    };
    for (const Case &c : {Case{"1.23456789E+01", 12.3456789}, Case{"+1.5E-3", 0.0015}, Case{"-2.5e2", -250.0},
                          Case{"  42\r\n", 42.0}, Case{".5", 0.5}, Case{"7.", 7.0}, Case{"1.234VAC", 1.234},
                          Case{"0.145 A", 0.145}, Case{"+0", 0.0}, Case{"#H1F", 31.0}, Case{"#B101", 5.0},
                          Case{"#Q17", 15.0}, Case{"1E-400", 0.0}}) {
        const ScpiNumber n = parseScpiNumber(c.text);
        ASSERT_EQ(n.kind, ScpiNumberKind::Value) << c.text << ": " << n.error;
        EXPECT_DOUBLE_EQ(n.value, c.value) << c.text;
    }
}

TEST(ScpiResponse, OverloadAndNotANumberBecomeKindsWithTolerance)
{
    for (const char *text : {"9.9E37", "9.90000E+37", "+9.90000000E+37", "9.899999E37", "-9.9E37", "INF", "ninf", "1E38", "1E400"})
        EXPECT_EQ(parseScpiNumber(text).kind, ScpiNumberKind::Overload) << text;
    for (const char *text : {"9.91E37", "9.91000000E+37", "9.9100001E37", "NAN", "nan"})
        EXPECT_EQ(parseScpiNumber(text).kind, ScpiNumberKind::NotANumber) << text;
    // Neither is ever a value that could be plotted.
    EXPECT_EQ(parseScpiNumber("9.9E37").value, 0.0);
}

TEST(ScpiResponse, RefusesWhatIsNotOneNumber)
{
    for (const char *text : {"", "   ", "abc", "1,5", "1.5;2.5", "1.2.3", "1e", "--1", "0x1F", "12 volts", "\x01\x02",
                             "#X12", "#H", "#HZZ", "inf1", "1.5V garbage"}) {
        const ScpiNumber n = parseScpiNumber(text);
        EXPECT_EQ(n.kind, ScpiNumberKind::Invalid) << text;
        EXPECT_FALSE(n.error.empty()) << text;
    }
}

TEST(ScpiResponse, IdentityHasFourFields)
{
    // IEEE 488.2 *IDN?: manufacturer, model, serial, firmware; "0" when absent (FACTS.md §8).
    const ScpiIdentity id = parseScpiIdentity("Sagline Virtual Bench, VB-V1 virtual voltmeter ,VB00005,0.1.0\n");
    ASSERT_TRUE(id.ok) << id.error;
    EXPECT_EQ(id.manufacturer, "Sagline Virtual Bench");
    EXPECT_EQ(id.model, "VB-V1 virtual voltmeter");
    EXPECT_EQ(id.serialNumber, "VB00005");
    EXPECT_EQ(id.firmwareVersion, "0.1.0");
    EXPECT_EQ(parseScpiIdentity("ACME,M1,,").serialNumber, "0");
    for (const char *bad : {"", "ACME", "ACME,M1,1", "ACME,M1,1,2,3", ",M1,1,2", "ACME,,1,2"}) {
        const ScpiIdentity b = parseScpiIdentity(bad);
        EXPECT_FALSE(b.ok) << bad;
        EXPECT_FALSE(b.error.empty()) << bad;
    }
}

TEST(ScpiResponse, ErrorQueueAcceptsZeroAndPlusZero)
{
    // Many instruments send +0,"No error" (FACTS.md §8): both forms mean an empty queue.
    EXPECT_TRUE(parseScpiError("0,\"No error\"").isNoError());
    EXPECT_TRUE(parseScpiError("+0,\"No error\"\r\n").isNoError());
    const ScpiError e = parseScpiError("-113,\"Undefined header\"");
    ASSERT_TRUE(e.ok);
    EXPECT_EQ(e.code, -113);
    EXPECT_EQ(e.message, "Undefined header");
    EXPECT_FALSE(e.isNoError());
    const ScpiError quoted = parseScpiError("+201 , \"Say \"\"hi\"\";more\"");
    ASSERT_TRUE(quoted.ok);
    EXPECT_EQ(quoted.code, 201);
    EXPECT_EQ(quoted.message, "Say \"hi\";more");
    EXPECT_EQ(parseScpiError("-222,Data out of range").message, "Data out of range");
    for (const char *bad : {"", "No error", "-113 \"x\"", "-113,\"unterminated", "99999999999,\"x\""})
        EXPECT_FALSE(parseScpiError(bad).ok) << bad;
}

TEST(ScpiResponse, PrintableReplyEscapesControlBytesAndTruncates)
{
    EXPECT_EQ(printableReply(std::string("a\x01\xff", 3)), "a\\x01\\xFF");
    EXPECT_EQ(printableReply(std::string(200, 'x'), 10), std::string(10, 'x') + "...");
}

TEST(ScpiCommand, MatchesLongAndShortFormsInAnyCase)
{
    // SCPI keywords accept the long or short (capital letters) form, any case (FACTS.md §8).
    for (const char *h : {"MEASure:VOLTage:AC?", "MEAS:VOLT:AC?", "meas:volt:ac?", ":MEAS:VOLT:AC?", "Measure:Voltage:Ac?"})
        EXPECT_TRUE(scpiHeaderMatches("MEASure:VOLTage:AC?", h)) << h;
    for (const char *h : {"MEAS:VOLT:AC", "MEAS:VOL:AC?", "MEAS:CURR:AC?", "MEAS::VOLT:AC?", "MEAS:VOLT:AC:EXTRA?"})
        EXPECT_FALSE(scpiHeaderMatches("MEASure:VOLTage:AC?", h)) << h;
    EXPECT_TRUE(scpiHeaderMatches("SYSTem:ERRor[:NEXT]?", "SYST:ERR?"));
    EXPECT_TRUE(scpiHeaderMatches("SYSTem:ERRor[:NEXT]?", "SYSTEM:ERROR:NEXT?"));
    EXPECT_TRUE(scpiHeaderMatches("[SOURce:]RESistance[:LEVel]", "RES"));
    EXPECT_TRUE(scpiHeaderMatches("[SOURce:]RESistance[:LEVel]", "SOUR:RES:LEV"));
    EXPECT_FALSE(scpiHeaderMatches("[SOURce:]RESistance[:LEVel]", "RES?"));
    EXPECT_TRUE(scpiHeaderMatches("*IDN?", "*idn?"));
    EXPECT_FALSE(scpiHeaderMatches("*IDN?", "*IDN"));
}

TEST(ScpiCommand, SplitsProgramMessagesAtSemicolonsOutsideQuotes)
{
    // Chained queries with ';:' (FACTS.md §8).
    const auto units = splitScpiMessage("MEASure:VOLTage:DC?;:MEASure:CURRent:AC?; DISP:TEXT \"a;b\"");
    ASSERT_EQ(units.size(), 3u);
    EXPECT_EQ(units[0].header, "MEASure:VOLTage:DC?");
    EXPECT_EQ(units[1].header, ":MEASure:CURRent:AC?");
    EXPECT_EQ(units[2].header, "DISP:TEXT");
    EXPECT_EQ(units[2].parameters, "\"a;b\"");
}
