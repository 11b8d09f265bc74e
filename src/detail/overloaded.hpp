// SPDX-License-Identifier: MIT
// The usual visitor helper for std::visit over the Element variant.
#pragma once

namespace quietrail::detail {

template <class... Ts>
struct Overloaded : Ts... {
  using Ts::operator()...;
};
template <class... Ts>
Overloaded(Ts...) -> Overloaded<Ts...>;

}  // namespace quietrail::detail
