#include "textflag.h"

// func prefetch3(a, b, c unsafe.Pointer, lines int)
// Asks for `lines` cache lines from each of a, b and c (nil: none).
TEXT ·prefetch3(SB), NOSPLIT, $0-32
	MOVQ a+0(FP), AX
	MOVQ b+8(FP), BX
	MOVQ c+16(FP), CX
	MOVQ lines+24(FP), DX
loop:
	TESTQ DX, DX
	JLE done
	PREFETCHT0 (AX)
	PREFETCHT0 (BX)
	PREFETCHT0 (CX)
	ADDQ $64, AX
	ADDQ $64, BX
	ADDQ $64, CX
	DECQ DX
	JMP loop
done:
	RET
