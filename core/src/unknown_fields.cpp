// Unknown fields of a worksheet file, kept for writing back
// (unknown_fields.hpp says why they are opaque).
#include "heatchain/unknown_fields.hpp"

#include "unknown_fields_json.hpp"

namespace heatchain {

namespace {
const Json& noFields() {
    static const Json none = Json::object();
    return none;
}
}  // namespace

const Json& UnknownFieldsAccess::json(const UnknownFields& f) { return f.kept_ ? f.kept_->object : noFields(); }

UnknownFields UnknownFieldsAccess::of(Json object) {
    UnknownFields f;
    if (object.is_object() && !object.empty())
        f.kept_ = std::make_shared<const UnknownFields::Kept>(UnknownFields::Kept{std::move(object)});
    return f;
}

bool UnknownFields::empty() const { return size() == 0; }

std::size_t UnknownFields::size() const { return UnknownFieldsAccess::json(*this).size(); }

bool UnknownFields::contains(std::string_view key) const {
    return UnknownFieldsAccess::json(*this).contains(std::string(key));
}

std::optional<std::string> UnknownFields::json(std::string_view key) const {
    const Json& o = UnknownFieldsAccess::json(*this);
    const auto it = o.find(std::string(key));
    if (it == o.end()) return std::nullopt;
    return it->dump(-1, ' ', false, Json::error_handler_t::replace);
}

std::optional<std::string> UnknownFields::string(std::string_view key) const {
    const Json& o = UnknownFieldsAccess::json(*this);
    const auto it = o.find(std::string(key));
    if (it == o.end() || !it->is_string()) return std::nullopt;
    return it->get<std::string>();
}

void UnknownFields::setString(std::string_view key, std::string value) {
    Json o = UnknownFieldsAccess::json(*this);
    o[std::string(key)] = std::move(value);
    *this = UnknownFieldsAccess::of(std::move(o));
}

void UnknownFields::erase(std::string_view key) {
    if (!contains(key)) return;
    Json o = UnknownFieldsAccess::json(*this);
    o.erase(std::string(key));
    *this = UnknownFieldsAccess::of(std::move(o));
}

bool operator==(const UnknownFields& a, const UnknownFields& b) {
    return UnknownFieldsAccess::json(a) == UnknownFieldsAccess::json(b);
}

}  // namespace heatchain
