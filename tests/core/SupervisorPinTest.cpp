// PBKDF2-HMAC-SHA-256 against published test vectors, and the supervisor's PIN lock built on it.
#include "SupervisorPin.h"

#include <gtest/gtest.h>

using namespace sagline;

TEST(SupervisorPin, Pbkdf2MatchesThePublishedTestVectors)
{
    // RFC 7914 (scrypt) §11, the PBKDF2-HMAC-SHA256 test vectors; also reproduced here with
    // Python's hashlib.pbkdf2_hmac, an independent implementation.
    EXPECT_EQ(toHex(pbkdf2HmacSha256("passwd", "salt", 1, 64)),
              "55ac046e56e3089fec1691c22544b605f94185216dde0465e68b9d57c20dacbc"
              "49ca9cccf179b645991664b39d77ef317c71b845b1e30bd509112041d3a19783");
    EXPECT_EQ(toHex(pbkdf2HmacSha256("Password", "NaCl", 80000, 64)),
              "4ddcd8f60b98be21830cee5ef22701f9641a4418d04c0414aeff08876b34ab56"
              "a1d425a1225833549adb841b51c9b3176a272bdebba1d078478f62b397f33c8d");
}

TEST(SupervisorPin, LockOpensOnlyWithItsPin)
{
    const std::vector<std::uint8_t> salt(16, 0x5a);
    const SupervisorPinLock lock = makeSupervisorPinLock("2468", salt, 2000);
    EXPECT_EQ(lock.saltHex, "5a5a5a5a5a5a5a5a5a5a5a5a5a5a5a5a");
    EXPECT_EQ(lock.hashHex.size(), 64u);
    EXPECT_EQ(lock.hashHex.find("2468"), std::string::npos);
    EXPECT_TRUE(supervisorPinMatches(lock, "2468"));
    EXPECT_FALSE(supervisorPinMatches(lock, "2469"));
    EXPECT_FALSE(supervisorPinMatches(lock, ""));
    SupervisorPinLock broken = lock;
    broken.saltHex = "zz";
    EXPECT_FALSE(supervisorPinMatches(broken, "2468"));
    broken = lock;
    broken.scheme = "md5";
    EXPECT_FALSE(supervisorPinMatches(broken, "2468"));
    // A fresh salt each time: the same PIN gives another hash.
    EXPECT_NE(makeSupervisorPinLock("2468").hashHex, makeSupervisorPinLock("2468").hashHex);
}

TEST(SupervisorPin, PinRules)
{
    EXPECT_EQ(supervisorPinError("2468"), "");
    EXPECT_EQ(supervisorPinError("123456789012"), "");
    EXPECT_NE(supervisorPinError("123"), "");
    EXPECT_NE(supervisorPinError("1234567890123"), "");
    EXPECT_NE(supervisorPinError("12a4"), "");
    EXPECT_NE(supervisorPinError(" 2468"), "");
}

TEST(SupervisorPin, HexRoundTrip)
{
    const std::vector<std::uint8_t> bytes = {0x00, 0x0f, 0xa5, 0xff};
    EXPECT_EQ(toHex(bytes), "000fa5ff");
    EXPECT_EQ(fromHex("000FA5ff"), bytes);
    EXPECT_FALSE(fromHex("abc").has_value());
    EXPECT_FALSE(fromHex("zz").has_value());
}
