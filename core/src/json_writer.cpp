// The JSON writer shared by the project file and the results output
// (json_writer.hpp says what layout it keeps and why).
#include "json_writer.hpp"

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <system_error>

namespace heatchain::detail {

namespace {

// Where nlohmann/json switches a double from plain digits to an exponent:
// the decimal point more than 4 places before the first digit, or more than
// 15 (a double's digits10) after it.
constexpr int kPlainBelow = -4;
constexpr int kPlainUpTo = 15;

void appendExponent(std::string& out, int e) {
    out += e < 0 ? '-' : '+';
    const int a = std::abs(e);
    if (a < 10) out += '0';
    out.append(std::to_string(a));
}

// Length of the UTF-8 sequence starting at s[i], or 0 when it is not one
// (overlong forms, surrogates and code points above U+10FFFF are not).
std::size_t utf8Length(std::string_view s, std::size_t i) {
    const auto b = [&](std::size_t k) { return static_cast<unsigned char>(s[k]); };
    const unsigned char c = b(i);
    if (c < 0x80) return 1;
    std::size_t n = 0;
    unsigned char lo = 0x80, hi = 0xBF;  // the allowed range of the second byte
    if (c >= 0xC2 && c <= 0xDF) {
        n = 2;
    } else if (c >= 0xE0 && c <= 0xEF) {
        n = 3;
        if (c == 0xE0) lo = 0xA0;
        if (c == 0xED) hi = 0x9F;
    } else if (c >= 0xF0 && c <= 0xF4) {
        n = 4;
        if (c == 0xF0) lo = 0x90;
        if (c == 0xF4) hi = 0x8F;
    } else {
        return 0;
    }
    if (i + n > s.size()) return 0;
    if (b(i + 1) < lo || b(i + 1) > hi) return 0;
    for (std::size_t k = 2; k < n; ++k)
        if (b(i + k) < 0x80 || b(i + k) > 0xBF) return 0;
    return n;
}

}  // namespace

void appendJsonNumber(std::string& out, double x) {
    if (!std::isfinite(x)) {
        out.append("null");
        return;
    }
    if (x == 0) {
        out.append(std::signbit(x) ? "-0.0" : "0.0");
        return;
    }
    // Scientific form gives the shortest digits and their exponent:
    // "-d.ddde±XX".
    std::array<char, 40> buf{};
    const auto res = std::to_chars(buf.data(), buf.data() + buf.size(), x, std::chars_format::scientific);
    const std::string_view sci(buf.data(), static_cast<std::size_t>(res.ptr - buf.data()));
    std::size_t i = 0;
    if (sci[0] == '-') {
        out += '-';
        i = 1;
    }
    const std::size_t e = sci.find('e');
    std::string digits;
    for (std::size_t k = i; k < e; ++k)
        if (sci[k] != '.') digits += sci[k];
    int exp10 = 0;
    std::from_chars(sci.data() + e + (sci[e + 1] == '+' ? 2 : 1), sci.data() + sci.size(), exp10);
    const int k = static_cast<int>(digits.size());
    const int n = exp10 + 1;  // the decimal point sits after n digits
    if (k <= n && n <= kPlainUpTo) {
        out.append(digits).append(static_cast<std::size_t>(n - k), '0').append(".0");
    } else if (0 < n && n <= kPlainUpTo) {
        out.append(digits, 0, static_cast<std::size_t>(n)).append(".").append(digits, static_cast<std::size_t>(n));
    } else if (kPlainBelow < n && n <= 0) {
        out.append("0.").append(static_cast<std::size_t>(-n), '0').append(digits);
    } else {
        out += digits[0];
        if (k > 1) out.append(".").append(digits, 1);
        out += 'e';
        appendExponent(out, n - 1);
    }
}

void appendJsonString(std::string& out, std::string_view s) {
    // Bytes that are not UTF-8 only come from code (a parsed file is UTF-8);
    // nlohmann/json's replacement rule is used for them as it always was.
    for (std::size_t i = 0; i < s.size();) {
        const std::size_t n = utf8Length(s, i);
        if (n == 0) {
            out.append(Json(std::string(s)).dump(-1, ' ', false, Json::error_handler_t::replace));
            return;
        }
        i += n;
    }
    out += '"';
    for (const char c : s) {
        switch (c) {
            case '"': out.append("\\\""); break;
            case '\\': out.append("\\\\"); break;
            case '\b': out.append("\\b"); break;
            case '\f': out.append("\\f"); break;
            case '\n': out.append("\\n"); break;
            case '\r': out.append("\\r"); break;
            case '\t': out.append("\\t"); break;
            default:
                if (static_cast<unsigned char>(c) < 0x20) {
                    static constexpr std::string_view hex = "0123456789abcdef";
                    out.append("\\u00");
                    out += hex[static_cast<unsigned char>(c) >> 4];
                    out += hex[static_cast<unsigned char>(c) & 0xF];
                } else {
                    out += c;
                }
        }
    }
    out += '"';
}

void JsonWriter::newLine(std::size_t depth) {
    out_ += '\n';
    out_.append(2 * depth, ' ');
}

void JsonWriter::beforeValue() {
    if (afterKey_) {
        afterKey_ = false;
        return;
    }
    if (levels_.empty() || !levels_.back().array) return;
    if (levels_.back().members++ > 0) out_ += ',';
    newLine(static_cast<std::size_t>(depth_) + levels_.size());
}

JsonWriter& JsonWriter::key(std::string_view k) {
    if (levels_.back().members++ > 0) out_ += ',';
    newLine(static_cast<std::size_t>(depth_) + levels_.size());
    appendJsonString(out_, k);
    out_.append(": ");
    afterKey_ = true;
    return *this;
}

void JsonWriter::open(char bracket, bool array) {
    beforeValue();
    out_ += bracket;
    levels_.push_back({array, 0});
}

void JsonWriter::close(char bracket) {
    const bool empty = levels_.back().members == 0;
    levels_.pop_back();
    if (!empty) newLine(static_cast<std::size_t>(depth_) + levels_.size());
    out_ += bracket;
}

void JsonWriter::value(const Json& v) {
    switch (v.type()) {
        case Json::value_t::object:
            beginObject();
            for (auto it = v.begin(); it != v.end(); ++it) {
                key(it.key());
                value(it.value());
            }
            endObject();
            return;
        case Json::value_t::array:
            beginArray();
            for (const Json& e : v) value(e);
            endArray();
            return;
        case Json::value_t::string: string(v.get_ref<const std::string&>()); return;
        case Json::value_t::number_float: {
            beforeValue();
            const double x = v.get<double>();
            if (!std::isfinite(x)) {
                out_.append("null");
                return;
            }
            std::array<char, 64> buf{};
            const char* end = nlohmann::detail::to_chars(buf.data(), buf.data() + buf.size(), x);
            out_.append(buf.data(), static_cast<std::size_t>(end - buf.data()));
            return;
        }
        case Json::value_t::boolean: boolean(v.get<bool>()); return;
        case Json::value_t::null: null(); return;
        case Json::value_t::number_integer: integer(v.get<std::int64_t>()); return;
        case Json::value_t::number_unsigned:
            beforeValue();
            out_.append(std::to_string(v.get<std::uint64_t>()));
            return;
        default:  // binary and discarded values are not JSON text; nlohmann/json writes them as it does
            beforeValue();
            out_.append(v.dump());
            return;
    }
}

void ObjectWriter::unknown(const Json& fields, std::string_view skip) {
    if (!fields.is_object()) return;
    for (auto it = fields.begin(); it != fields.end(); ++it) {
        const std::string& k = it.key();
        if ((!skip.empty() && k == skip) || std::find(written_.begin(), written_.end(), k) != written_.end()) continue;
        w_.key(k);
        w_.value(it.value());
    }
}

}  // namespace heatchain::detail
