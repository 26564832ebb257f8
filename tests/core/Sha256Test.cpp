// SHA-256 against the example vectors NIST publishes for FIPS 180-4 (csrc.nist.gov, "Examples
// with Intermediate Values", SHA256.pdf and SHA2_Additional.pdf; also the CAVP SHAVS short and
// long message files). The digests below are copied from those documents.
#include "Sha256.h"

#include <gtest/gtest.h>

#include <string>

namespace {

TEST(Sha256, HashesTheOneBlockExampleAbc)
{
    // FIPS 180-4 example "abc" (SHA256.pdf, one-block message).
    EXPECT_EQ(sagline::sha256Hex("abc"), "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
}

TEST(Sha256, HashesTheEmptyMessage)
{
    // CAVP SHA256ShortMsg, Len = 0 (also SHA2_Additional.pdf, #1: 0 bytes).
    EXPECT_EQ(sagline::sha256Hex(""), "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

TEST(Sha256, HashesTheTwoBlockExample)
{
    // FIPS 180-4 example, 448-bit message (SHA256.pdf, two-block message).
    EXPECT_EQ(sagline::sha256Hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq"),
              "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
}

TEST(Sha256, HashesAMillionLetterA)
{
    // SHA2_Additional.pdf, #7 for SHA-256: 1 000 000 bytes of 'a', fed in pieces of
    // uneven length so block boundaries fall inside update() calls.
    sagline::Sha256 hash;
    const std::string piece(997, 'a');
    std::size_t left = 1000000;
    while (left > 0) {
        const std::size_t take = std::min(left, piece.size());
        hash.update(std::string_view(piece).substr(0, take));
        left -= take;
    }
    EXPECT_EQ(hash.hexDigest(), "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
}

TEST(Sha256, HashesTheCavpOneByteMessage)
{
    // CAVP SHA256ShortMsg, Len = 8, Msg = d3.
    const std::string message(1, static_cast<char>(0xd3));
    EXPECT_EQ(sagline::sha256Hex(message), "28969cdfa74a12c82f3bad960b0b000aca2ac329deea5c2328ebc6f2ba9802c1");
}

TEST(Sha256, PaddingEdgeLengthsDifferFromTheirNeighbours)
{
    // 55, 56 and 64 bytes sit on the padding boundaries; each must give its own digest, and
    // the same digest whether fed at once or byte by byte.
    for (std::size_t length : {55u, 56u, 63u, 64u, 65u}) {
        const std::string message(length, 'x');
        sagline::Sha256 byByte;
        for (char c : message)
            byByte.update(std::string_view(&c, 1));
        EXPECT_EQ(byByte.hexDigest(), sagline::sha256Hex(message)) << length;
        EXPECT_NE(sagline::sha256Hex(message), sagline::sha256Hex(message + "x")) << length;
    }
}

} // namespace
