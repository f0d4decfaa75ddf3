#pragma once
// Fields of a worksheet file that this version does not know (a newer
// revision's, a reviewer's additions), kept in their order so that a save
// writes them back where they were. The domain does not read them: only the
// file's reader and writer hold their JSON (and core's own optional
// sections, such as "uncertainty", look one up by name).
#include <cstddef>
#include <memory>
#include <optional>
#include <string>
#include <string_view>

namespace heatchain {

class UnknownFields {
public:
    bool empty() const;
    std::size_t size() const;
    bool contains(std::string_view key) const;
    // The kept value of `key` as compact JSON text: "\"E-12\"", "4", "[1,2]".
    std::optional<std::string> json(std::string_view key) const;
    // The kept value of `key` when it is a string.
    std::optional<std::string> string(std::string_view key) const;
    // Keeps `value` as the string of `key` (in its place, or added last).
    void setString(std::string_view key, std::string value);
    void erase(std::string_view key);

    friend bool operator==(const UnknownFields& a, const UnknownFields& b);

    struct Kept;  // the JSON object itself (unknown_fields.cpp)

private:
    friend struct UnknownFieldsAccess;
    // Shared between copies, never changed in place (a copy of a project
    // copies a pointer per section, not the JSON); null when none.
    std::shared_ptr<const Kept> kept_;
};

}  // namespace heatchain
