#include "analysis/solver/linear_system.hpp"

#include <algorithm>
#include <cmath>

namespace mainscheck::analysis::solver::detail {

void LinearSystem::begin_pattern(int n, bool dense) {
  n_ = n;
  dense_ = dense;
  collecting_ = true;
  pattern_.clear();
  for (int i = 0; i < n; ++i) pattern_.emplace_back(i, i);
}

void LinearSystem::end_pattern() {
  collecting_ = false;
  slot_.assign(static_cast<std::size_t>(n_) * n_, -1);
  if (dense_) {
    a_dense_ = Eigen::MatrixXd::Zero(n_, n_);
    values_ = a_dense_.data();
    for (int r = 0; r < n_; ++r)
      for (int c = 0; c < n_; ++c) slot_[static_cast<std::size_t>(r) * n_ + c] = c * n_ + r;
    return;
  }
  std::vector<Eigen::Triplet<double>> trip;
  trip.reserve(pattern_.size());
  for (auto [r, c] : pattern_) trip.emplace_back(r, c, 1.0);
  a_sparse_.resize(n_, n_);
  a_sparse_.setFromTriplets(trip.begin(), trip.end());
  a_sparse_.makeCompressed();
  for (int c = 0; c < n_; ++c)
    for (int k = a_sparse_.outerIndexPtr()[c]; k < a_sparse_.outerIndexPtr()[c + 1]; ++k)
      slot_[static_cast<std::size_t>(a_sparse_.innerIndexPtr()[k]) * n_ + c] = k;
  values_ = a_sparse_.valuePtr();
  lu_sparse_ = std::make_unique<Eigen::SparseLU<Eigen::SparseMatrix<double>, Eigen::COLAMDOrdering<int>>>();
  // The symbolic analysis (column ordering, elimination tree) is done once for the whole run.
  lu_sparse_->analyzePattern(a_sparse_);
}

void LinearSystem::zero() {
  if (dense_)
    a_dense_.setZero();
  else
    std::fill(values_, values_ + a_sparse_.nonZeros(), 0.0);
}

bool LinearSystem::factorize() {
  if (dense_) {
    lu_dense_.compute(a_dense_);
    // PartialPivLU does not report singularity; a vanishing pivot shows in the determinant's scale.
    const auto& m = lu_dense_.matrixLU();
    for (int i = 0; i < n_; ++i)
      if (!(std::abs(m(i, i)) > 1e-300)) return false;
    return true;
  }
  lu_sparse_->factorize(a_sparse_);
  return lu_sparse_->info() == Eigen::Success;
}

void LinearSystem::solve(const Eigen::VectorXd& b, Eigen::VectorXd& x) {
  if (dense_)
    x = lu_dense_.solve(b);
  else
    x = lu_sparse_->solve(b);
}

void LinearSystem::solve(const Eigen::MatrixXd& b, Eigen::MatrixXd& x) {
  if (dense_)
    x = lu_dense_.solve(b);
  else
    x = lu_sparse_->solve(b);
}

}  // namespace mainscheck::analysis::solver::detail
