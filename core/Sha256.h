// SHA-256 (FIPS 180-4, "Secure Hash Standard", NIST 2015, §6.2), plain C++ for sealing a
// signed-off session: the digest of its content is stored with the sign-off and compared later.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>

namespace sagline {

class Sha256 {
public:
    Sha256();
    // Feeds bytes; may be called any number of times before digest().
    void update(std::string_view bytes);
    void update(const std::uint8_t *bytes, std::size_t count);
    // Pads and finishes; the object is spent afterwards (reset() to reuse it).
    std::array<std::uint8_t, 32> digest();
    // The digest as 64 lower-case hexadecimal characters.
    std::string hexDigest();
    void reset();

private:
    void compressBlock(const std::uint8_t *block);

    std::array<std::uint32_t, 8> m_state{};
    std::array<std::uint8_t, 64> m_block{};
    std::size_t m_blockUsed = 0;
    std::uint64_t m_totalBytes = 0;
};

// SHA-256 of `bytes` in hexadecimal, in one call.
std::string sha256Hex(std::string_view bytes);

} // namespace sagline
