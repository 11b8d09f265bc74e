// SPDX-License-Identifier: MIT
// A minimal PNG reader for tests (browser screenshots): chunk CRCs, zlib/DEFLATE inflate and
// scanline unfiltering, 8-bit RGB and RGBA only. Header-only; needs no image library.
#pragma once

#include <array>
#include <cstdint>
#include <filesystem>
#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

namespace quietrail::test {

/// A decoded image, 8-bit RGB triples row by row (alpha dropped).
struct RgbImage {
  int width = 0;
  int height = 0;
  std::vector<std::uint8_t> rgb;

  /// Pixel colour as 0xRRGGBB.
  std::uint32_t at(int x, int y) const {
    const auto i = 3 * (static_cast<std::size_t>(y) * static_cast<std::size_t>(width) + static_cast<std::size_t>(x));
    return (std::uint32_t{rgb[i]} << 16) | (std::uint32_t{rgb[i + 1]} << 8) | rgb[i + 2];
  }
};

namespace png_detail {

[[noreturn]] inline void fail(const std::string& what) { throw std::runtime_error("PNG: " + what); }

/// CRC-32 as PNG uses it (ISO 3309 / ITU-T V.42 polynomial 0xEDB88320, reflected; PNG spec,
/// W3C 2003, section 5.5 and annex D).
inline std::uint32_t crc32(std::string_view bytes) {
  static const std::array<std::uint32_t, 256> table = [] {
    std::array<std::uint32_t, 256> t{};
    for (std::uint32_t n = 0; n < 256; ++n) {
      std::uint32_t c = n;
      for (int k = 0; k < 8; ++k) c = (c & 1U) ? 0xEDB88320U ^ (c >> 1) : c >> 1;
      t[n] = c;
    }
    return t;
  }();
  std::uint32_t c = 0xFFFFFFFFU;
  for (const char b : bytes) c = table[(c ^ static_cast<std::uint8_t>(b)) & 0xFFU] ^ (c >> 8);
  return c ^ 0xFFFFFFFFU;
}

inline std::uint32_t big_endian(std::string_view bytes, std::size_t at) {
  if (at + 4 > bytes.size()) fail("truncated");
  return (std::uint32_t{static_cast<std::uint8_t>(bytes[at])} << 24) |
         (std::uint32_t{static_cast<std::uint8_t>(bytes[at + 1])} << 16) |
         (std::uint32_t{static_cast<std::uint8_t>(bytes[at + 2])} << 8) | static_cast<std::uint8_t>(bytes[at + 3]);
}

/// DEFLATE decoder (RFC 1951): stored, fixed-Huffman and dynamic-Huffman blocks, decoded
/// with canonical Huffman codes counted per length, as RFC 1951 section 3.2.2 defines them.
class Inflater {
 public:
  explicit Inflater(std::string_view in) : in_(in) {}

  std::vector<std::uint8_t> run() {
    bool last = false;
    while (!last) {
      last = bits(1) == 1;
      const int type = bits(2);
      if (type == 0) stored();
      else if (type == 1) fixed();
      else if (type == 2) dynamic();
      else fail("bad DEFLATE block type");
    }
    return std::move(out_);
  }

  std::size_t bytes_used() const { return pos_; }

 private:
  struct Huffman {
    std::array<int, 16> count{};
    std::vector<int> symbol;
  };

  int bits(int need) {
    std::uint32_t value = bit_buffer_;
    while (bit_count_ < need) {
      if (pos_ >= in_.size()) fail("DEFLATE data ends early");
      value |= std::uint32_t{static_cast<std::uint8_t>(in_[pos_++])} << bit_count_;
      bit_count_ += 8;
    }
    bit_buffer_ = value >> need;
    bit_count_ -= need;
    return static_cast<int>(value & ((1U << need) - 1U));
  }

  void stored() {
    bit_buffer_ = 0;
    bit_count_ = 0;
    if (pos_ + 4 > in_.size()) fail("stored block header cut");
    const auto len = static_cast<unsigned>(static_cast<std::uint8_t>(in_[pos_]) | (static_cast<std::uint8_t>(in_[pos_ + 1]) << 8));
    const auto nlen = static_cast<unsigned>(static_cast<std::uint8_t>(in_[pos_ + 2]) | (static_cast<std::uint8_t>(in_[pos_ + 3]) << 8));
    pos_ += 4;
    if (len != (~nlen & 0xFFFFU)) fail("stored block length check");
    if (pos_ + len > in_.size()) fail("stored block cut");
    for (unsigned i = 0; i < len; ++i) out_.push_back(static_cast<std::uint8_t>(in_[pos_++]));
  }

  static Huffman build(const int* lengths, int n) {
    Huffman h;
    for (int i = 0; i < n; ++i) ++h.count[static_cast<std::size_t>(lengths[i])];
    std::array<int, 16> offset{};
    for (int len = 1; len < 15; ++len) offset[static_cast<std::size_t>(len + 1)] = offset[static_cast<std::size_t>(len)] + h.count[static_cast<std::size_t>(len)];
    h.symbol.assign(static_cast<std::size_t>(n), 0);
    for (int i = 0; i < n; ++i)
      if (lengths[i] != 0) h.symbol[static_cast<std::size_t>(offset[static_cast<std::size_t>(lengths[i])]++)] = i;
    return h;
  }

  int decode(const Huffman& h) {
    int code = 0;
    int first = 0;
    int index = 0;
    for (int len = 1; len <= 15; ++len) {
      code |= bits(1);
      const int count = h.count[static_cast<std::size_t>(len)];
      if (code - count < first) return h.symbol[static_cast<std::size_t>(index + (code - first))];
      index += count;
      first += count;
      first <<= 1;
      code <<= 1;
    }
    fail("bad Huffman code");
  }

  void codes(const Huffman& lit, const Huffman& dist) {
    // RFC 1951 section 3.2.5: base lengths and distances with their extra bits.
    static constexpr std::array<int, 29> kLenBase = {3,  4,  5,  6,  7,  8,  9,  10, 11,  13,  15,  17,  19,  23, 27,
                                                     31, 35, 43, 51, 59, 67, 83, 99, 115, 131, 163, 195, 227, 258};
    static constexpr std::array<int, 29> kLenExtra = {0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 2, 2, 2,
                                                      2, 3, 3, 3, 3, 4, 4, 4, 4, 5, 5, 5, 5, 0};
    static constexpr std::array<int, 30> kDistBase = {1,    2,    3,    4,    5,    7,     9,     13,    17,  25,
                                                      33,   49,   65,   97,   129,  193,   257,   385,   513, 769,
                                                      1025, 1537, 2049, 3073, 4097, 6145,  8193,  12289, 16385, 24577};
    static constexpr std::array<int, 30> kDistExtra = {0, 0, 0, 0, 1, 1, 2, 2,  3,  3,  4,  4,  5,  5,  6,
                                                       6, 7, 7, 8, 8, 9, 9, 10, 10, 11, 11, 12, 12, 13, 13};
    for (;;) {
      int symbol = decode(lit);
      if (symbol < 256) {
        out_.push_back(static_cast<std::uint8_t>(symbol));
      } else if (symbol == 256) {
        return;
      } else {
        symbol -= 257;
        if (symbol >= 29) fail("bad length symbol");
        const int length = kLenBase[static_cast<std::size_t>(symbol)] + bits(kLenExtra[static_cast<std::size_t>(symbol)]);
        const int d = decode(dist);
        if (d >= 30) fail("bad distance symbol");
        const auto distance = static_cast<std::size_t>(kDistBase[static_cast<std::size_t>(d)] + bits(kDistExtra[static_cast<std::size_t>(d)]));
        if (distance > out_.size()) fail("distance too far back");
        for (int i = 0; i < length; ++i) out_.push_back(out_[out_.size() - distance]);
      }
    }
  }

  void fixed() {
    // RFC 1951 section 3.2.6.
    std::array<int, 288> lengths{};
    for (int i = 0; i < 144; ++i) lengths[static_cast<std::size_t>(i)] = 8;
    for (int i = 144; i < 256; ++i) lengths[static_cast<std::size_t>(i)] = 9;
    for (int i = 256; i < 280; ++i) lengths[static_cast<std::size_t>(i)] = 7;
    for (int i = 280; i < 288; ++i) lengths[static_cast<std::size_t>(i)] = 8;
    const Huffman lit = build(lengths.data(), 288);
    std::array<int, 30> dist_lengths{};
    dist_lengths.fill(5);
    const Huffman dist = build(dist_lengths.data(), 30);
    codes(lit, dist);
  }

  void dynamic() {
    // RFC 1951 section 3.2.7.
    static constexpr std::array<int, 19> kOrder = {16, 17, 18, 0, 8, 7, 9, 6, 10, 5, 11, 4, 12, 3, 13, 2, 14, 1, 15};
    const int nlen = bits(5) + 257;
    const int ndist = bits(5) + 1;
    const int ncode = bits(4) + 4;
    if (nlen > 286 || ndist > 30) fail("bad dynamic block counts");
    std::array<int, 320> lengths{};
    for (int i = 0; i < ncode; ++i) lengths[static_cast<std::size_t>(kOrder[static_cast<std::size_t>(i)])] = bits(3);
    const Huffman code_lengths = build(lengths.data(), 19);
    lengths.fill(0);
    int index = 0;
    while (index < nlen + ndist) {
      int symbol = decode(code_lengths);
      if (symbol < 16) {
        lengths[static_cast<std::size_t>(index++)] = symbol;
        continue;
      }
      int value = 0;
      int repeat = 0;
      if (symbol == 16) {
        if (index == 0) fail("repeat with no previous length");
        value = lengths[static_cast<std::size_t>(index - 1)];
        repeat = 3 + bits(2);
      } else if (symbol == 17) {
        repeat = 3 + bits(3);
      } else {
        repeat = 11 + bits(7);
      }
      if (index + repeat > nlen + ndist) fail("too many lengths");
      while (repeat-- > 0) lengths[static_cast<std::size_t>(index++)] = value;
    }
    const Huffman lit = build(lengths.data(), nlen);
    const Huffman dist = build(lengths.data() + nlen, ndist);
    codes(lit, dist);
  }

  std::string_view in_;
  std::size_t pos_ = 0;
  std::uint32_t bit_buffer_ = 0;
  int bit_count_ = 0;
  std::vector<std::uint8_t> out_;
};

/// zlib stream (RFC 1950): 2-byte header, DEFLATE data, Adler-32 of the output.
inline std::vector<std::uint8_t> zlib_inflate(std::string_view data) {
  if (data.size() < 6) fail("zlib stream too short");
  const auto cmf = static_cast<std::uint8_t>(data[0]);
  const auto flg = static_cast<std::uint8_t>(data[1]);
  if ((cmf & 0x0FU) != 8 || ((cmf << 8) | flg) % 31 != 0 || (flg & 0x20U) != 0) fail("bad zlib header");
  Inflater inflater(data.substr(2));
  std::vector<std::uint8_t> out = inflater.run();
  std::uint32_t a = 1;
  std::uint32_t b = 0;
  for (const std::uint8_t byte : out) {
    a = (a + byte) % 65521U;
    b = (b + a) % 65521U;
  }
  if (big_endian(data, 2 + inflater.bytes_used()) != ((b << 16) | a)) fail("Adler-32 mismatch");
  return out;
}

}  // namespace png_detail

/// Width and height from the IHDR chunk after checking the 8-byte signature (PNG spec,
/// section 5.2: 137 80 78 71 13 10 26 10) and the IHDR chunk's CRC.
inline std::pair<int, int> png_size(std::string_view file) {
  using namespace png_detail;
  static constexpr std::string_view kSignature("\x89PNG\r\n\x1a\n", 8);
  if (!file.starts_with(kSignature)) fail("no PNG signature");
  if (big_endian(file, 8) != 13 || file.substr(12, 4) != "IHDR") fail("IHDR is not the first chunk");
  if (crc32(file.substr(12, 17)) != big_endian(file, 29)) fail("IHDR CRC mismatch");
  return {static_cast<int>(big_endian(file, 16)), static_cast<int>(big_endian(file, 20))};
}

/// Decodes a non-interlaced 8-bit RGB or RGBA PNG; throws std::runtime_error otherwise or on
/// any damage (chunk CRC, zlib check, filter type). Filters: PNG spec section 9.
inline RgbImage read_png(std::string_view file) {
  using namespace png_detail;
  const auto [width, height] = png_size(file);
  const auto depth = static_cast<std::uint8_t>(file[24]);
  const auto colour = static_cast<std::uint8_t>(file[25]);
  const auto interlace = static_cast<std::uint8_t>(file[28]);
  if (depth != 8 || (colour != 2 && colour != 6) || interlace != 0) fail("only 8-bit RGB/RGBA, not interlaced");
  const std::size_t channels = colour == 6 ? 4 : 3;

  std::string idat;
  for (std::size_t at = 8; at + 12 <= file.size();) {
    const std::size_t length = big_endian(file, at);
    if (at + 12 + length > file.size()) fail("chunk runs past the end");
    const std::string_view type = file.substr(at + 4, 4);
    if (crc32(file.substr(at + 4, 4 + length)) != big_endian(file, at + 8 + length)) fail("chunk CRC mismatch");
    if (type == "IDAT") idat.append(file.substr(at + 8, length));
    if (type == "IEND") break;
    at += 12 + length;
  }
  const std::vector<std::uint8_t> raw = zlib_inflate(idat);
  const std::size_t stride = channels * static_cast<std::size_t>(width);
  if (raw.size() != (stride + 1) * static_cast<std::size_t>(height)) fail("image data has the wrong size");

  std::vector<std::uint8_t> previous(stride, 0);
  std::vector<std::uint8_t> line(stride);
  RgbImage image{width, height, {}};
  image.rgb.reserve(3 * static_cast<std::size_t>(width) * static_cast<std::size_t>(height));
  for (int y = 0; y < height; ++y) {
    const std::uint8_t* row = raw.data() + static_cast<std::size_t>(y) * (stride + 1);
    const std::uint8_t filter = row[0];
    for (std::size_t i = 0; i < stride; ++i) {
      const int a = i >= channels ? line[i - channels] : 0;
      const int b = previous[i];
      const int c = i >= channels ? previous[i - channels] : 0;
      int predictor = 0;
      switch (filter) {
        case 0: break;
        case 1: predictor = a; break;
        case 2: predictor = b; break;
        case 3: predictor = (a + b) / 2; break;
        case 4: {  // Paeth (PNG spec section 9.4)
          const int p = a + b - c;
          const int pa = p > a ? p - a : a - p;
          const int pb = p > b ? p - b : b - p;
          const int pc = p > c ? p - c : c - p;
          predictor = (pa <= pb && pa <= pc) ? a : (pb <= pc ? b : c);
          break;
        }
        default: fail("bad filter type");
      }
      line[i] = static_cast<std::uint8_t>(row[1 + i] + predictor);
    }
    for (int x = 0; x < width; ++x)
      for (std::size_t k = 0; k < 3; ++k) image.rgb.push_back(line[static_cast<std::size_t>(x) * channels + k]);
    previous = line;
  }
  return image;
}

}  // namespace quietrail::test
