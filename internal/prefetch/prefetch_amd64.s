#include "textflag.h"

// func lines(at *[Max]uintptr, n int)
// Asks for the cache lines at at[0:n].
TEXT ·lines(SB), NOSPLIT, $0-16
	MOVQ at+0(FP), AX
	MOVQ n+8(FP), CX
loop:
	TESTQ CX, CX
	JLE done
	MOVQ (AX), DX
	PREFETCHT0 (DX)
	ADDQ $8, AX
	DECQ CX
	JMP loop
done:
	RET
