# Reference values for TestRakingAgainstLoglin (R 4.2.2, stats::loglin).
# The table and margins are the worked example of Wikipedia's "Iterative
# proportional fitting" article (from memory): 4 x 4 counts, row targets
# 150, 300, 400, 150 and column targets 200, 300, 400, 100.
x <- matrix(c(40,30,20,10, 35,50,100,75, 30,80,70,120, 20,30,40,50), nrow=4, byrow=TRUE)
rt <- c(150,300,400,150); ct <- c(200,300,400,100)
tgt <- outer(rt, ct) / 1000   # any table with these margins
l <- loglin(tgt, list(1, 2), start = x, fit = TRUE, eps = 1e-13, iter = 10000, print = FALSE)
write.table(format(l$fit, digits = 15), row.names = FALSE, col.names = FALSE, quote = FALSE)
