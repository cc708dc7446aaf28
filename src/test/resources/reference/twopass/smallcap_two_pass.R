# Regenerates the data files and the reference values of org.orthogon.twopass.SmallCapReferenceTest.
#
# Source: the data set SMALLCAP.RET of the R package fPortfolio, as shipped by the Debian package
# r-cran-fportfolio 3042.83.1-1+b1 (run here with Debian r-base-core 4.2.2.20221110-2): monthly net
# returns of 20 US small-capitalisation stocks, January 1997 to December 2001 (T = 60), with the return
# of a market index (MARKET) and a monthly 90-day Treasury-bill rate (T90).
#
# What the script writes beside itself:
#   smallcap-returns.csv   the first 12 stocks' net monthly returns (decimals): the test assets
#   smallcap-riskfree.csv  T90, the monthly risk-free rate (decimals)
#   smallcap-factors.csv   MKT = MARKET - T90, and SMM = the equal-weighted mean of the other 8 stocks minus
#                          MARKET (a small-minus-market spread formed for this check from stocks that are
#                          not test assets, so that no factor is a combination of the test assets)
#   smallcap_two_pass_values.csv   name,value pairs computed below
#
# Everything is computed from the formulas with base R only: lm() for the time-series regressions and for
# the period-by-period OLS cross sections, matrix algebra for the rest. No asset-pricing package is used.
# Formulas (T periods, N assets, K factors, divisor T for every covariance):
#   GRS = (T/N) ((T-N-K)/(T-K-1)) a' S^-1 a / (1 + mu' O^-1 mu) ~ F(N, T-N-K)   (Gibbons, Ross, Shanken 1989)
#   X = [1, B]; gamma_t = (X'WX)^-1 X'W R_t; gamma = mean gamma_t; V_FM = sum (gamma_t-gamma)(.)'/T^2
#   V_Sh = (1 + lambda' O^-1 lambda) V_FM + [0 0; 0 O/T]                         (Shanken 1992)
#   V_KRS = sum h_t h_t' / T^2, h_t = (gamma_t - gamma) - (phi_t - phi) w_t + H z_t u_t [- (gamma_t - gamma) u_t, GLS]
#   rho2 = 1 - Q/Q0, Var = sum n_t^2 / T^2                                      (Kan, Robotti, Shanken 2013)
# The KRS influence functions are then checked against a numerical delta method on the raw sample
# moments (a separate route to the same asymptotic variance); the agreement is printed.
#
# Run from the project root: Rscript src/test/resources/reference/twopass/smallcap_two_pass.R
here <- tryCatch(dirname(normalizePath(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE)))),
                 error = function(e) ".")
e <- new.env()
data("SMALLCAP.RET", package = "fPortfolio", envir = e)
x <- as.matrix(e$SMALLCAP.RET@.Data)
dates <- substr(rownames(as.data.frame(e$SMALLCAP.RET)), 1, 7)
stocks <- setdiff(colnames(e$SMALLCAP.RET), c("MARKET", "T90"))
colnames(x) <- colnames(e$SMALLCAP.RET)
rf <- x[, "T90"]
net <- x[, stocks[1:12]]
mkt <- x[, "MARKET"] - rf
smm <- rowMeans(x[, stocks[13:20]]) - x[, "MARKET"]
fmt <- function(v) sprintf("%.17g", v)
write_wide <- function(file, m) {
  out <- data.frame(date = dates, apply(m, 2, function(v) sprintf("%.15g", v)), check.names = FALSE)
  write.csv(out, file.path(here, file), row.names = FALSE, quote = FALSE)
}
write_wide("smallcap-returns.csv", net)
write_wide("smallcap-riskfree.csv", cbind(T90 = rf))
write_wide("smallcap-factors.csv", cbind(MKT = mkt, SMM = smm))
# Read back what was written, so that the values below come from exactly the doubles Orthogon reads.
rd <- function(file) as.matrix(read.csv(file.path(here, file), check.names = FALSE)[, -1, drop = FALSE])
net <- rd("smallcap-returns.csv"); rf <- rd("smallcap-riskfree.csv")[, 1]; fac <- rd("smallcap-factors.csv")
R <- net - rf

values <- list()
put <- function(name, v) values[[name]] <<- v

two_pass <- function(R, f, tag) {
  f <- as.matrix(f)
  T <- nrow(R); N <- ncol(R); K <- ncol(f)
  cf <- t(sapply(seq_len(N), function(i) coef(lm(R[, i] ~ f))))   # N x (K+1)
  a <- cf[, 1]; B <- cf[, -1, drop = FALSE]
  res <- sapply(seq_len(N), function(i) residuals(lm(R[, i] ~ f)))
  Sig <- crossprod(res) / T
  mu <- colMeans(f); fd <- sweep(f, 2, mu); Om <- crossprod(fd) / T
  grs <- (T / N) * ((T - N - K) / (T - K - 1)) * drop(t(a) %*% solve(Sig, a)) / (1 + drop(t(mu) %*% solve(Om, mu)))
  put(paste0(tag, ".grs.statistic"), grs)
  put(paste0(tag, ".grs.p_value"), pf(grs, N, T - N - K, lower.tail = FALSE))
  for (i in seq_len(N)) {
    s <- summary(lm(R[, i] ~ f))$coefficients
    put(paste0(tag, ".alpha.", colnames(R)[i], ".estimate"), s[1, 1])
    put(paste0(tag, ".alpha.", colnames(R)[i], ".std_error"), s[1, 2])
    put(paste0(tag, ".alpha.", colnames(R)[i], ".p_value"), s[1, 4])
  }
  Rbar <- colMeans(R); Rd <- sweep(R, 2, Rbar)
  VR <- crossprod(Rd) / T
  for (w in c("ols", "gls")) {
    for (icpt in c(TRUE, FALSE)) {
      X <- if (icpt) cbind(1, B) else B
      W <- if (w == "ols") diag(N) else solve(VR)
      H <- solve(t(X) %*% W %*% X); A <- H %*% t(X) %*% W
      if (w == "ols") {
        # The period-by-period cross sections by lm, as Fama and MacBeth ran them.
        gt <- t(sapply(seq_len(T), function(s) if (icpt) coef(lm(R[s, ] ~ B)) else coef(lm(R[s, ] ~ B - 1))))
        if (K + icpt == 1) gt <- t(gt)
      } else {
        gt <- R %*% t(A)
      }
      g <- colMeans(gt); gd <- sweep(gt, 2, g)
      Vfm <- crossprod(gd) / T^2
      lam <- g[(icpt + 1):(icpt + K)]
      c2 <- drop(t(lam) %*% solve(Om, lam))
      Vsh <- (1 + c2) * Vfm
      idx <- (icpt + 1):(icpt + K)
      Vsh[idx, idx] <- Vsh[idx, idx] + Om / T
      e <- Rbar - drop(X %*% g)
      u <- drop(Rd %*% W %*% e)
      wt <- drop(fd %*% solve(Om, lam))
      phid <- gd; phid[, idx] <- phid[, idx] - fd
      z <- matrix(0, T, K + icpt); z[, idx] <- fd %*% solve(Om)
      h <- gd - phid * wt + (z %*% t(H)) * u
      if (w == "gls") h <- h - gd * u
      Vkrs <- crossprod(h) / T^2
      ones <- rep(1, N)
      e0 <- Rbar - ones * drop(t(ones) %*% W %*% Rbar) / drop(t(ones) %*% W %*% ones)
      Q <- drop(t(e) %*% W %*% e); Q0 <- drop(t(e0) %*% W %*% e0); rho2 <- 1 - Q / Q0
      u0 <- drop(Rd %*% W %*% e0); y <- 1 - wt
      n <- if (w == "ols") 2 * ((1 - rho2) * u0 - u * y) / Q0 else
        (u^2 - 2 * u * y + (1 - rho2) * (2 * u0 - u0^2)) / Q0
      # Var uses the centred n (its constants cancel in the population; the sample mean is zero here too).
      n <- n - mean(n)
      p <- paste0(tag, ".", w, if (icpt) "" else ".nointercept")
      nm <- c(if (icpt) "intercept", colnames(f))
      for (j in seq_along(g)) {
        put(paste0(p, ".", nm[j], ".estimate"), g[j])
        put(paste0(p, ".", nm[j], ".se_fm"), sqrt(Vfm[j, j]))
        put(paste0(p, ".", nm[j], ".se_shanken"), sqrt(Vsh[j, j]))
        put(paste0(p, ".", nm[j], ".se_robust"), sqrt(Vkrs[j, j]))
      }
      put(paste0(p, ".r2.estimate"), rho2)
      put(paste0(p, ".r2.std_error"), sqrt(sum(n^2)) / T)
      if (icpt) delta_check(R, f, w, Vkrs, sqrt(sum(n^2)) / T, p)
    }
  }
}

# The same estimator as a function of the raw sample moments m = (E R, E f, E RR', E Rf', E ff'); the
# asymptotic covariance by the delta method with a numerical gradient and the moments' own influence.
delta_check <- function(R, f, w, Vkrs, r2se, label) {
  T <- nrow(R); N <- ncol(R); K <- ncol(f)
  est <- function(m) {
    mR <- m[1:N]; mf <- m[N + 1:K]
    at <- N + K
    ERR <- matrix(m[at + 1:(N * N)], N, N); at <- at + N * N
    ERf <- matrix(m[at + 1:(N * K)], N, K); at <- at + N * K
    Eff <- matrix(m[at + 1:(K * K)], K, K)
    VR <- ERR - mR %*% t(mR); VRf <- ERf - mR %*% t(mf); Vf <- Eff - mf %*% t(mf)
    B <- VRf %*% solve(Vf); X <- cbind(1, B)
    W <- if (w == "ols") diag(N) else solve(VR)
    g <- drop(solve(t(X) %*% W %*% X, t(X) %*% W %*% mR))
    e <- mR - drop(X %*% g); ones <- rep(1, N)
    e0 <- mR - ones * drop(t(ones) %*% W %*% mR) / drop(t(ones) %*% W %*% ones)
    c(g, 1 - drop(t(e) %*% W %*% e) / drop(t(e0) %*% W %*% e0))
  }
  contrib <- cbind(R, f, t(apply(R, 1, function(r) r %o% r)), t(sapply(seq_len(T), function(s) R[s, ] %o% f[s, ])),
                   t(matrix(apply(f, 1, function(v) v %o% v), nrow = K * K)))
  m <- colMeans(contrib)
  grad <- sapply(seq_along(m), function(j) {
    step <- 1e-6 * max(abs(m[j]), 1e-3)
    up <- m; up[j] <- up[j] + step; dn <- m; dn[j] <- dn[j] - step
    (est(up) - est(dn)) / (2 * step)
  })
  infl <- sweep(contrib, 2, m) %*% t(grad)
  V <- crossprod(infl) / T^2
  k <- K + 1
  rel <- max(abs(sqrt(diag(V)[1:k]) / sqrt(diag(Vkrs)) - 1))
  relr2 <- abs(sqrt(V[k + 1, k + 1]) / r2se - 1)
  cat(sprintf("%s: KRS formula against numerical delta method, largest relative gap in a standard error %.2e (R2: %.2e)\n",
              label, rel, relr2))
  put(paste0(label, ".delta_check.max_relative_gap"), max(rel, relr2))
}

# Tests of equal cross-sectional R² (KRS 2013, section III), OLS with the intercept. eta = O^-1 lambda are
# the prices of covariance risk; their influence is O^-1 (h_lambda,t - ((f_t - fbar)(f_t - fbar)' - O) eta).
r2_parts <- function(R, f) {
  f <- as.matrix(f); T <- nrow(R); N <- ncol(R); K <- ncol(f)
  Rbar <- colMeans(R); Rd <- sweep(R, 2, Rbar); mu <- colMeans(f); fd <- sweep(f, 2, mu); Om <- crossprod(fd) / T
  B <- t(sapply(seq_len(N), function(i) coef(lm(R[, i] ~ f))[-1])); if (K == 1) B <- t(B)
  X <- cbind(1, B); H <- solve(crossprod(X)); A <- H %*% t(X)
  gt <- R %*% t(A); g <- colMeans(gt); gd <- sweep(gt, 2, g)
  lam <- g[-1]; e <- Rbar - drop(X %*% g); u <- drop(Rd %*% e); wt <- drop(fd %*% solve(Om, lam))
  phid <- gd; phid[, -1] <- phid[, -1] - fd
  z <- cbind(0, fd %*% solve(Om))
  h <- gd - phid * wt + (z %*% t(H)) * u
  e0 <- Rbar - mean(Rbar); Q0 <- sum(e0^2); rho2 <- 1 - sum(e^2) / Q0
  n <- 2 * ((1 - rho2) * drop(Rd %*% e0) - u * (1 - wt)) / Q0
  eta <- drop(solve(Om, lam))
  ieta <- t(sapply(seq_len(T), function(s) solve(Om, h[s, -1] - (fd[s, ] %o% fd[s, ] - Om) %*% eta)))
  if (K == 1) ieta <- t(ieta)
  C <- B %*% Om; Hc <- solve(crossprod(cbind(1, C)))[-1, -1, drop = FALSE]
  list(T = T, rho2 = rho2, n = n, eta = eta, ieta = ieta, Hc = Hc, Q0 = Q0, names = colnames(f))
}
A <- r2_parts(R, fac[, "MKT", drop = FALSE]); Bm <- r2_parts(R, fac)
put("r2test.nested.r2_restricted", A$rho2); put("r2test.nested.r2_unrestricted", Bm$rho2)
put("r2test.nested.statistic", Bm$T * (Bm$rho2 - A$rho2))
x2 <- 2
quad <- Bm$T * Bm$eta[x2]^2 / Bm$Hc[x2, x2] / Bm$Q0
cat(sprintf("nested: T(R2_B - R2_A) %.12g, T eta2' Hc22^-1 eta2 / Q0 %.12g\n", Bm$T * (Bm$rho2 - A$rho2), quad))
V22 <- sum(Bm$ieta[, x2]^2) / Bm$T
put("r2test.nested.limit_weight", V22 / Bm$Hc[x2, x2] / Bm$Q0)
S <- r2_parts(R, fac[, "SMM", drop = FALSE])
d <- A$n - S$n
put("r2test.nonnested.r2_first", A$rho2); put("r2test.nonnested.r2_second", S$rho2)
put("r2test.nonnested.statistic", (A$rho2 - S$rho2) / (sqrt(sum(d^2)) / A$T))
est <- c(A$eta, S$eta); inf <- cbind(A$ieta, S$ieta)
Vs <- crossprod(inf) / A$T^2
put("r2test.nonnested.wald", drop(t(est) %*% solve(Vs, est)))
put("r2test.nonnested.wald_p_value", pchisq(drop(t(est) %*% solve(Vs, est)), 2, lower.tail = FALSE))

two_pass(R, fac[, "MKT", drop = FALSE], "capm")
two_pass(R, fac, "two_factor")
out <- data.frame(name = names(values), value = sapply(values, fmt))
write.csv(out, file.path(here, "smallcap_two_pass_values.csv"), row.names = FALSE, quote = FALSE)
cat("values written:", nrow(out), "\n")
