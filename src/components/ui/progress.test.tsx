import { render, screen } from '@testing-library/react'
import { describe, expect, it } from 'vitest'
import { ProgressBar } from '@/components/ui/progress'

describe('ProgressBar', () => {
  it('is a named progressbar with its value as a percentage', () => {
    render(<ProgressBar label="Cure" value={0.4286} />)
    const bar = screen.getByRole('progressbar', { name: 'Cure' })
    expect(bar).toHaveAttribute('aria-valuenow', '43')
    expect(bar).toHaveAttribute('aria-valuemin', '0')
    expect(bar).toHaveAttribute('aria-valuemax', '100')
    expect(screen.getByText('43%')).toBeInTheDocument()
  })

  it('clamps values outside 0..1 and uses the given text', () => {
    render(<ProgressBar label="Cure" value={1.3} valueText="Ready since 2 May" />)
    const bar = screen.getByRole('progressbar', { name: 'Cure' })
    expect(bar).toHaveAttribute('aria-valuenow', '100')
    expect(bar).toHaveAttribute('aria-valuetext', 'Ready since 2 May')
  })
})
