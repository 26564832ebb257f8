#include "NaturalOrder.h"

namespace sagline {

namespace {

bool isDigit(char c) { return c >= '0' && c <= '9'; }

} // namespace

bool naturalLess(std::string_view a, std::string_view b)
{
    std::size_t i = 0, j = 0;
    while (i < a.size() && j < b.size()) {
        if (isDigit(a[i]) && isDigit(b[j])) {
            std::size_t ei = i, ej = j;
            while (ei < a.size() && isDigit(a[ei]))
                ++ei;
            while (ej < b.size() && isDigit(b[ej]))
                ++ej;
            while (i + 1 < ei && a[i] == '0') // leading zeros say nothing of the value
                ++i;
            while (j + 1 < ej && b[j] == '0')
                ++j;
            const std::string_view x = a.substr(i, ei - i);
            const std::string_view y = b.substr(j, ej - j);
            if (x.size() != y.size())
                return x.size() < y.size(); // more digits, larger number
            if (x != y)
                return x < y;
            i = ei;
            j = ej;
            continue;
        }
        if (a[i] != b[j])
            return static_cast<unsigned char>(a[i]) < static_cast<unsigned char>(b[j]);
        ++i;
        ++j;
    }
    return a.size() - i < b.size() - j;
}

} // namespace sagline
