#pragma once
// Errors are values at the core's edge: every public call that can fail
// returns Result<T>, holding either the value or an Error that says what is
// wrong and where. Nothing in core's public API throws.
#include <string>
#include <utility>
#include <variant>

namespace heatchain {

struct Error {
    std::string message;  // what is wrong and, where it helps, what would be valid
    std::string where;    // file, JSON path ("steps[2].to.T") or step id; may be empty
    int line = 0;         // 1-based position in the source text, 0 when unknown
    int column = 0;

    // "where (line:column): message", omitting the parts that are unknown.
    std::string text() const;
};

// How much a message matters, decided in core; every surface shows the level.
//   Error    the step (or the sequence) cannot be computed
//   Warning  the result is probably not what was meant, or a model is
//            stretched (outside its range, an approach below the required)
//   Note     an ordinary fact worth knowing (the sensible part of a boil
//            step, the temperature drop of a throttle)
enum class MessageLevel { Error, Warning, Note };

// "error", "warning", "note"
constexpr const char* messageLevelId(MessageLevel level) {
    switch (level) {
        case MessageLevel::Error: return "error";
        case MessageLevel::Warning: return "warning";
        case MessageLevel::Note: return "note";
    }
    return "note";
}

struct Message {
    MessageLevel level = MessageLevel::Note;
    std::string text;
};

inline Error makeError(std::string message, std::string where = {}) {
    return Error{std::move(message), std::move(where), 0, 0};
}

template <class T>
class [[nodiscard]] Result {
public:
    Result(T value) : v_(std::in_place_index<0>, std::move(value)) {}
    Result(Error error) : v_(std::in_place_index<1>, std::move(error)) {}

    bool ok() const { return v_.index() == 0; }
    explicit operator bool() const { return ok(); }

    T& value() & { return std::get<0>(v_); }
    const T& value() const& { return std::get<0>(v_); }
    T&& value() && { return std::get<0>(std::move(v_)); }
    const Error& error() const { return std::get<1>(v_); }

    T* operator->() { return &std::get<0>(v_); }
    const T* operator->() const { return &std::get<0>(v_); }
    T& operator*() & { return std::get<0>(v_); }
    const T& operator*() const& { return std::get<0>(v_); }

private:
    std::variant<T, Error> v_;
};

// For calls that return nothing but can fail.
struct Ok {};
using Status = Result<Ok>;

}  // namespace heatchain
