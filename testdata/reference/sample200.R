# Reference values for peerpack's statistics, computed with R.
# Run from the repository root:  Rscript testdata/reference/sample200.R
# It writes testdata/reference/sample200.csv (the sample) and
# testdata/reference/sample200_r.csv (the reference values).
# The sample is generated here, with a fixed seed, and rounded to one decimal
# so that it contains ties, which the rank and percentile conventions must
# handle.
set.seed(20250)
n <- 200
x <- round(rnorm(n, mean = 50, sd = 12), 1)
y <- round(0.6 * x + rnorm(n, sd = 8), 1)
dir <- "testdata/reference"
write.csv(data.frame(x = sprintf("%.1f", x), y = sprintf("%.1f", y)),
          file.path(dir, "sample200.csv"), row.names = FALSE, quote = FALSE)

out <- data.frame(name = character(0), value = character(0))
put <- function(name, v) {
  out <<- rbind(out, data.frame(name = name, value = sprintf("%.17g", v)))
}
probs <- c(0, 0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95, 1)
for (p in probs) {
  put(sprintf("quantile7_x_%g", p), quantile(x, p, type = 7, names = FALSE))
  put(sprintf("quantile6_x_%g", p), quantile(x, p, type = 6, names = FALSE))
}
f <- fivenum(x)
put("fivenum_x_min", f[1]); put("fivenum_x_lower_hinge", f[2]); put("fivenum_x_median", f[3])
put("fivenum_x_upper_hinge", f[4]); put("fivenum_x_max", f[5])
# fivenum of an odd-sized subsample too (hinge positions differ for odd n)
f <- fivenum(x[1:199])
put("fivenum_x199_lower_hinge", f[2]); put("fivenum_x199_upper_hinge", f[4])
put("mean_x", mean(x)); put("sd_x", sd(x)); put("mean_y", mean(y)); put("sd_y", sd(y))
put("pearson_xy", cor(x, y, method = "pearson"))
put("spearman_xy", cor(x, y, method = "spearman"))
# boxplot.stats uses Tukey's hinges (fivenum) and 1.5 x IQR (coef = 1.5)
bs <- boxplot.stats(x, coef = 1.5)
put("box_hinges_whisker_low", bs$stats[1]); put("box_hinges_whisker_high", bs$stats[5])
put("box_hinges_n_out", length(bs$out))
# Percentile rank 100 x (below + ties/2) / n = 100 x (average rank - 0.5) / n,
# in the "higher is better" direction (below = lower values) and the
# "lower is better" direction; competition rank (ties share the best rank)
# as rank(-x, ties = "min") and rank(x, ties = "min").
pct_hi <- 100 * (rank(x, ties.method = "average") - 0.5) / n
pct_lo <- 100 * (rank(-x, ties.method = "average") - 0.5) / n
rank_hi <- rank(-x, ties.method = "min")
rank_lo <- rank(x, ties.method = "min")
for (i in c(1, 2, 3, 17, 50, 99, 128, 200)) {
  put(sprintf("percentile_higher_%d", i), pct_hi[i])
  put(sprintf("percentile_lower_%d", i), pct_lo[i])
  put(sprintf("rank_higher_%d", i), rank_hi[i])
  put(sprintf("rank_lower_%d", i), rank_lo[i])
}
# A value placed among the sample without being part of it: appended, then
# ranked, so n counts it.
for (v in c(50, 61.3, 10)) {
  z <- c(x, v)
  put(sprintf("outside_percentile_higher_%g", v), 100 * (rank(z, ties.method = "average")[n + 1] - 0.5) / (n + 1))
  put(sprintf("outside_rank_higher_%g", v), rank(-z, ties.method = "min")[n + 1])
}
# The NIST/SEMATECH e-Handbook's percentile example (section 7.2.6.2), whose
# definition is Hyndman and Fan's type 6.
nist <- c(95.1772, 95.1567, 95.1937, 95.1959, 95.1442, 95.0610,
          95.1591, 95.1195, 95.1065, 95.0925, 95.1990, 95.1682)
put("nist_quantile6_0.9", quantile(nist, 0.9, type = 6, names = FALSE))
# Lane et al., Online Statistics Education, "Box Plots", Table 1 (women's times)
lane <- c(14, 15, 16, 16, 17, 17, 17, 17, 17, 18, 18, 18, 18, 18, 18, 19,
          19, 19, 20, 20, 20, 20, 20, 20, 21, 21, 21, 23, 24, 24, 29)
lb <- boxplot.stats(lane)
put("lane_hinge_low", lb$stats[2]); put("lane_hinge_high", lb$stats[4])
put("lane_whisker_low", lb$stats[1]); put("lane_whisker_high", lb$stats[5])
put("lane_n_out", length(lb$out))
# least-squares slope of y on x
put("slope_y_on_x", unname(coef(lm(y ~ x))[2]))
writeLines(c(paste("# R version:", R.version.string),
             "# Produced by testdata/reference/sample200.R; do not edit by hand."),
           file.path(dir, "sample200_r.csv"))
suppressWarnings(write.table(out, file.path(dir, "sample200_r.csv"), append = TRUE, sep = ",",
            row.names = FALSE, quote = FALSE))
