# Reference values for tests/shared/statistics/clustered-rate.test.ts and the rider-level
# bias check in tests/shared/statistics/weighted-bias.test.ts.
# Needs Debian's r-base-core and r-cran-sandwich (the tests do not).
# Run: Rscript tests/shared/statistics/reference/rider-clustered.R
suppressMessages(library(sandwich))
options(digits = 12, width = 200)

# Two firmware versions' rides: rider, pedalling hours, power dropouts (fictional).
a <- data.frame(rider = c(1, 1, 2, 3, 3, 3, 4, 5, 5),
                hours = c(2, 1.5, 3, 1, 2, 1, 2.5, 1, 2),
                events = c(3, 1, 0, 2, 6, 1, 1, 0, 2))
b <- data.frame(rider = c(6, 6, 7, 8, 9, 9),
                hours = c(2, 2, 3, 1.5, 2, 1),
                events = c(0, 1, 1, 0, 2, 0))

clustered <- function(d) {
  G <- length(unique(d$rider))
  fit <- glm(events ~ 1, offset = log(hours), family = poisson, data = d)
  # CR1 without the (n-1)/(n-k) factor: G/(G-1) only.
  sandwich_var <- as.numeric(vcovCL(fit, cluster = ~rider, type = "HC0", cadjust = TRUE))
  riders <- aggregate(cbind(events, hours) ~ rider, data = d, FUN = sum)
  q <- glm(events ~ 1, offset = log(hours), family = quasipoisson, data = riders)
  quasi_var <- as.numeric(vcov(q))
  v <- max(sandwich_var, quasi_var)
  est <- as.numeric(coef(fit))
  half <- qt(0.975, G - 1) * sqrt(v)
  cat(sprintf("G %d, rate %.12f, sandwich var(log) %.12f, quasi-Poisson dispersion %.12f var(log) %.12f\n",
              G, exp(est), sandwich_var, summary(q)$dispersion, quasi_var))
  cat(sprintf("  clustered interval %.12f to %.12f\n", exp(est - half), exp(est + half)))
  e <- poisson.test(sum(d$events), sum(d$hours))$conf.int
  cat(sprintf("  exact interval     %.12f to %.12f\n", e[1], e[2]))
  list(est = est, v = v, G = G)
}
ca <- clustered(a)
cb <- clustered(b)
v <- ca$v + cb$v
df <- v^2 / (ca$v^2 / (ca$G - 1) + cb$v^2 / (cb$G - 1))
lr <- ca$est - cb$est
half <- qt(0.975, df) * sqrt(v)
cat(sprintf("ratio a/b %.12f, df %.12f, interval %.12f to %.12f, p %.12f\n", exp(lr), df, exp(lr - half), exp(lr + half), 2 * pt(-abs(lr / sqrt(v)), df)))
pt_exact <- poisson.test(c(sum(a$events), sum(b$events)), c(sum(a$hours), sum(b$hours)))
cat(sprintf("exact ratio interval %.12f to %.12f, p %.12f\n", pt_exact$conf.int[1], pt_exact$conf.int[2], pt_exact$p.value))

# Rider-level bias: each rider's rides weighted by hours (capped at 4), then the riders'
# means with equal weights (every rider has at least 4 h): an ordinary one-sample t interval.
bias <- data.frame(rider = c(1, 1, 2, 2, 2, 3, 3, 4, 4),
                   hours = c(2, 3, 2, 2, 1, 4.5, 1, 2, 2.5),
                   bias = c(1.2, 2.0, -0.4, 0.3, 0.9, 1.6, 2.4, 0.1, 0.7))
means <- sapply(split(bias, bias$rider), function(r) weighted.mean(r$bias, pmin(r$hours, 4)))
print(means)
tt <- t.test(means)
cat(sprintf("rider-level mean %.12f, interval %.12f to %.12f, df %d\n", mean(means), tt$conf.int[1], tt$conf.int[2], length(means) - 1))
