# Regenerates the reference values of org.orthogon.moments.BetaPricingReferenceTest: the beta-pricing model
# estimated as one GMM system (time series and cross section together) on the data that
# smallcap_two_pass.R wrote beside itself from fPortfolio's SMALLCAP.RET (Debian r-cran-fportfolio), the
# first 12 small-cap stocks' excess returns on MKT (and SMM), T = 60 months.
#
# Base R matrix algebra from the formulas only (Cochrane 2005, "Asset Pricing", revised edition, sections
# 12.2 and 13.3; Hansen 1982, Theorem 3.1). With theta = (lambda_0 when there is an intercept, lambda, a,
# beta asset by asset), eps_t = R_t - a - B f_t and X = B or [1 B]:
#   moments u_t = (R_t - X gamma ; eps_t ; eps_t (x) f_t)        N(K + 2) of them
#   a_T = [X'W 0; 0 I], W = I (OLS) or Sigma^-1 (GLS, Sigma = eps'eps/T)
#   theta solves a_T g_T = 0: a and B by OLS, gamma = (X'WX)^-1 X'W Rbar
#   D = dg_T/dtheta' (written out below and checked against central differences)
#   V = (aD)^-1 a S a' (aD)^-1' / T,  Var(g) = (I - D (aD)^-1 a) S (I - D (aD)^-1 a)' / T
#   test = alpha' Var(alpha)^+ alpha over the N - q largest eigenvalues, chi-square(N - q)
# S is the centred long-run covariance of u_t: HC (Gamma_0) or Bartlett with L = 2 lags,
# S = Gamma_0 + sum_{j=1..L} (1 - j/(L+1)) (Gamma_j + Gamma_j'), Gamma_j = sum_t u_t u_{t-j}' / T.
# It also prints the smallest eigenvalues of S, which are zero (N - K of them): S is singular by
# construction, so only a fixed selection can estimate this system.
#
# Run from the project root: Rscript src/test/resources/reference/twopass/smallcap_beta_pricing.R
here <- tryCatch(dirname(normalizePath(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE)))),
                 error = function(e) ".")
rd <- function(file) as.matrix(read.csv(file.path(here, file), check.names = FALSE)[, -1, drop = FALSE])
net <- rd("smallcap-returns.csv"); rf <- rd("smallcap-riskfree.csv")[, 1]; fac <- rd("smallcap-factors.csv")
R <- net - rf
values <- list()
put <- function(name, v) values[[name]] <<- v
fmt <- function(v) sprintf("%.17g", v)

long_run <- function(u, lags) {
  T <- nrow(u); uc <- sweep(u, 2, colMeans(u))
  S <- crossprod(uc) / T
  if (lags > 0) for (j in 1:lags) {
    G <- crossprod(uc[(j + 1):T, , drop = FALSE], uc[1:(T - j), , drop = FALSE]) / T
    S <- S + (1 - j / (lags + 1)) * (G + t(G))
  }
  S
}

system_gmm <- function(R, f, w, icpt, tag) {
  f <- as.matrix(f); T <- nrow(R); N <- ncol(R); K <- ncol(f); q <- K + icpt
  cf <- t(sapply(seq_len(N), function(i) coef(lm(R[, i] ~ f))))
  a <- cf[, 1]; B <- cf[, -1, drop = FALSE]
  eps <- R - matrix(a, T, N, byrow = TRUE) - f %*% t(B)
  Sig <- crossprod(eps) / T
  X <- if (icpt) cbind(1, B) else B
  W <- if (w == "ols") diag(N) else solve(Sig)
  Rbar <- colMeans(R)
  gam <- drop(solve(t(X) %*% W %*% X, t(X) %*% W %*% Rbar))
  lam <- gam[(icpt + 1):q]; lev <- if (icpt) gam[1] else 0
  theta <- c(gam, a, as.vector(t(B)))
  P <- length(theta); Km <- N * (K + 2)
  moments <- function(th) {
    g <- th[1:q]; aa <- th[q + 1:N]; BB <- matrix(th[q + N + 1:(N * K)], N, K, byrow = TRUE)
    XX <- if (icpt) cbind(1, BB) else BB
    e <- R - matrix(aa, T, N, byrow = TRUE) - f %*% t(BB)
    ef <- do.call(cbind, lapply(seq_len(N), function(i) e[, i] * f))
    cbind(R - matrix(drop(XX %*% g), T, N, byrow = TRUE), e, ef)
  }
  u <- moments(theta); g <- colMeans(u)
  # D written out from the formulas.
  D <- matrix(0, Km, P)
  Eff <- crossprod(f) / T; fbar <- colMeans(f)
  for (i in 1:N) {
    if (icpt) D[i, 1] <- -1
    D[i, (icpt + 1):q] <- -B[i, ]
    D[N + i, q + i] <- -1
    rows <- 2 * N + (i - 1) * K + 1:K
    D[rows, q + i] <- -fbar
    cols <- q + N + (i - 1) * K + 1:K
    D[i, cols] <- -lam
    D[N + i, cols] <- -fbar
    D[rows, cols] <- -Eff
  }
  Dn <- sapply(seq_len(P), function(p) {
    h <- 1e-6 * max(abs(theta[p]), 1e-2); up <- theta; dn <- theta; up[p] <- up[p] + h; dn[p] <- dn[p] - h
    (colMeans(moments(up)) - colMeans(moments(dn))) / (2 * h)
  })
  A <- matrix(0, P, Km); A[1:q, 1:N] <- t(X) %*% W; A[(q + 1):P, (N + 1):Km] <- diag(N + N * K)
  cat(sprintf("%s.%s%s: max|a g| %.2e, D against central differences %.2e\n", tag, w, if (icpt) "" else ".nointercept",
              max(abs(A %*% g)), max(abs(D - Dn)) / max(abs(D))))
  names_g <- c(if (icpt) "lambda_0", paste0("lambda_", colnames(f)))
  for (lags in c(0, 2)) {
    S <- long_run(u, lags)
    H <- solve(A %*% D, A)
    V <- H %*% S %*% t(H) / T
    M <- diag(Km) - D %*% H
    Vg <- M %*% S %*% t(M) / T
    alpha <- g[1:N]; Va <- Vg[1:N, 1:N]
    ev <- eigen((Va + t(Va)) / 2, symmetric = TRUE)
    keep <- 1:(N - q)
    proj <- drop(t(ev$vectors[, keep]) %*% alpha)
    stat <- sum(proj^2 / ev$values[keep])
    p <- paste0("gmm.", tag, ".", w, if (icpt) "" else ".nointercept", if (lags == 0) ".hc" else ".bartlett2")
    for (j in 1:q) {
      put(paste0(p, ".", names_g[j], ".estimate"), gam[j])
      put(paste0(p, ".", names_g[j], ".std_error"), sqrt(V[j, j]))
    }
    for (i in 1:N) {
      put(paste0(p, ".alpha.", colnames(R)[i], ".estimate"), alpha[i])
      put(paste0(p, ".alpha.", colnames(R)[i], ".std_error"), sqrt(Va[i, i]))
      put(paste0(p, ".a_", colnames(R)[i], ".std_error"), sqrt(V[q + i, q + i]))
      for (k in 1:K) {
        j <- q + N + (i - 1) * K + k
        put(paste0(p, ".beta_", colnames(R)[i], "_", colnames(f)[k], ".std_error"), sqrt(V[j, j]))
      }
    }
    put(paste0(p, ".test.statistic"), stat)
    put(paste0(p, ".test.df"), N - q)
    put(paste0(p, ".test.p_value"), pchisq(stat, N - q, lower.tail = FALSE))
    es <- eigen(S, symmetric = TRUE, only.values = TRUE)$values
    cat(sprintf("  %s: S has %d eigenvalues below 1e-12 times the largest (N - K = %d)\n", p,
                sum(es < 1e-12 * es[1]), N - K))
  }
}

for (w in c("ols", "gls")) for (icpt in c(FALSE, TRUE)) {
  system_gmm(R, fac, w, icpt, "two_factor")
  system_gmm(R, fac[, "MKT", drop = FALSE], w, icpt, "capm")
}
out <- data.frame(name = names(values), value = sapply(values, fmt))
write.csv(out, file.path(here, "smallcap_beta_pricing_values.csv"), row.names = FALSE, quote = FALSE)
cat("values written:", nrow(out), "\n")
