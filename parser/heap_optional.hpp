#pragma once
// An optional value kept on the heap, with value semantics (copies copy the value). For members
// that are large and rarely set: an empty one costs one pointer instead of sizeof(T), which matters
// for the Part records of a million-part board (a source spec is 120 bytes; one part in thousands
// has one).
#include <memory>
#include <utility>

namespace mainscheck::parser {

template <class T>
class HeapOptional {
 public:
  HeapOptional() = default;
  HeapOptional(T value) : p_(std::make_unique<T>(std::move(value))) {}  // NOLINT: implicit like std::optional
  HeapOptional(const HeapOptional& o) : p_(o.p_ ? std::make_unique<T>(*o.p_) : nullptr) {}
  HeapOptional(HeapOptional&&) noexcept = default;
  HeapOptional& operator=(const HeapOptional& o) {
    if (this != &o) p_ = o.p_ ? std::make_unique<T>(*o.p_) : nullptr;
    return *this;
  }
  HeapOptional& operator=(HeapOptional&&) noexcept = default;
  HeapOptional& operator=(T value) {
    p_ = std::make_unique<T>(std::move(value));
    return *this;
  }
  ~HeapOptional() = default;

  bool has_value() const { return p_ != nullptr; }
  explicit operator bool() const { return has_value(); }
  T& operator*() { return *p_; }
  const T& operator*() const { return *p_; }
  T* operator->() { return p_.get(); }
  const T* operator->() const { return p_.get(); }
  void reset() { p_.reset(); }
  T& emplace() {
    p_ = std::make_unique<T>();
    return *p_;
  }

 private:
  std::unique_ptr<T> p_;
};

}  // namespace mainscheck::parser
