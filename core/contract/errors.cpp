// Hedgeleaf contract: message text and field paths (see errors.hpp).
#include "contract/errors.hpp"

#include <cmath>
#include <cstdio>
#include <cstdlib>

namespace hedgeleaf {

std::string shorten(const std::string& text, std::size_t bytes) {
    if (text.size() <= bytes) return text;
    // Back off UTF-8 continuation bytes (10xxxxxx) so no character is cut in half.
    while (bytes > 0 && (static_cast<unsigned char>(text[bytes]) & 0xC0) == 0x80) --bytes;
    return text.substr(0, bytes);
}

std::string one_line(const std::string& text) {
    std::string out;
    out.reserve(text.size());
    for (const char c : text) {
        const auto u = static_cast<unsigned char>(c);
        if (c == '\n')
            out += "\\n";
        else if (c == '\r')
            out += "\\r";
        else if (c == '\t')
            out += "\\t";
        else if (u < 0x20 || u == 0x7f) {
            char buf[8];
            std::snprintf(buf, sizeof buf, "\\u%04x", u);
            out += buf;
        } else {
            out += c;
        }
    }
    return out;
}

std::string format_number(double x) {
    if (std::isnan(x)) return "NaN";
    if (std::isinf(x)) return x > 0 ? "infinity" : "-infinity";
    // Shortest text that reads back exactly, up to 12 significant digits: what a person typed
    // comes back as typed, and a computed 9.999999999999998 reads 10.
    char buf[40];
    for (int precision = 6; precision <= 12; ++precision) {
        std::snprintf(buf, sizeof buf, "%.*g", precision, x);
        if (std::strtod(buf, nullptr) == x) break;
    }
    return buf;
}

void fail_bound(const std::string& field, double value, const std::string& relation, double limit) {
    const std::string problem = "must be " + relation + " " + format_number(limit) + ", got " + format_number(value);
    if (!std::isfinite(value)) throw input_error(field, problem);
    throw input_error(field, problem, bound_detail{value, limit, relation});
}

std::string join_path(const std::string& parent, const std::string& key) {
    return parent.empty() ? key : parent + "." + key;
}

std::string index_path(const std::string& parent, std::size_t index) {
    return parent + "[" + std::to_string(index) + "]";
}

}  // namespace hedgeleaf
