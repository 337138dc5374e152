#include "tests/collision/mesh_files.hpp"

#include <cstdint>
#include <cstring>
#include <fstream>
#include <iomanip>
#include <locale>
#include <sstream>
#include <stdexcept>

namespace tw::collision::test {
namespace {

constexpr double kMetresToMm = 1000.0;

void putUint32(std::string& out, std::uint32_t value) {
  for (int i = 0; i < 4; ++i) out.push_back(static_cast<char>((value >> (8 * i)) & 0xffu));
}

void putFloat(std::string& out, double value) {
  const float f = static_cast<float>(value);
  std::uint32_t bits = 0;
  std::memcpy(&bits, &f, sizeof bits);
  putUint32(out, bits);
}

Eigen::Vector3d normalOf(const TriangleMesh& mesh, const std::array<int, 3>& t) {
  const Eigen::Vector3d& a = mesh.vertices[t[0]];
  return (mesh.vertices[t[1]] - a).cross(mesh.vertices[t[2]] - a).normalized();
}

std::ostringstream numberStream() {
  std::ostringstream out;
  out.imbue(std::locale::classic());
  out << std::setprecision(17);
  return out;
}

}  // namespace

void writeText(const std::string& path, const std::string& text) {
  std::ofstream file(path, std::ios::binary);
  file << text;
  if (!file) throw std::runtime_error("cannot write " + path);
}

void writeBinaryStl(const std::string& path, const TriangleMesh& mesh) {
  std::string bytes(80, ' ');
  bytes.replace(0, 22, "tracewright test solid");
  putUint32(bytes, static_cast<std::uint32_t>(mesh.triangles.size()));
  for (const std::array<int, 3>& t : mesh.triangles) {
    const Eigen::Vector3d n = normalOf(mesh, t);
    for (int i = 0; i < 3; ++i) putFloat(bytes, n[i]);
    for (int corner : t) {
      for (int i = 0; i < 3; ++i) putFloat(bytes, kMetresToMm * mesh.vertices[corner][i]);
    }
    bytes.push_back('\0');
    bytes.push_back('\0');
  }
  writeText(path, bytes);
}

void writeAsciiStl(const std::string& path, const TriangleMesh& mesh) {
  std::ostringstream out = numberStream();
  out << "solid test\n";
  for (const std::array<int, 3>& t : mesh.triangles) {
    const Eigen::Vector3d n = normalOf(mesh, t);
    out << "  facet normal " << n.x() << ' ' << n.y() << ' ' << n.z() << "\n    outer loop\n";
    for (int corner : t) {
      const Eigen::Vector3d p = kMetresToMm * mesh.vertices[corner];
      out << "      vertex " << p.x() << ' ' << p.y() << ' ' << p.z() << '\n';
    }
    out << "    endloop\n  endfacet\n";
  }
  out << "endsolid test\n";
  writeText(path, out.str());
}

void writeObj(const std::string& path, const TriangleMesh& mesh) {
  std::ostringstream out = numberStream();
  for (const Eigen::Vector3d& v : mesh.vertices) {
    const Eigen::Vector3d p = kMetresToMm * v;
    out << "v " << p.x() << ' ' << p.y() << ' ' << p.z() << '\n';
  }
  for (const std::array<int, 3>& t : mesh.triangles) {
    out << "f " << t[0] + 1 << ' ' << t[1] + 1 << ' ' << t[2] + 1 << '\n';
  }
  writeText(path, out.str());
}

void writeAsciiPly(const std::string& path, const TriangleMesh& mesh) {
  std::ostringstream out = numberStream();
  out << "ply\nformat ascii 1.0\nelement vertex " << mesh.vertices.size()
      << "\nproperty float x\nproperty float y\nproperty float z\nelement face "
      << mesh.triangles.size() << "\nproperty list uchar int vertex_indices\nend_header\n";
  for (const Eigen::Vector3d& v : mesh.vertices) {
    const Eigen::Vector3d p = kMetresToMm * v;
    out << p.x() << ' ' << p.y() << ' ' << p.z() << '\n';
  }
  for (const std::array<int, 3>& t : mesh.triangles) {
    out << "3 " << t[0] << ' ' << t[1] << ' ' << t[2] << '\n';
  }
  writeText(path, out.str());
}

}  // namespace tw::collision::test
